import { EngineCancelled, EngineError, withField } from '../../errors.js';
import { formatDecimal } from '../decimal.js';
import { abs, add, fromNumber, ldexp, magnitude, mul, neg, Real, sub, toNumber } from '../real.js';

const FIELD = 'weights.expression';

/** The kernel as the engine calls it: a point (x, y) to a value, with errors for a person. */
export type KernelAt = (x: Real, y: Real) => Real;

/** Wrap an evaluator so that poles and domain errors name the point and the spec field. */
export function guarded(ev: (values: Real[]) => Real): KernelAt {
  return (x, y) => {
    try {
      return ev([x, y]);
    } catch (e) {
      if (e instanceof EngineCancelled) throw e;
      if (e instanceof EngineError) throw withField(e, FIELD);
      throw new EngineError(
        `the kernel has no finite value at x = ${show(x)}, y = ${show(y)} (${e instanceof Error ? e.message : String(e)})`,
        FIELD,
      );
    }
  };
}

/** A point for messages, to 6 significant digits. */
export function show(x: Real): string {
  return x.m === 0n ? '0' : formatDecimal(x, 6);
}

/** Sample points inside the domain (irregular, so that no symmetry of the rule hides a fault). */
export function samplePoints(from: Real | null, to: Real | null, prec: number): Real[] {
  const unit = [0.1372, 0.3819, 0.5, 0.6613, 0.9127];
  if (from !== null && to !== null) {
    const w = sub(to, from, prec);
    return unit.map((u) => add(from, mul53(w, u, prec), prec));
  }
  const offsets = [0.2731, 0.9183, 1.7, 3.1416, 5.77];
  if (from === null && to === null)
    return [
      neg(fromNumber(offsets[3]!)),
      neg(fromNumber(offsets[0]!)),
      ...offsets.slice(1, 4).map(fromNumber),
    ];
  const a = (from ?? to)!;
  const dir = from !== null ? 1 : -1;
  return offsets.map((o) => add(a, fromNumber(dir * o), prec));
}

function mul53(x: Real, u: number, prec: number): Real {
  return mul(x, fromNumber(u), prec);
}

/** Relative closeness of two kernel values (within 2^-(prec/2), or both far below the scale). */
function close(a: Real, b: Real, scale: number, prec: number): boolean {
  const d = abs(sub(a, b, prec + 8));
  if (d.m === 0n) return true;
  const big = Math.max(magnitude(a), magnitude(b));
  const tol = -Math.floor(prec / 2);
  return magnitude(d) - big <= tol || magnitude(d) <= Math.log2(scale) - prec / 2 - 20;
}

/** EngineError unless rho(x, y) = rho(y, x) at every pair of sample points. */
export function checkSymmetric(rho: KernelAt, pts: Real[], prec: number): void {
  let scale = 0;
  const vals: [Real, Real, Real, Real][] = [];
  for (let i = 0; i < pts.length; i++)
    for (let j = i + 1; j < pts.length; j++) {
      const x = pts[i]!;
      const y = pts[j]!;
      const a = rho(x, y);
      const b = rho(y, x);
      scale = Math.max(scale, Math.abs(toNumber(a)), Math.abs(toNumber(b)));
      vals.push([x, y, a, b]);
    }
  for (const [x, y, a, b] of vals)
    if (!close(a, b, scale, prec))
      throw new EngineError(
        `the kernel is not symmetric: rho(x, y) != rho(y, x) at x = ${show(x)}, y = ${show(y)}`,
        FIELD,
      );
}

/** True when rho(2c - x, 2c - y) = rho(x, y) at the sample points (reflection about c). */
export function hasParity(rho: KernelAt, c: Real, pts: Real[], prec: number): boolean {
  const c2 = ldexp(c, 1);
  let scale = 0;
  const vals: [Real, Real][] = [];
  for (let i = 0; i < pts.length; i++)
    for (let j = i; j < pts.length; j++) {
      const x = pts[i]!;
      const y = pts[j]!;
      const a = rho(x, y);
      const b = rho(sub(c2, x, prec + 8), sub(c2, y, prec + 8));
      scale = Math.max(scale, Math.abs(toNumber(a)), Math.abs(toNumber(b)));
      vals.push([a, b]);
    }
  return vals.every(([a, b]) => close(a, b, scale, prec));
}

/**
 * Where to cut an infinite side: from the centre `c` towards `dir`, the distance X beyond which
 * the diagonal's tail (estimated from the local exponential decay rate) is below `tol`. Throws
 * when the diagonal does not decay within |x - c| <= 2^14.
 */
export function windowFor(rho: KernelAt, c: Real, dir: 1 | -1, tol: number, prec: number): number {
  let prevX = 0;
  let prevD = Math.abs(toNumber(rho(c, c)));
  let lastD = prevD;
  let lastX = 0;
  for (let k = 0; k <= 14; k++) {
    const X = 2 ** k;
    const x = add(c, fromNumber(dir * X), prec);
    const d = Math.abs(toNumber(rho(x, x)));
    lastD = d;
    lastX = X;
    if (d === 0) return X;
    const rate = prevD > 0 ? Math.log(prevD / d) / (X - prevX) : 0;
    if (rate > 0 && d / rate < tol) {
      const cut = prevX + Math.log(prevD / (rate * tol)) / rate;
      return Math.min(X, Math.max(prevX, cut));
    }
    prevX = X;
    prevD = d;
  }
  const at = add(c, fromNumber(dir * lastX), prec);
  throw new EngineError(
    `the kernel does not decay on the infinite side: |rho(x, x)| = ${lastD.toPrecision(3)} at x = ${show(at)}; the discretisation needs a kernel that decays (exponentially) there`,
    FIELD,
  );
}

/** Tail mass of the diagonal beyond the cut at c + dir X, from the last two diagonal values. */
export function tailMass(rho: KernelAt, c: Real, dir: 1 | -1, X: number, prec: number): number {
  const at = (t: number): number => {
    const x = add(c, fromNumber(dir * t), prec);
    return Math.abs(toNumber(rho(x, x)));
  };
  const d1 = at(X);
  const d0 = at(X * 0.9);
  if (d1 === 0) return 0;
  const rate = Math.log(d0 / d1) / (0.1 * X);
  return rate > 0 ? d1 / rate : Infinity;
}
