import type { ValueJson } from '../engine/series/format.js';
import { csvRow } from './tables.js';

/** An exact rational n/d (d > 0) read from a result-format text such as `-3/4` or `5`. */
interface Q {
  n: bigint;
  d: bigint;
}

function q(text: string): Q {
  const [a, b = '1'] = text.trim().split('/');
  const n = BigInt(a!);
  const d = BigInt(b);
  return d < 0n ? { n: -n, d: -d } : { n, d };
}

function gcd(a: bigint, b: bigint): bigint {
  a = a < 0n ? -a : a;
  b = b < 0n ? -b : b;
  while (b) [a, b] = [b, a % b];
  return a;
}

function text(x: Q): string {
  const g = gcd(x.n, x.d) || 1n;
  const n = x.n / g;
  const d = x.d / g;
  return d === 1n ? String(n) : `${n}/${d}`;
}

/** The index k of an exponent e = k * step (an error when e is not a multiple of the step). */
function index(e: Q, step: Q): number {
  const num = e.n * step.d;
  const den = e.d * step.n;
  if (num % den !== 0n) throw new Error(`exponent ${text(e)} is not a multiple of the step`);
  return Number(num / den);
}

/** The rows of a coefficient matrix: N and its series value. */
export interface MatrixRow {
  N: number;
  value: ValueJson;
}

/**
 * The coefficient matrix of a series table as CSV: one row per N, one column per exponent (a
 * multiple of `step`) from the lowest exponent of any row to the highest one determined. A cell
 * is the coefficient where it is determined (0 included) and empty from the row's order on: no
 * cell claims a coefficient that was not determined. An exact table runs to its highest term.
 */
export function coefficientMatrixCsv(
  rows: readonly MatrixRow[],
  stepText = '1',
  variable = 'q',
): string {
  const step = q(stepText);
  const ks = rows.flatMap((r) => [
    ...r.value.terms.map(([e]) => index(q(e), step)),
    ...(r.value.order === null ? [] : [index(q(r.value.order), step) - 1]),
  ]);
  const lo = Math.min(0, ...ks);
  const hi = Math.max(lo, ...ks);
  const exponents: string[] = [];
  for (let k = lo; k <= hi; k++) exponents.push(text({ n: step.n * BigInt(k), d: step.d }));
  const lines = [csvRow(['N', ...exponents.map((e) => `${variable}^${e}`)])];
  for (const r of rows) {
    const cells = exponents.map(() => '0');
    const top = r.value.order === null ? Infinity : index(q(r.value.order), step);
    for (let k = Math.max(top, lo); k <= hi; k++) cells[k - lo] = '';
    for (const [e, c] of r.value.terms) cells[index(q(e), step) - lo] = c;
    lines.push(csvRow([String(r.N), ...cells]));
  }
  return `${lines.join('\n')}\n`;
}
