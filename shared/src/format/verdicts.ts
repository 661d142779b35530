import type { NumericValueJson } from './numeric.js';
import { numericText } from './numeric.js';
import { plainPower } from './values.js';
import { SIDES, VERDICT } from './vocabulary.js';

/** The first coefficient where the computed and the supplied series differ. */
export interface MismatchJson {
  exponent: string;
  computed: string;
  supplied: string;
}

/** A series verdict: agreement below an exponent, or the first mismatch. */
export interface SeriesVerdictJson {
  /** null: not compared, the computed row is not determined at the order. */
  agrees: boolean | null;
  /** Exponent below which every coefficient agrees; null when both are exact and equal. */
  agreesBelow: string | null;
  firstMismatch: MismatchJson | null;
}

/** A numeric verdict: both values compared within their combined error (`tolerance`). */
export interface NumericVerdictJson {
  agrees: boolean;
  tolerance: string;
  difference?: string;
  computed?: NumericValueJson;
  supplied?: NumericValueJson;
}

/** Any verdict of a check, series or numeric. */
export type AnyVerdictJson = SeriesVerdictJson | NumericVerdictJson;

/** A check on a row that is not determined at the order: nothing was compared. */
export const NOT_COMPARED_TEXT = 'not compared (not determined at the order)';

/** True for a numeric verdict, which carries the tolerance it was compared within. */
export function isNumericVerdict(v: unknown): v is NumericVerdictJson {
  return typeof (v as { tolerance?: unknown } | null)?.tolerance === 'string';
}

/**
 * A mismatch as stored by any version: documents written before the vocabulary was settled
 * name the sides `expected` (computed) and `found` (supplied); both read as computed/supplied.
 */
export function readMismatch(m: unknown): MismatchJson | null {
  if (typeof m !== 'object' || m === null) return null;
  const o = m as Record<string, unknown>;
  const text = (x: unknown): string => (typeof x === 'string' ? x : String(x ?? ''));
  return {
    exponent: text(o['exponent']),
    computed: text(o['computed'] ?? o['expected']),
    supplied: text(o['supplied'] ?? o['found']),
  };
}

/** A verdict (row or weight) with its mismatch in today's field names; other fields are kept. */
export function readVerdict<T extends object>(v: T): T {
  const m = (v as { firstMismatch?: unknown }).firstMismatch;
  if (m === undefined || m === null) return v;
  return { ...v, firstMismatch: readMismatch(m) };
}

/**
 * A result (or any object with check arrays) with every verdict read by `readVerdict`: the one
 * entry point for stored results and imported documents.
 */
export function readResultVerdicts<T extends object>(r: T): T {
  const o = r as Record<string, unknown>;
  const out: Record<string, unknown> = { ...o };
  for (const key of ['grandCheck', 'impliedWeights', 'referenceCheck']) {
    const list = o[key];
    if (Array.isArray(list)) out[key] = list.map((v: object) => readVerdict(v));
  }
  return out as T;
}

/** Check status words of datasets locked before the statuses were named passes / fails. */
const OLD_CHECK_STATUS: Record<string, string> = { green: 'passes', red: 'fails' };

/**
 * A dataset check's status as people read it: passes, fails, waived or not compared; documents
 * locked earlier say green / red, which read as passes / fails (the locked bytes stay as they are).
 */
export function checkStatusText(status: string): string {
  return OLD_CHECK_STATUS[status] ?? status;
}

/** `q^40` for the phrase "agrees below q^40" (exponent 0 written as `q^0`). */
function powerOf(variable: string, exponent: string): string {
  return plainPower(variable, exponent) || `${variable}^0`;
}

/** The one phrase for agreement of a series: `agrees below q^40`, or `agrees exactly`. */
export function agreesBelowText(agreesBelow: string | null, variable = 'q'): string {
  return agreesBelow === null
    ? `${VERDICT.agrees} exactly`
    : `${VERDICT.agrees} below ${powerOf(variable, agreesBelow)}`;
}

/** A mismatch in words: `differs at q^3: computed 4, supplied 8`. */
export function mismatchText(m: MismatchJson, variable = 'q'): string {
  return `${VERDICT.differs} at ${powerOf(variable, m.exponent)}: ${SIDES.computed} ${m.computed}, ${SIDES.supplied} ${m.supplied}`;
}

/** A numeric verdict in words, with its tolerance. */
export function numericVerdictText(v: NumericVerdictJson): string {
  const diff = v.difference ?? 'the difference';
  if (v.agrees) {
    return `${VERDICT.agrees} within ${v.tolerance}${v.difference ? ` (difference ${v.difference})` : ''}`;
  }
  const sides =
    v.computed && v.supplied
      ? `: ${SIDES.computed} ${numericText(v.computed)}, ${SIDES.supplied} ${numericText(v.supplied)}`
      : '';
  return `${VERDICT.differs} by ${diff}, beyond the tolerance ${v.tolerance}${sides}`;
}

/** Any verdict in words: the agreement phrase, or the mismatch with both sides. */
export function verdictText(v: AnyVerdictJson, variable = 'q'): string {
  if (isNumericVerdict(v)) return numericVerdictText(v);
  if (v.agrees === null) return NOT_COMPARED_TEXT;
  const m = readMismatch(v.firstMismatch);
  if (!v.agrees && m) return mismatchText(m, variable);
  if (!v.agrees) return VERDICT.differs;
  return agreesBelowText(v.agreesBelow, variable);
}
