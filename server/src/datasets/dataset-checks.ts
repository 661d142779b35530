import type { DatasetCheckDto } from '@traceloom/shared/api';
import type { DatasetWaiver } from '../db/entities/index.js';
import { isNumericVerdict, type NumericVerdict } from '../compute/numeric-values.js';
import type { DatasetSnapshot } from './snapshot.js';

interface SeriesVerdictLike {
  agrees: boolean | null;
  agreesBelow: string | null;
  firstMismatch: { exponent: string; expected: string; found: string } | null;
}

/** The detail of a check on a row that is not determined at the order. */
const NOT_COMPARED = 'not compared: Z(N) is not determined at the order';

/** A verdict's detail: where a series agrees, or within which tolerance a number does. */
function verdictDetail(v: SeriesVerdictLike | NumericVerdict): string {
  if (isNumericVerdict(v)) {
    return v.agrees
      ? `agrees within ${v.tolerance} (difference ${v.difference})`
      : `differs by ${v.difference}, beyond the tolerance ${v.tolerance}: computed ${v.computed.real} ± ${v.computed.error}, supplied ${v.supplied.real} ± ${v.supplied.error}`;
  }
  if (v.agrees === null) return NOT_COMPARED;
  if (v.agrees) {
    return v.agreesBelow === null ? 'agrees exactly' : `agrees below exponent ${v.agreesBelow}`;
  }
  const m = v.firstMismatch;
  return m
    ? `differs at exponent ${m.exponent}: expected ${m.expected}, found ${m.found}`
    : 'does not agree';
}

/** Human names of the routes to Z(N). */
const ROUTE_NAMES: Record<string, string> = {
  recursion: 'Newton recursion',
  classSum: 'class sum',
  product: 'product form',
  fredholm: 'Fredholm determinant',
};

type CheckRow = Omit<DatasetCheckDto, 'status' | 'waiver'> & { agrees: boolean | null };

/**
 * Every check row a snapshot carries: agreement of the routes to Z(N), the grand check and the
 * weights it implies, the spec's own reference check, and each stored comparison with a
 * reference table.
 */
function checkRows(snapshot: DatasetSnapshot): CheckRow[] {
  const r = snapshot.result;
  const numeric = r.numeric !== undefined;
  const rows: CheckRow[] = [];
  for (const c of r.canonical) {
    if (c.routes.length < 2) continue;
    rows.push({
      check: 'routes',
      label: `Z(N) by ${c.routes.map((r) => ROUTE_NAMES[r] ?? r).join(', ')}`,
      N: c.N,
      agrees: c.agrees,
      detail:
        c.agrees === null
          ? NOT_COMPARED
          : numeric
            ? c.agrees
              ? 'the routes agree within their errors'
              : 'the routes differ by more than their errors'
            : c.agrees
              ? 'the routes agree term by term'
              : 'the routes disagree',
    });
  }
  for (const v of r.grandCheck ?? []) {
    rows.push({
      check: 'grand',
      label: 'grand check',
      N: v.N,
      agrees: v.agrees,
      detail: verdictDetail(v),
    });
  }
  for (const v of r.impliedWeights ?? []) {
    rows.push({
      check: 'implied-weights',
      label: `weight implied by the grand function, L = ${v.L}`,
      N: v.L,
      agrees: v.agrees,
      detail: verdictDetail(v),
    });
  }
  for (const v of r.referenceCheck ?? []) {
    rows.push({
      check: 'reference',
      label: "the spec's reference table",
      N: v.N,
      agrees: v.agrees,
      detail: verdictDetail(v),
    });
  }
  for (const c of snapshot.comparisons) {
    const label =
      c.kind === 'grand' ? 'stored grand comparison' : 'comparison with a reference table';
    for (const v of c.rows) {
      rows.push({
        check: `comparison:${c.id}`,
        label,
        N: v.N,
        agrees: v.agrees,
        detail: verdictDetail(v),
      });
    }
  }
  return rows;
}

/** The check rows of a snapshot with their status: green, red, or waived by a matching waiver. */
export function datasetChecks(
  snapshot: DatasetSnapshot,
  waivers: readonly DatasetWaiver[],
): DatasetCheckDto[] {
  return checkRows(snapshot).map(({ agrees, ...row }) => {
    const waiver =
      agrees !== false
        ? undefined
        : waivers.find((w) => w.check === row.check && (w.rowN === null || w.rowN === row.N));
    return {
      ...row,
      status: agrees === null ? 'not compared' : agrees ? 'green' : waiver ? 'waived' : 'red',
      waiver: waiver
        ? {
            reason: waiver.reason,
            by: { id: waiver.waivedBy.id, displayName: waiver.waivedBy.displayName },
            at: waiver.createdAt,
          }
        : null,
    };
  });
}
