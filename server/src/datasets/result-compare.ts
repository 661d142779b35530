import type { ComputeResult } from '@traceloom/shared/engine';
import { isNumericResult } from '../compute/numeric-values.js';
import { canonicalText } from './canonical-json.js';
import { numericMismatches } from './numeric-verify.js';

/** Parts of a result that must come out the same when the spec is computed again. */
export const COMPARED = [
  'spec',
  'weights',
  'canonical',
  'classes',
  'methods',
  'grandCheck',
  'impliedWeights',
  'referenceCheck',
  'truncations',
] as const;

/** A section's rows by a readable key ("canonical N = 3"; a non-list section is one row). */
export function rowsByKey(section: string, value: unknown): Map<string, unknown> {
  const out = new Map<string, unknown>();
  if (!Array.isArray(value)) {
    out.set(section, value ?? null);
    return out;
  }
  const counts = new Map<string, number>();
  for (const row of value as Array<Record<string, unknown>>) {
    const base =
      'N' in row ? `${section} N = ${row.N}` : 'L' in row ? `${section} L = ${row.L}` : section;
    const k = (counts.get(base) ?? 0) + 1;
    counts.set(base, k);
    out.set(k > 1 ? `${base} #${k}` : base, row);
  }
  return out;
}

function keyed(section: string, value: unknown): Map<string, string> {
  const out = new Map<string, string>();
  for (const [k, row] of rowsByKey(section, value)) out.set(k, canonicalText(row));
  return out;
}

/**
 * The recomputed section without fields the engine added after the stored result was made: an
 * implied weight's series (`implied`) is compared only when the stored rows carry it.
 */
function withoutNewFields(section: string, stored: unknown, fresh: unknown): unknown {
  if (section !== 'impliedWeights' || !Array.isArray(stored) || !Array.isArray(fresh)) return fresh;
  if (stored.some((row) => 'implied' in (row as object))) return fresh;
  return fresh.map((row) => {
    const { implied: _implied, ...rest } = row as Record<string, unknown>;
    return rest;
  });
}

/** The places where two results differ (timings are not compared). */
export function resultMismatches(stored: ComputeResult, fresh: ComputeResult): string[] {
  if (isNumericResult(stored) || isNumericResult(fresh)) return numericMismatches(stored, fresh);
  const out: string[] = [];
  for (const section of COMPARED) {
    const a = keyed(section, stored[section]);
    const b = keyed(section, withoutNewFields(section, stored[section], fresh[section]));
    for (const k of new Set([...a.keys(), ...b.keys()])) {
      if (a.get(k) !== b.get(k))
        out.push(
          !a.has(k)
            ? `${k}: only in the recomputed result`
            : !b.has(k)
              ? `${k}: missing from the recomputed result`
              : `${k}: differs`,
        );
    }
  }
  return out;
}
