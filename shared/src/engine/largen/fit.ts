import Fraction from 'fraction.js';
import { frac } from '../rational.js';

/** A point (N, value) with an exact value. */
export interface Point {
  N: number;
  y: Fraction;
}

/** An exact polynomial in N (coefficients of N^0, N^1, ...) fitted on some points, checked on others. */
export interface PolyFit {
  coeffs: Fraction[];
  fittedOn: number[];
  verifiedOn: number[];
}

/** Value of the polynomial at N. */
export function polyAt(coeffs: readonly Fraction[], N: number): Fraction {
  let r = frac(0);
  for (let i = coeffs.length - 1; i >= 0; i--) r = r.mul(N).add(coeffs[i]!);
  return r;
}

/** Coefficients of the interpolating polynomial through the points (Newton form, exact). */
export function interpolate(points: readonly Point[]): Fraction[] {
  const n = points.length;
  const xs = points.map((p) => p.N);
  const dd = points.map((p) => p.y);
  for (let j = 1; j < n; j++) {
    for (let i = n - 1; i >= j; i--) dd[i] = dd[i]!.sub(dd[i - 1]!).div(xs[i]! - xs[i - j]!);
  }
  // expand sum dd[k] prod_{i<k} (N - x_i)
  let coeffs: Fraction[] = [frac(0)];
  for (let k = n - 1; k >= 0; k--) {
    // coeffs = coeffs * (N - x_k) + dd[k]
    const next: Fraction[] = new Array<Fraction>(coeffs.length + 1).fill(frac(0));
    for (let i = 0; i < coeffs.length; i++) {
      next[i + 1] = next[i + 1]!.add(coeffs[i]!);
      next[i] = next[i]!.sub(coeffs[i]!.mul(xs[k]!));
    }
    next[0] = next[0]!.add(dd[k]!);
    coeffs = next;
  }
  while (coeffs.length > 1 && coeffs[coeffs.length - 1]!.equals(0)) coeffs.pop();
  return coeffs;
}

/**
 * The polynomial of lowest degree <= maxDegree through the first degree+1 points that holds on
 * every other point, with at least `minVerify` points left to verify it; null when none does.
 * Exact: a fit that fails on one point is rejected.
 */
export function fitPolynomial(
  points: readonly Point[],
  maxDegree: number,
  minVerify = 1,
): PolyFit | null {
  for (let d = 0; d <= maxDegree; d++) {
    if (points.length < d + 1 + minVerify) return null;
    const base = points.slice(0, d + 1);
    const coeffs = interpolate(base);
    const rest = points.slice(d + 1);
    if (rest.every((p) => polyAt(coeffs, p.N).equals(p.y))) {
      return { coeffs, fittedOn: base.map((p) => p.N), verifiedOn: rest.map((p) => p.N) };
    }
  }
  return null;
}

/** A rational as expression text: `3`, `-1/2`. */
const rat = (f: Fraction): string => f.toFraction();

/** The polynomial as expression text in N with explicit `*`, e.g. `N^2/2 + N + 1`. */
export function polyText(coeffs: readonly Fraction[], name = 'N'): string {
  const parts: string[] = [];
  for (let i = coeffs.length - 1; i >= 0; i--) {
    const c = coeffs[i]!;
    if (c.equals(0)) continue;
    const mag = c.abs();
    const pw = i === 0 ? '' : i === 1 ? name : `${name}^${i}`;
    let t: string;
    if (pw === '') t = rat(mag);
    else if (mag.equals(1)) t = pw;
    else if (mag.n === 1n) t = `${pw}/${mag.d}`;
    else if (mag.d === 1n) t = `${mag.n}*${pw}`;
    else t = `${mag.n}*${pw}/${mag.d}`;
    parts.push(`${c.s < 0n ? '-' : '+'} ${t}`);
  }
  if (parts.length === 0) return '0';
  const text = parts.join(' ');
  return text.startsWith('+ ') ? text.slice(2) : `-${text.slice(2)}`;
}
