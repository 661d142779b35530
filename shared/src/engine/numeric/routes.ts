import { EngineCancelled } from '../errors.js';
import { exponentNotation, foldCycleTypes } from '../kernel/index.js';
import { Estimate, size, ulp } from './estimate.js';
import { add, div, fromInt, mul, neg, ONE, Real, ZERO } from './real.js';

/** Polled in long loops: progress and cancellation. */
export interface Pace {
  tick?: () => void;
  shouldStop?: () => boolean;
}

function poll(pace: Pace | undefined): void {
  if (pace?.shouldStop?.()) throw new EngineCancelled();
  pace?.tick?.();
}

/**
 * Newton recursion N Z(N) = sum_(L=1..N) s^(L-1) Z_L Z(N-L) over estimates (s = -1 fermions).
 * The error of each row propagates the weights' errors and adds the rounding of every term at
 * `prec` bits, so a row that cancels (terms much larger than the sum) shows its loss of digits.
 */
export function newtonNumeric(
  weights: readonly Estimate[],
  nMax: number,
  fermion: boolean,
  prec: number,
  pace?: Pace,
): Estimate[] {
  const Z: Estimate[] = [{ value: ONE, error: 0 }];
  for (let N = 1; N <= nMax; N++) {
    let acc: Real = ZERO;
    let err = 0;
    let absSum = 0;
    for (let L = 1; L <= N; L++) {
      const w = weights[L - 1]!;
      const z = Z[N - L]!;
      const t = mul(w.value, z.value, prec);
      acc = add(acc, fermion && L % 2 === 0 ? neg(t) : t, prec);
      const sw = size(w.value);
      const sz = size(z.value);
      absSum += sw * sz;
      err += sw * z.error + w.error * sz + w.error * z.error;
    }
    const value = div(acc, fromInt(N), prec);
    Z.push({ value, error: (err + 2 * N * absSum * ulp(prec)) / N });
    poll(pace);
  }
  return Z;
}

/**
 * The product form over a spectrum: Xi = prod_p (1 + kappa c_p) (fermions) or
 * prod_p 1/(1 - kappa c_p) (bosons), expanded to kappa^nMax. `tail` bounds sum |c_p| over the
 * lattice points left out (0 for a finite lattice); its effect is added to every error.
 */
export function productNumeric(
  points: readonly Estimate[],
  nMax: number,
  fermion: boolean,
  prec: number,
  tail: number,
  pace?: Pace,
): Estimate[] {
  const v: Real[] = [ONE];
  const e: number[] = [0];
  for (let k = 1; k <= nMax; k++) {
    v.push(ZERO);
    e.push(0);
  }
  let i = 0;
  for (const c of points) {
    const sc = size(c.value);
    if (fermion) {
      for (let k = nMax; k >= 1; k--) {
        v[k] = add(v[k]!, mul(c.value, v[k - 1]!, prec), prec);
        e[k] =
          e[k]! +
          sc * e[k - 1]! +
          c.error * (size(v[k - 1]!) + e[k - 1]!) +
          size(v[k]!) * ulp(prec);
      }
    } else {
      for (let k = 1; k <= nMax; k++) {
        v[k] = add(v[k]!, mul(c.value, v[k - 1]!, prec), prec);
        e[k] =
          e[k]! +
          sc * e[k - 1]! +
          c.error * (size(v[k - 1]!) + e[k - 1]!) +
          size(v[k]!) * ulp(prec);
      }
    }
    if (++i % 64 === 0) poll(pace);
  }
  // the left-out points change e_k by at most tail * |e_(k-1)| (first order)
  const out: Estimate[] = [];
  for (let k = 0; k <= nMax; k++) {
    const prev = k === 0 ? 0 : size(v[k - 1]!) + e[k - 1]!;
    out.push({ value: v[k]!, error: e[k]! + tail * prev * (1 + tail) });
  }
  return out;
}

/** One numeric class-table row. */
export interface NumericClassRow {
  N: number;
  cycleType: [number, number][];
  size: string;
  sign: 1 | -1;
  contribution: Estimate;
}

/**
 * Class sum Z(N) = sum_lambda eps_lambda prod_L Z_L^(m_L) / z_lambda over estimates, streaming each
 * row to `onRow`. Relative errors of the factors add along the walk.
 */
export function classSumNumeric(
  N: number,
  weights: readonly Estimate[],
  fermion: boolean,
  prec: number,
  onRow?: (row: NumericClassRow) => void,
  pace?: Pace,
): Estimate {
  let nFact = 1n;
  for (let i = 2; i <= N; i++) nFact *= BigInt(i);
  const invFact = div(ONE, fromInt(nFact), prec);
  const rel = weights.map((w) => {
    const s = size(w.value);
    return s === 0 ? (w.error === 0 ? 0 : Infinity) : w.error / s;
  });
  let total: Real = ZERO;
  let err = 0;
  let count = 0;
  type State = { v: Real; rel: number; abs: number };
  foldCycleTypes<State>(
    N,
    { v: ONE, rel: 0, abs: 0 },
    (s, L) => {
      const w = weights[L - 1]!;
      const v = mul(s.v, w.value, prec);
      // a factor known only absolutely (value 0 within error) makes the product absolute too
      if (!Number.isFinite(rel[L - 1]!))
        return { v, rel: 0, abs: (size(s.v) + s.abs) * w.error + s.abs * size(w.value) };
      return { v, rel: s.rel + rel[L - 1]! + ulp(prec), abs: s.abs * (size(w.value) + w.error) };
    },
    (s, visit) => {
      const sign: 1 | -1 = fermion ? visit.sign : 1;
      const c = mul(mul(s.v, fromInt(visit.size), prec), invFact, prec);
      const value = sign < 0 ? neg(c) : c;
      const cs = size(value);
      const ce = cs * (s.rel + 2 * ulp(prec)) + (s.abs * Number(visit.size)) / Number(nFact);
      total = add(total, value, prec);
      err += ce + size(total) * ulp(prec);
      onRow?.({
        N,
        cycleType: exponentNotation(visit),
        size: visit.size.toString(),
        sign,
        contribution: { value, error: ce },
      });
      if (++count % 256 === 0) poll(pace);
    },
  );
  return { value: total, error: err };
}
