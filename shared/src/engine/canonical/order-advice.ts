import Fraction from 'fraction.js';
import { fitPolynomial, polyAt, polyText, type Point } from '../largen/fit.js';
import { frac } from '../rational.js';
import type { Series } from '../series/series.js';

/** A row is determined unless it is a truncated zero: every known coefficient 0 (valuation >= order). */
export function isDetermined(s: Series): boolean {
  return s.num.length > 0 || s.order === null;
}

/** An extrapolation of the lowest exponent of Z(N) from the determined rows. */
export interface LowestExponentFit {
  /** The lowest exponent of Z(N) as a polynomial in N, e.g. `N^2/2`. */
  expression: string;
  /** `all`, or `even`/`odd` when one polynomial per parity class of N was needed. */
  parity: 'all' | 'even' | 'odd';
  fittedOn: number[];
  verifiedOn: number[];
}

/** What the result says when the order is too low for some rows (`result.orderAdvice`). */
export interface OrderAdviceJson {
  /** Rows N whose value is (or, before a run, is expected to be) not determined at the order. */
  undetermined: number[];
  /** A lower bound of the lowest exponent of Z(N_max), from the weights (or the spectrum's levels). */
  lowestExponentBound: string | null;
  /** The lowest exponents of the determined rows, fitted and extrapolated to N_max (not a bound). */
  fit: (LowestExponentFit & { atNMax: string }) | null;
  /** The smallest order above both the bound and the extrapolation at N_max; null when unknown. */
  orderNeeded: string | null;
  /** One sentence for people: which rows, and which order reaches N_max. */
  message: string;
}

/**
 * Lower bounds of the lowest exponent of Z(N), N = 0..nMax. Every term of the class sum is a
 * product of weights, so val Z(N) >= min over cycle types of sum m_L val Z_L (a min-plus
 * recursion over L). For a spectrum, Z(N) is the elementary (fermions) or complete (bosons)
 * symmetric function of the levels c_p, so val Z(N) >= the sum of the N lowest level valuations
 * (fermions) or N times the lowest (bosons); levels the engine dropped lie at or beyond the order.
 * The larger of the two bounds is returned; null = no bound (an exact zero can appear).
 */
export function lowestExponentBounds(
  weights: readonly Series[],
  nMax: number,
  fermion: boolean,
  spectrum?: { points: readonly Series[]; truncated: boolean },
  cap: Fraction | null = null,
): (Fraction | null)[] {
  const v = weights.map((w) => w.valExponent());
  const bound: (Fraction | null)[] = [frac(0)];
  for (let N = 1; N <= nMax; N++) {
    let best: Fraction | null = null;
    for (let L = 1; L <= N && L <= v.length; L++) {
      const a = v[L - 1];
      const b = bound[N - L];
      if (a == null || b == null) continue; // an exact-zero weight contributes no term
      const t = a.add(b);
      if (best === null || t.compare(best) < 0) best = t;
    }
    bound.push(best);
  }
  if (!spectrum) return bound;
  const levels = spectrum.points
    .map((c) => c.valExponent())
    .filter((x): x is Fraction => x !== null)
    .sort((a, b) => a.compare(b));
  if (levels.length === 0) return bound;
  let sum = frac(0);
  for (let N = 1; N <= nMax; N++) {
    let level: Fraction | null;
    if (!fermion) level = levels[0]!.mul(N);
    else {
      const next = levels[N - 1] ?? (spectrum.truncated ? cap : null);
      if (next === null) break; // a finite lattice: Z(N) is exactly zero beyond its size
      sum = sum.add(next);
      level = sum;
    }
    const w = bound[N];
    bound[N] = w == null || level.compare(w) > 0 ? level : w;
  }
  return bound;
}

/**
 * The lowest exponents of the determined non-zero rows N >= 1, as one exact polynomial of degree
 * <= 2 in N verified on every such row, else one per parity class (the rows of N_max's parity).
 */
