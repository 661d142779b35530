import type Fraction from 'fraction.js';
import { frac } from '../rational.js';
import { mul, scale, shift } from '../series/arith.js';
import { Series } from '../series/series.js';
import { fitPolynomial, polyAt, polyText, type Point } from './fit.js';
import type { LargeNClassJson, NormalizationJson } from './types.js';

/** A parity class of rows with its normalized rows Y(N). */
export interface NormalizedClass {
  parity: LargeNClassJson['parity'];
  rows: number[];
  Y: Map<number, Series>;
  normalization: string;
  detail: NormalizationJson;
}

/** Rows that say something about the leading term: N >= 1, a determined non-zero lowest term. */
export function usableRows(Z: readonly Series[]): number[] {
  const rows: number[] = [];
  for (let N = 1; N < Z.length; N++) if (Z[N]!.num.length > 0) rows.push(N);
  return rows;
}

/** `q^(e)` for an exponent polynomial, with the leading-coefficient factor when constant. */
function factorText(expo: readonly Fraction[], variable: string, lead: string | null): string {
  const neg = expo.map((c) => c.neg());
  const e = polyText(neg);
  const pw = e === '0' ? '' : /^[A-Za-z0-9]+$/.test(e) ? `${variable}^${e}` : `${variable}^(${e})`;
  if (lead === null) return pw === '' ? '1' : pw;
  const l = /^[0-9]+$/.test(lead) ? lead : `(${lead})`;
  return pw === '' ? `1/${l}` : `${pw}/${l}`;
}

/** Normalize one class: divide by the leading term, record the exponent fit. */
function normalizeClass(
  Z: readonly Series[],
  parity: NormalizedClass['parity'],
  rows: number[],
  variable: string,
): NormalizedClass | null {
  const points: Point[] = rows.map((N) => ({ N, y: Z[N]!.valExponent()! }));
  const fit = fitPolynomial(points, 2, 1);
  if (!fit) return null;
  const Y = new Map<number, Series>();
  const leads: { N: number; c: string }[] = [];
  for (const N of rows) {
    const z = Z[N]!;
    const lead = frac(z.num[0]!, z.den);
    leads.push({ N, c: lead.toFraction() });
    Y.set(N, scale(shift(z, polyAt(fit.coeffs, N).neg()), lead.inverse()));
  }
  const allOne = leads.every((l) => l.c === '1');
  const same = leads.every((l) => l.c === leads[0]!.c);
  const detail: NormalizationJson = {
    source: 'fitted',
    leadingExponent: {
      expression: polyText(fit.coeffs),
      fittedOn: fit.fittedOn,
      verifiedOn: fit.verifiedOn,
    },
  };
  if (!allOne) detail.leadingCoefficients = leads;
  const leadText = allOne ? null : same ? leads[0]!.c : 'c(N)';
  return { parity, rows, Y, normalization: factorText(fit.coeffs, variable, leadText), detail };
}

/**
 * The automatic normalization: the leading exponent of Z(N) as one exact quadratic in N verified
 * on every usable row, else one per parity class; leading coefficients divided out. Classes whose
 * exponents fit no verified quadratic are left out (the caller notes it).
 */
export function fittedClasses(
  Z: readonly Series[],
  variable: string,
  notes: string[],
): NormalizedClass[] {
  const rows = usableRows(Z);
  const all = normalizeClass(Z, 'all', rows, variable);
  if (all) return [all];
  return parityClasses(Z, variable, notes);
}

/** One normalized class per parity of N (a class whose exponents fit no quadratic is noted). */
export function parityClasses(
  Z: readonly Series[],
  variable: string,
  notes: string[],
): NormalizedClass[] {
  const rows = usableRows(Z);
  const out: NormalizedClass[] = [];
  for (const parity of ['even', 'odd'] as const) {
    const r = rows.filter((N) => N % 2 === (parity === 'even' ? 0 : 1));
    const c = normalizeClass(Z, parity, r, variable);
    if (c) out.push(c);
    else
      notes.push(
        `${parity} N: the leading exponent fits no quadratic in N verified on rows ${r.join(', ') || '(none)'}`,
      );
  }
  return out;
}

/** The user's normalization: Z(N) times the given factor, one class. */
export function givenClass(
  Z: readonly Series[],
  factors: readonly Series[],
  text: string,
): NormalizedClass {
  const rows = usableRows(Z).filter((N) => factors[N] !== undefined);
  const Y = new Map<number, Series>();
  for (const N of rows) Y.set(N, mul(Z[N]!, factors[N]!));
  return { parity: 'all', rows, Y, normalization: text, detail: { source: 'given' } };
}
