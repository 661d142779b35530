import type { ComputeResult } from '@traceloom/shared/engine';
import { agreeWithinError, isNumericValue } from '../compute/numeric-values.js';
import { COMPARED, rowsByKey } from './result-compare.js';

/**
 * Keys whose text is itself an error estimate (a verdict's tolerance and difference): the values
 * they describe are compared within their errors, so these are not compared digit by digit.
 */
const ESTIMATE_KEYS = new Set(['tolerance', 'difference']);

/** Why two parts of a result differ, or null when they agree (numbers within their errors). */
function difference(a: unknown, b: unknown): string | null {
  if (isNumericValue(a) && isNumericValue(b)) {
    return agreeWithinError(a, b)
      ? null
      : `differs beyond the combined error (${a.real} ± ${a.error} stored, ${b.real} ± ${b.error} recomputed)`;
  }
  if (Array.isArray(a) && Array.isArray(b)) {
    if (a.length !== b.length) return 'differs';
    for (let i = 0; i < a.length; i++) {
      const d = difference(a[i], b[i]);
      if (d) return d;
    }
    return null;
  }
  if (a && b && typeof a === 'object' && typeof b === 'object' && !Array.isArray(a)) {
    const x = a as Record<string, unknown>;
    const y = b as Record<string, unknown>;
    for (const k of new Set([...Object.keys(x), ...Object.keys(y)])) {
      if (ESTIMATE_KEYS.has(k) && typeof x[k] === 'string' && typeof y[k] === 'string') continue;
      const d = difference(x[k], y[k]);
      if (d) return d === 'differs' ? `${k} differs` : d;
    }
    return null;
  }
  return a === b ? null : 'differs';
}

/**
 * The places where a stored numeric result and its recomputation differ: every numeric value
 * `{real, error}` must agree with its counterpart within the combined error (a recomputation may
 * determine one digit more or less); everything else (N, routes, verdicts, closed forms, the
 * numeric block) must be the same. Timings and the large-N fit are not compared.
 */
export function numericMismatches(stored: ComputeResult, fresh: ComputeResult): string[] {
  const out: string[] = [];
  for (const section of [...COMPARED, 'numeric'] as const) {
    const a = rowsByKey(section, stored[section]);
    const b = rowsByKey(section, fresh[section]);
    for (const k of new Set([...a.keys(), ...b.keys()])) {
      if (!a.has(k)) out.push(`${k}: only in the recomputed result`);
      else if (!b.has(k)) out.push(`${k}: missing from the recomputed result`);
      else {
        const d = difference(a.get(k), b.get(k));
        if (d) out.push(`${k}: ${d}`);
      }
    }
  }
  return out;
}