export function fitLowestExponents(
  Z: readonly Series[],
  nMax: number,
): (LowestExponentFit & { coeffs: Fraction[] }) | null {
  const points: Point[] = [];
  for (let N = 1; N < Z.length; N++) {
    const z = Z[N]!;
    if (z.num.length > 0) points.push({ N, y: z.valExponent()! });
  }
  const make = (fit: ReturnType<typeof fitPolynomial>, parity: LowestExponentFit['parity']) =>
    fit && {
      coeffs: fit.coeffs,
      expression: polyText(fit.coeffs),
      parity,
      fittedOn: fit.fittedOn,
      verifiedOn: fit.verifiedOn,
    };
  const all = make(fitPolynomial(points, 2, 1), 'all');
  if (all) return all;
  const parity = nMax % 2 === 0 ? 'even' : 'odd';
  const same = points.filter((p) => p.N % 2 === nMax % 2);
  return make(fitPolynomial(same, 2, 1), parity);
}

/** The smallest multiple of `step` strictly above `e`. */
function orderAbove(e: Fraction, step: Fraction): Fraction {
  return e.div(step).floor().add(1).mul(step);
}

/** `from..to` runs of a sorted list of N, e.g. `29..40` or `3, 5, 7..9`. */
export function rowsText(rows: readonly number[]): string {
  const parts: string[] = [];
  for (let i = 0; i < rows.length;) {
    let j = i;
    while (j + 1 < rows.length && rows[j + 1] === rows[j]! + 1) j++;
    parts.push(j - i >= 2 ? `${rows[i]}..${rows[j]}` : rows.slice(i, j + 1).join(', '));
    i = j + 1;
  }
  return parts.join(', ');
}

const power = (x: string, e: string): string => (/^-?\d+$/.test(e) ? `${x}^${e}` : `${x}^(${e})`);

/**
 * Advice on the order for a series table, or null when every row is (expected to be) determined.
 * `Z` holds the rows computed so far (all of them after a run; the first few before one); rows
 * beyond `Z` are judged by the bound and by the fit of the determined rows' lowest exponents.
 */
export function orderAdvice(input: {
  Z: readonly Series[];
  bounds: readonly (Fraction | null)[];
  nMax: number;
  order: Fraction | null;
  step: Fraction;
  variable: string;
}): OrderAdviceJson | null {
  const { Z, bounds, nMax, order, step, variable: x } = input;
  if (order === null) return null;
  const fit = fitLowestExponents(Z, nMax);
  const predicted = (N: number): Fraction | null => {
    const b = bounds[N] ?? null;
    const f = fit && (fit.parity === 'all' || N % 2 === nMax % 2) ? polyAt(fit.coeffs, N) : null;
    if (b === null) return f;
    return f === null || b.compare(f) >= 0 ? b : f;
  };
  const undetermined: number[] = [];
  for (let N = 0; N <= nMax; N++) {
    if (N < Z.length) {
      if (!isDetermined(Z[N]!)) undetermined.push(N);
    } else {
      const p = predicted(N);
      if (p !== null && p.compare(order) >= 0) undetermined.push(N);
    }
  }
  if (undetermined.length === 0) return null;
  const bound = bounds[nMax] ?? null;
  const atNMax = fit ? polyAt(fit.coeffs, nMax) : null;
  const top = predicted(nMax);
  const needed = top === null ? null : orderAbove(top.compare(order) > 0 ? top : order, step);
  const known = Z.length > nMax ? 'is not determined' : 'will not be determined';
  const basis: string[] = [];
  if (bound) basis.push(`the lowest exponent of Z(${nMax}) is at least ${bound.toFraction()}`);
  if (fit && atNMax) {
    basis.push(
      `the lowest exponents of the determined rows follow ${fit.expression}` +
        `${fit.parity === 'all' ? '' : ` for ${fit.parity} N`}, which gives ${atNMax.toFraction()} at N = ${nMax}`,
    );
  }
  const reach = needed
    ? `An order of at least O(${power(x, needed.toFraction())}) is needed to reach N_max = ${nMax} (${basis.join('; ')}).`
    : `Raise the order to reach N_max = ${nMax}; no estimate of the order needed is available.`;
  return {
    undetermined,
    lowestExponentBound: bound ? bound.toFraction() : null,
    fit: fit && atNMax ? { ...withoutCoeffs(fit), atNMax: atNMax.toFraction() } : null,
    orderNeeded: needed ? needed.toFraction() : null,
    message: `Z(N) for N = ${rowsText(undetermined)} ${known} at O(${power(x, order.toFraction())}): its lowest exponent is at or beyond the order. ${reach}`,
  };
}

function withoutCoeffs(f: LowestExponentFit & { coeffs: Fraction[] }): LowestExponentFit {
  const { coeffs: _coeffs, ...rest } = f;
  return rest;
}
