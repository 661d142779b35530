import Fraction from 'fraction.js';
import { EngineError } from '../errors.js';
import type { Truncation } from '../expr/evaluate.js';
import { MAX_SPECTRUM_POINTS } from '../limits.js';
import type { GasSpec } from '../spec/schema.js';
import { Estimate, size, ulp } from './estimate.js';
import { compileNumeric } from './expr/compile.js';
import { compileFast } from './expr/compile-dd.js';
import { kernelTraces, type KernelOutcome } from './kernel/index.js';
import { add, fromFraction, fromInt, powInt, Real, sub, ZERO } from './real.js';
import type { Pace } from './routes.js';

/** Extra bits of the second evaluation that estimates an expression's own rounding error. */
const CHECK_BITS = 32;

/** Cycle weights of a numeric gas, with what the routes need besides. */
export interface NumericWeights {
  weights: Estimate[];
  /** Spectrum gases: c_p at every lattice point used and a bound on the left-out sum of |c_p|. */
  spectrum?: { points: Estimate[]; tail: number; truncated: boolean };
  /** Kernel gases: the discretisation's outcome (traces, Fredholm route, rule). */
  kernel?: KernelOutcome;
  truncations: Truncation[];
}

/**
 * An expression evaluated at two working precisions: the value of the finer one, with the
 * difference (plus the finer one's rounding) as its error estimate.
 */
export function twoPrecision(
  text: string,
  names: string[],
  prec: number,
  field: string,
  truncations: Truncation[],
): (values: Real[]) => Estimate {
  const lo = compileNumeric(text, { names, prec, field, truncations });
  const hi = compileNumeric(text, { names, prec: prec + CHECK_BITS, field, truncations });
  return (values) => {
    const a = hi(values);
    const b = lo(values);
    return { value: a, error: size(sub(a, b, prec + CHECK_BITS)) + size(a) * ulp(prec) };
  };
}

/** The number the spec fixes its variable at (`at`), or undefined for a kernel or a list. */
export function fixedVariable(
  spec: GasSpec,
  prec: number,
  truncations: Truncation[],
): Real | undefined {
  const text = spec.at?.[spec.variable];
  if (text === undefined) return undefined;
  return twoPrecision(text, [], prec, `at.${spec.variable}`, truncations)([]).value;
}

/** Z_L for L = 1..nMax of a numeric gas (`extra`: more bound names, e.g. sector indices). */
export function numericWeights(
  spec: GasSpec,
  prec: number,
  pace?: Pace,
  extra: { names: string[]; values: Real[] } = { names: [], values: [] },
): NumericWeights {
  const truncations: Truncation[] = [];
  const w = spec.weights;
  const q = fixedVariable(spec, prec, truncations);
  // extra: names every expression sees besides its own index (the sector indices)
  const varNames = [...(q === undefined ? [] : [spec.variable]), ...extra.names];
  const varValues = [...(q === undefined ? [] : [q]), ...extra.values];
  if (w.kind === 'values') {
    if (w.values.length < spec.nMax) {
      throw new EngineError(
        `lists ${w.values.length} cycle weights but Z_1..Z_${spec.nMax} are needed (nMax = ${spec.nMax})`,
        'weights.values',
      );
    }
    const weights = w.values
      .slice(0, spec.nMax)
      .map((text, i) =>
        twoPrecision(text, varNames, prec, `weights.values.${i}`, truncations)(varValues),
      );
    return { weights, truncations };
  }
  if (w.kind === 'formula') {
    const f = twoPrecision(
      w.expression,
      ['L', ...varNames],
      prec,
      'weights.expression',
      truncations,
    );
    const weights: Estimate[] = [];
    for (let L = 1; L <= spec.nMax; L++) {
      weights.push(f([fromInt(L), ...varValues]));
      pace?.tick?.();
    }
    return { weights, truncations };
  }
  if (w.kind === 'spectrum') {
    const c = twoPrecision(
      w.expression,
      ['p', ...varNames],
      prec,
      'weights.expression',
      truncations,
    );
    const lattice = latticeNumeric(spec, (p) => c([p, ...varValues]), prec, pace);
    if (lattice.truncated)
      truncations.push({ what: 'spectrum lattice points', terms: lattice.points.length });
    return {
      weights: powerSums(lattice.points, lattice.tail, spec.nMax, prec),
      spectrum: lattice,
      truncations,
    };
  }
  const kernel = kernelWeights(spec, prec, truncations, pace);
  return { weights: kernel.traces, kernel, truncations };
}

