import type { DatasetCheckDto, DatasetSnapshot } from '@traceloom/shared/api';
import type { DatasetWaiver } from '../db/entities/index.js';
import { routeName, verdictText } from '@traceloom/shared/format';

/** The detail of a check on a row that is not determined at the order. */
const NOT_COMPARED = 'not compared: Z(N) is not determined at the order';

/** A check row before waivers: its agreement as computed. */
export type CheckRow = Omit<DatasetCheckDto, 'status' | 'waiver'> & { agrees: boolean | null };

/**
 * Every check row a snapshot carries: agreement of the routes to Z(N), the grand check and the
 * weights it implies, the spec's own reference check, and each stored comparison with a
 * reference table.
 */
export function checkRows(snapshot: DatasetSnapshot): CheckRow[] {
  const r = snapshot.result;
  const numeric = r.numeric !== undefined;
  const verdictDetail = (v: object): string =>
    (v as { agrees: unknown }).agrees === null
      ? NOT_COMPARED
      : verdictText(v as Parameters<typeof verdictText>[0], r.spec.variable);
  const rows: CheckRow[] = [];
  for (const c of r.canonical) {
    if (c.routes.length < 2) continue;
    rows.push({
      check: 'routes',
      label: `Z(N) by ${c.routes.map(routeName).join(', ')}`,
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
              : 'the routes differ',
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

/** The check rows of a snapshot with their status: passes, fails, or waived by a matching waiver. */
export function datasetChecks(
  snapshot: DatasetSnapshot,
  waivers: readonly DatasetWaiver[],
): DatasetCheckDto[] {
  return withWaivers(checkRows(snapshot), waivers);
}

/** Check rows (as `checkRows` gives them) with their status under the dataset's waivers. */
export function withWaivers(
  rows: readonly CheckRow[],
  waivers: readonly DatasetWaiver[],
): DatasetCheckDto[] {
  return rows.map(({ agrees, ...row }) => {
    const waiver =
      agrees !== false
        ? undefined
        : waivers.find((w) => w.check === row.check && (w.rowN === null || w.rowN === row.N));
    return {
      ...row,
      status: agrees === null ? 'not compared' : agrees ? 'passes' : waiver ? 'waived' : 'fails',
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
