import { NOT_COMPARED_TEXT, rationalNumber, type MismatchJson } from '@traceloom/shared/format';

/** What one cell of a check matrix says about one coefficient. */
export type CellState = 'agrees' | 'differs' | 'unchecked';

/** One row verdict in the shape the engine and the API share. */
export interface VerdictLike {
  N: number;
  /** null: "not compared", the computed row is not determined at the order. */
  agrees: boolean | null;
  agreesBelow: string | null;
  firstMismatch: MismatchJson | null;
}

const EPS = 1e-9;

/** A check on a row that is not determined at the order: nothing was compared. */
export const NOT_COMPARED = NOT_COMPARED_TEXT;

/**
 * The state of the coefficient of q^exponent in a row: below the first mismatch (or below the
 * agreed order) it agrees; at the mismatch it differs; after it, or beyond what both sides
 * determine, it was not checked.
 */
export function cellState(row: VerdictLike, exponent: string): CellState {
  if (row.agrees === null) return 'unchecked';
  const e = rationalNumber(exponent);
  if (row.firstMismatch) {
    const m = rationalNumber(row.firstMismatch.exponent);
    if (Math.abs(e - m) < EPS) return 'differs';
    return e < m ? 'agrees' : 'unchecked';
  }
  if (row.agreesBelow === null) return 'agrees';
  return e < rationalNumber(row.agreesBelow) - EPS ? 'agrees' : 'unchecked';
}

/**
 * The exponents the matrix shows: 0, step, 2 step, ... below `order` (or below the largest
 * agreed/mismatch exponent when exact), at most `max` columns.
 */
export function matrixExponents(
  step: string,
  order: string | null,
  rows: readonly VerdictLike[],
  max = 48,
): string[] {
  const [numText, denText = '1'] = step.replace(/\s/g, '').split('/');
  const sn = Number(numText);
  const sd = Number(denText);
  const s = sn / sd;
  const marks = rows
    .flatMap((r) => [r.agreesBelow, r.firstMismatch?.exponent])
    .filter((x): x is string => typeof x === 'string');
  const top =
    order !== null ? rationalNumber(order) : Math.max(s, ...marks.map(rationalNumber)) + s;
  const out: string[] = [];
  for (let k = 0; out.length < max && k * s < top - EPS; k++) out.push(stepMultiple(sn, sd, k));
  return out;
}

function stepMultiple(num: number, den: number, k: number): string {
  const n = num * k;
  const g = gcd(n, den);
  return den / g === 1 ? `${n / g}` : `${n / g}/${den / g}`;
}

function gcd(a: number, b: number): number {
  return b === 0 ? Math.abs(a) || 1 : gcd(b, a % b);
}
