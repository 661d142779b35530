import type { DatasetSnapshot } from '@traceloom/shared/api';
import { readResultVerdicts, readVerdict, seriesOrder } from '@traceloom/shared/format';
import type { AnyValue } from '../compute/numeric-values.js';

/**
 * Parses the stored snapshot text; verdicts stored under the older side names (expected/found)
 * read as computed/supplied.
 */
export function readSnapshot(text: string): DatasetSnapshot {
  const s = JSON.parse(text) as DatasetSnapshot;
  return {
    ...s,
    result: readResultVerdicts(s.result),
    comparisons: s.comparisons.map((c) => ({ ...c, rows: c.rows.map(readVerdict) })),
  };
}

/** Z(N) rows of a snapshot, as the dataset page shows them (series or numeric values). */
export function canonicalRows(snapshot: DatasetSnapshot): Array<{ N: number; value: AnyValue }> {
  return snapshot.result.canonical.map(({ N, value }) => ({ N, value }));
}

/** The series order of a snapshot's table; null when exact or numeric (numeric has no order). */
export function snapshotOrder(snapshot: DatasetSnapshot): string | null {
  return seriesOrder(snapshot.result);
}