function kernelWeights(
  spec: GasSpec,
  prec: number,
  truncations: Truncation[],
  pace?: Pace,
): KernelOutcome {
  const w = spec.weights;
  if (w.kind !== 'kernel') throw new EngineError('internal: not a kernel');
  const end = (text: string | null, field: string): Real | null =>
    text === null ? null : twoPrecision(text, [], prec, field, truncations)([]).value;
  const from = end(w.from, 'weights.from');
  const to = end(w.to, 'weights.to');
  if (from !== null && to !== null && sub(to, from, prec).m <= 0n)
    throw new EngineError('must be below weights.to', 'weights.from');
  return kernelTraces(
    (bits: number) =>
      compileNumeric(w.expression, {
        names: ['x', 'y'],
        prec: bits,
        field: 'weights.expression',
        truncations,
      }),
    { from, to, periodic: w.periodic },
    {
      digits: spec.precision!,
      nMax: spec.nMax,
      fermion: spec.statistics === 'fermion',
      fast: compileFast(w.expression, ['x', 'y']),
      ...(pace?.tick && { tick: pace.tick }),
      ...(pace?.shouldStop && { shouldStop: pace.shouldStop }),
    },
  );
}

/** Z_L = sum_p c_p^L with propagated errors and the left-out tail (sum |c_p|^L <= tail). */
function powerSums(
  points: readonly Estimate[],
  tail: number,
  nMax: number,
  prec: number,
): Estimate[] {
  const out: Estimate[] = [];
  for (let L = 1; L <= nMax; L++) {
    let acc: Real = ZERO;
    let err = tail;
    for (const c of points) {
      const t = L === 1 ? c.value : powInt(c.value, L, prec);
      acc = add(acc, t, prec);
      const sc = size(c.value);
      err += L * sc ** (L - 1) * c.error + size(t) * ulp(prec) * (L + 1);
    }
    out.push({ value: acc, error: err + size(acc) * ulp(prec) });
  }
  return out;
}

/**
 * c_p at p = offset + n within [from, to]. An unbounded side stops once |c_p| has stayed below
 * 2^-prec times the largest |c_p| for three consecutive points with falling values; what is left
 * is bounded by extending the last ratio geometrically (an estimate: it assumes the decay goes on).
 */
function latticeNumeric(
  spec: GasSpec,
  at: (p: Real) => Estimate,
  prec: number,
  pace?: Pace,
): { points: Estimate[]; tail: number; truncated: boolean } {
  if (spec.weights.kind !== 'spectrum') throw new EngineError('internal: not a spectrum');
  const { offset, from, to } = spec.weights;
  const off = new Fraction(offset);
  const lo = from === null ? null : new Fraction(from).sub(off).ceil();
  const hi = to === null ? null : new Fraction(to).sub(off).floor();
  const offReal = fromFraction(BigInt(off.s * off.n), off.d, prec + 64);
  const point = (n: number): Estimate => at(add(offReal, fromInt(n), prec + 64));
  const points: Estimate[] = [];
  if (lo !== null && hi !== null) {
    const a = Number(lo.s * lo.n);
    const b = Number(hi.s * hi.n);
    if (b - a + 1 > MAX_SPECTRUM_POINTS)
      throw new EngineError(
        `spectrum has more than ${MAX_SPECTRUM_POINTS} lattice points`,
        'weights.to',
      );
    for (let n = a; n <= b; n++) {
      points.push(point(n));
      if (n % 64 === 0) pace?.tick?.();
    }
    return { points, tail: 0, truncated: false };
  }
  const runs: [number, 1 | -1][] = [];
  if (lo !== null) runs.push([Number(lo.s * lo.n), 1]);
  else if (hi !== null) runs.push([Number(hi.s * hi.n), -1]);
  else runs.push([0, 1], [-1, -1]);
  let largest = 0;
  let tail = 0;
  const eps = ulp(prec);
  for (const [start, dir] of runs) {
    let quiet = 0;
    let prev = Infinity;
    for (let n = start; ; n += dir) {
      if (points.length > MAX_SPECTRUM_POINTS)
        throw new EngineError(
          `spectrum does not converge: |c_p| is still above the tolerance after ${MAX_SPECTRUM_POINTS} lattice points`,
          'weights.expression',
        );
      const c = point(n);
      const s = size(c.value) + c.error;
      points.push(c);
      largest = Math.max(largest, s);
      const small = s <= eps * largest;
      quiet = small && s <= prev ? quiet + 1 : 0;
      if (quiet >= 3) {
        const r = prev > 0 ? s / prev : 0;
        if (r >= 0.999) continue;
        tail += (s * r) / (1 - r);
        break;
      }
      prev = s;
      if (n % 64 === 0) pace?.tick?.();
    }
  }
  return { points, tail, truncated: true };
}
