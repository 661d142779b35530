import type { ValueJson } from '../engine/series/format.js';
import { NumericValueJson, isNumericValue, numericTex, numericText } from './numeric.js';

/** A value of the result: a series `{order, terms}` or (numeric mode) a number `{real, error}`. */
export type AnyValue = ValueJson | NumericValueJson;

/**
 * Presentation of result-format values (`{order, terms: [[exponent, coefficient]]}`) without the
 * engine: the screens only print, they never compute, so this stays out of the engine's chunk.
 */

interface Rational {
  sign: '' | '-';
  num: string;
  den: string;
}

function rational(text: string): Rational {
  const t = text.trim();
  const sign = t.startsWith('-') ? '-' : '';
  const [num, den = '1'] = t.replace(/^[-+]/, '').split('/');
  return { sign, num: num.trim(), den: den.trim() };
}

function isOne(r: Rational): boolean {
  return r.num === '1' && r.den === '1';
}

/** `q^2`, `q^(1/2)`, `q` or `` (exponent 0), as the expression language writes powers. */
export function plainPower(variable: string, exponent: string): string {
  if (exponent === '0') return '';
  if (exponent === '1') return variable;
  return /^\d+$/.test(exponent) ? `${variable}^${exponent}` : `${variable}^(${exponent})`;
}

function texRational(r: Rational): string {
  return r.den === '1' ? r.num : `\\tfrac{${r.num}}{${r.den}}`;
}

function texPower(variable: string, exponent: string): string {
  if (exponent === '0') return '';
  if (exponent === '1') return variable;
  const e = rational(exponent);
  const body = e.den === '1' ? e.num : `${e.num}/${e.den}`;
  return `${variable}^{${e.sign}${body}}`;
}

/** Joins signed parts (`+ a`, `- b`) into `a - b`, or `-a - b`. */
export function joinSigned(parts: string[]): string {
  if (parts.length === 0) return '0';
  const text = parts.join(' ');
  return text.startsWith('+ ') ? text.slice(2) : `-${text.slice(2)}`;
}

/**
 * Plain text in the expression language (numeric values: determined digits `± error`), e.g. `q^(1/2) - 3/4*q^2 + O(q^5)`, so it can be pasted
 * back into a gas or a reference table.
 */
export function valueText(value: AnyValue, variable = 'q'): string {
  if (isNumericValue(value)) return numericText(value);
  const parts = value.terms.map(([e, c]) => {
    const r = rational(c);
    const power = plainPower(variable, e);
    const mag = r.den === '1' ? r.num : `${r.num}/${r.den}`;
    const coeff = power === '' ? mag : isOne(r) ? '' : `${mag}*`;
    return `${r.sign === '-' ? '-' : '+'} ${coeff}${power}`;
  });
  if (value.order !== null) parts.push(`+ O(${plainPower(variable, value.order) || '1'})`);
  return joinSigned(parts);
}

/**
 * LaTeX for KaTeX, e.g. `q^{1/2} - \tfrac{3}{4}q^{2} + O(q^{5})`; `maxTerms` elides the middle
 * (numeric values: at most 5 digits per term allowed, the rest elided).
 */
export function valueTex(value: AnyValue, variable = 'q', maxTerms = Infinity): string {
  if (isNumericValue(value))
    return numericTex(value, maxTerms === Infinity ? Infinity : 5 * maxTerms);
  return joinSigned(texTerms(value, variable, maxTerms));
}

/**
 * The signed LaTeX terms of a series (`+ q^{2}`, `- \tfrac{3}{4}q^{3}`, ..., `+ O(q^{8})`), for
 * layouts that break a long series across lines; `maxTerms` elides the middle with `\cdots`.
 */
export function texTerms(value: ValueJson, variable = 'q', maxTerms = Infinity): string[] {
  const shown = value.terms.length > maxTerms ? value.terms.slice(0, maxTerms) : value.terms;
  const parts = shown.map(([e, c]) => {
    const r = rational(c);
    const power = texPower(variable, e);
    const coeff = power === '' || !isOne(r) ? texRational(r) : '';
    return `${r.sign === '-' ? '-' : '+'} ${coeff}${power}`;
  });
  if (shown.length < value.terms.length) parts.push('+ \\cdots');
  if (value.order !== null) parts.push(`+ O(${texPower(variable, value.order) || '1'})`);
  return parts;
}

/** The lowest-order term alone (`q^(9/2)`), or `0` when every known coefficient vanishes. */
export function leadingTerm(value: AnyValue, variable = 'q'): string {
  if (isNumericValue(value)) return numericText(value);
  if (isUndetermined(value)) return NOT_DETERMINED;
  const first = value.terms[0];
  return first ? valueText({ order: null, terms: [first] }, variable) : '0';
}

/** LaTeX of the lowest-order term. */
export function leadingTermTex(value: AnyValue, variable = 'q'): string {
  if (isNumericValue(value)) return numericTex(value);
  if (isUndetermined(value)) return `\\text{${NOT_DETERMINED}}`;
  const first = value.terms[0];
  return first ? valueTex({ order: null, terms: [first] }, variable) : '0';
}

/** What a value no coefficient of which is known is called, on every screen and export. */
export const NOT_DETERMINED = 'not determined';

/**
 * True for a truncated series with no known non-zero coefficient: its lowest exponent is at or
 * beyond the order, so it is "not determined", never 0 (PRODUCT.md, "Honest rows").
 */
export function isUndetermined(value: AnyValue): boolean {
  return !isNumericValue(value) && value.order !== null && value.terms.length === 0;
}

/** A row's value in words: the series, or `not determined (O(q^k))`. */
export function rowValueText(value: AnyValue, variable = 'q'): string {
  const text = valueText(value, variable);
  return isUndetermined(value) ? `${NOT_DETERMINED} (${text})` : text;
}

/** Exponent of the lowest non-zero term, or null when none is known. */
export function valuation(value: AnyValue): string | null {
  if (isNumericValue(value)) return null;
  return value.terms[0]?.[0] ?? null;
}

/** A rational string as a number (for plots and sorting; never for results). */
export function rationalNumber(text: string): number {
  const r = rational(text);
  const v = Number(r.num) / Number(r.den);
  return r.sign === '-' ? -v : v;
}

/** How far a value is known, in words: `exact` or `to O(q^40)`. */
export function knownTo(value: AnyValue, variable = 'q'): string {
  if (isNumericValue(value)) return Number(value.error) === 0 ? 'exact' : `± ${value.error}`;
  return value.order === null ? 'exact' : `O(${plainPower(variable, value.order) || '1'})`;
}

/** A cycle type `[[1, 2], [2, 1]]` (length, multiplicity) in exponent notation: `1^2 2^1`. */
export function cycleTypeText(cycleType: readonly (readonly [number, number])[]): string {
  return cycleType.length === 0 ? '∅' : cycleType.map(([l, m]) => `${l}^${m}`).join(' ');
}

/** The same cycle type in LaTeX: `1^{2}\,2^{1}`. */
export function cycleTypeTex(cycleType: readonly (readonly [number, number])[]): string {
  return cycleType.length === 0
    ? '\\varnothing'
    : cycleType.map(([l, m]) => `${l}^{${m}}`).join('\\,');
}
