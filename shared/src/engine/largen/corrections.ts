import type Fraction from 'fraction.js';
import { inverse, mul, sub } from '../series/arith.js';
import { toValueJson } from '../series/format.js';
import type { Series } from '../series/series.js';
import { frac } from '../rational.js';
import { fitPolynomial, polyAt, polyText, type Point } from './fit.js';
import { cutIndex, knownEnd } from './grid.js';
import type { CorrectionFitJson, CorrectionRowJson } from './types.js';

/** Correction orders fitted, and the highest degree tried for their coefficients. */
export const CORRECTION_ORDERS = 3;
export const MAX_COEFF_DEGREE = 3;
/** Terms of Z(N)/Z(inf) - 1 kept per row. */
const TERMS_KEPT = 6;
/** Widest window looked at past the first difference (grid steps). */
const MAX_WINDOW = 1 << 16;

/** The leading terms of one row's correction, as grid indices and exact coefficients. */
export interface RowCorrection {
  N: number;
  terms: { index: number; c: Fraction }[];
  /** Known below this grid index (Infinity: exact). */
  end: number;
  series: Series;
}

/**
 * Z(N)/Z(inf) - 1 = (Y - Z(inf)) / Z(inf) for each row, only as far as its first TERMS_KEPT terms
 * (the window doubles until they are seen or the known range ends): cheap for long rows.
 */
export function rowCorrections(
  N: readonly number[],
  Y: readonly Series[],
  limit: Series,
  K: number,
): RowCorrection[] {
  const kEnd = Math.min(K, knownEnd(limit));
  // 1/Z(inf) only as far as the windows need it (a long limit would cost its length squared)
  let inv: Series | null = null;
  let invTo = 0;
  const inverseTo = (w: number): Series => {
    if (inv === null || w > invTo) {
      invTo = Math.max(w, 2 * invTo);
      inv = inverse(limit, limit.step.mul(invTo));
    }
    return inv;
  };
  const out: RowCorrection[] = [];
  Y.forEach((y, i) => {
    const end = Math.min(knownEnd(y), kEnd);
    const d = cutIndex(sub(y, limit), end);
    if (d.num.length === 0) {
      out.push({ N: N[i]!, terms: [], end, series: d });
      return;
    }
    for (let w = 32; ; w *= 2) {
      const cap = Math.min(end, d.start + w);
      const c = mul(d, inverseTo(cap - d.start), limit.step.mul(cap));
      const terms: { index: number; c: Fraction }[] = [];
      for (let k = 0; k < c.num.length && terms.length <= TERMS_KEPT; k++) {
        if (c.num[k] !== 0n) terms.push({ index: c.start + k, c: frac(c.num[k]!, c.den) });
      }
      // an exact difference over an exact limit can end: stop widening after MAX_WINDOW steps
      if (terms.length > TERMS_KEPT || cap >= end || w >= MAX_WINDOW) {
        // known up to the next non-zero term (or the end of the window): nothing hidden below it
        const stop = terms.length > TERMS_KEPT ? terms.pop()!.index : cap;
        out.push({ N: N[i]!, terms, end: stop, series: cutIndex(c, stop) });
        return;
      }
    }
  });
  return out;
}

/** The rows' corrections in the result format. */
export function correctionRowsJson(rows: readonly RowCorrection[]): CorrectionRowJson[] {
  return rows.map((r) => ({ N: r.N, value: toValueJson(r.series) }));
}

/**
 * For m = 1..3: the m-th term of Z(N)/Z(inf) - 1 as exponent (linear in N) and coefficient
 * (polynomial in N of degree <= 3), solved from the first rows from some N0 on and verified on
 * every later row that shows the term; a later row whose known range reaches the predicted exponent
 * without showing the term refutes it. "found" only with at least one verifying row.
 */
export function correctionFits(
  rows: readonly RowCorrection[],
  step: Fraction,
): CorrectionFitJson[] {
  const out: CorrectionFitJson[] = [];
  for (let m = 1; m <= CORRECTION_ORDERS; m++) {
    const withTerm = rows.filter((r) => r.terms.length >= m);
    let found: CorrectionFitJson | null = null;
    let refutedBy: string | undefined;
    for (let s0 = 0; s0 + 3 <= withTerm.length && !found; s0++) {
      const R = withTerm.slice(s0);
      const ePts: Point[] = R.map((r) => ({ N: r.N, y: step.mul(r.terms[m - 1]!.index) }));
      const cPts: Point[] = R.map((r) => ({ N: r.N, y: r.terms[m - 1]!.c }));
      const e = fitPolynomial(ePts, 1, 1);
      const c = fitPolynomial(cPts, MAX_COEFF_DEGREE, 1);
      if (!e || !c) continue;
      const refuter = rows.find(
        (r) =>
          r.N > R[0]!.N &&
          r.terms.length < m &&
          (r.end === Infinity || polyAt(e.coeffs, r.N).compare(step.mul(r.end)) < 0),
      );
      if (refuter) {
        refutedBy ??= `the fit on rows ${R.map((r) => r.N).join(', ')} is refuted by row ${refuter.N}, which shows no term ${m} where it predicts one`;
        continue;
      }
      const nFit = Math.max(e.fittedOn.length, c.fittedOn.length);
      const skipped = withTerm.slice(0, s0).map((r) => r.N);
      found = {
        m,
        status: 'found',
        exponent: polyText(e.coeffs),
        coefficient: polyText(c.coeffs),
        fittedOn: R.slice(0, nFit).map((r) => r.N),
        verifiedOn: R.slice(nFit).map((r) => r.N),
      };
      if (skipped.length)
        found.note = `holds from N = ${R[0]!.N}; rows ${skipped.join(', ')} differ`;
    }
    out.push(
      found ?? {
        m,
        status: 'none',
        exponent: null,
        coefficient: null,
        fittedOn: [],
        verifiedOn: [],
        note:
          refutedBy ??
          (withTerm.length < 3
            ? `fewer than 3 rows show a term ${m} (${withTerm.map((r) => r.N).join(', ') || 'none'})`
            : `no pattern of degree <= ${MAX_COEFF_DEGREE} on these rows (${withTerm.map((r) => r.N).join(', ')})`),
      },
    );
  }
  return out;
}
