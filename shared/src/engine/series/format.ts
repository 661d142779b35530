import Fraction from 'fraction.js';
import { frac } from '../rational.js';
import { add } from './arith.js';
import { Series } from './series.js';

/** A value in the result format: exponent/coefficient pairs as exact rational strings. */
export interface ValueJson {
  order: string | null;
  terms: [string, string][];
}

/** The result-format JSON of a series (zero terms omitted, sorted by exponent). */
export function toValueJson(s: Series): ValueJson {
  const terms: [string, string][] = [];
  const sn = s.step.s * s.step.n;
  const sd = s.step.d;
  const exponent = (i: number): string =>
    sd === 1n ? String(sn * BigInt(i)) : s.step.mul(i).toFraction();
  // one term, or an integer denominator: already in lowest terms (Series.of divides out the gcd)
  const coefficient = (c: bigint): string =>
    s.den === 1n ? String(c) : s.num.length === 1 ? `${c}/${s.den}` : frac(c, s.den).toFraction();
  for (let i = 0; i < s.num.length; i++) {
    const c = s.num[i]!;
    if (c !== 0n) terms.push([exponent(s.start + i), coefficient(c)]);
  }
  return { order: s.order === null ? null : exponent(s.order), terms };
}

/** The series of a result-format value (the inverse of `toValueJson`). */
export function fromValueJson(value: ValueJson): Series {
  let s =
    value.order === null
      ? Series.constant(new Fraction(0))
      : Series.bigO(new Fraction(value.order));
  for (const [exponent, coefficient] of value.terms) {
    s = add(s, Series.monomial(new Fraction(coefficient), new Fraction(exponent)));
  }
  return s;
}

/** Non-zero terms as [exponent, coefficient] fractions. */
export function termsOf(s: Series): [Fraction, Fraction][] {
  const out: [Fraction, Fraction][] = [];
  for (let i = 0; i < s.num.length; i++) {
    if (s.num[i] !== 0n) out.push([s.step.mul(s.start + i), frac(s.num[i]!, s.den)]);
  }
  return out;
}

/** Plain text in the expression language, e.g. `1 + 2*q^(1/2) - 3/4*q^2 + O(q^5)`. */
export function toText(s: Series, variable = 'q'): string {
  const parts: string[] = [];
  for (const [e, c] of termsOf(s)) {
    const mag = c.abs();
    const power = e.equals(0)
      ? ''
      : e.equals(1)
        ? variable
        : `${variable}^${e.d === 1n && e.s > 0n ? e.toFraction() : `(${e.toFraction()})`}`;
    const coeff = power === '' ? mag.toFraction() : mag.equals(1) ? '' : `${mag.toFraction()}*`;
    parts.push(`${c.s < 0n ? '-' : '+'} ${coeff}${power}`);
  }
  const o = s.orderExponent();
  if (o !== null) {
    const oe = o.equals(1)
      ? variable
      : `${variable}^${o.d === 1n && o.s > 0n ? o.toFraction() : `(${o.toFraction()})`}`;
    parts.push(`+ O(${oe})`);
  }
  if (parts.length === 0) return '0';
  const text = parts.join(' ');
  return text.startsWith('+ ') ? text.slice(2) : `-${text.slice(2)}`;
}

/** LaTeX text, e.g. `1 + 2q^{1/2} - \tfrac{3}{4}q^{2} + O(q^{5})`. */
export function toLatex(s: Series, variable = 'q'): string {
  const tex = (f: Fraction): string =>
    f.d === 1n ? f.toFraction() : `${f.s < 0n ? '-' : ''}\\tfrac{${f.n}}{${f.d}}`;
  const parts: string[] = [];
  for (const [e, c] of termsOf(s)) {
    const mag = c.abs();
    const power = e.equals(0) ? '' : `${variable}^{${e.toFraction()}}`;
    const coeff = power === '' || !mag.equals(1) ? tex(mag) : '';
    parts.push(`${c.s < 0n ? '-' : '+'} ${coeff}${power}`);
  }
  const o = s.orderExponent();
  if (o !== null) parts.push(`+ O(${variable}^{${o.toFraction()}})`);
  if (parts.length === 0) return '0';
  const text = parts.join(' ');
  return text.startsWith('+ ') ? text.slice(2) : `-${text.slice(2)}`;
}
