import type { ComputeResult, GasSpec, ValueJson } from '@traceloom/shared/engine';
import type { ComparisonDto } from '../comparisons/comparison-service.js';

/** What a dataset freezes of its run: stored as JSON text in `dataset.snapshot`. */
export interface DatasetSnapshot {
  gas: { id: string; title: string; version: number };
  run: { id: string; finishedAt: string | null; durationMs: number | null };
  spec: GasSpec;
  /** The full result, class rows included. */
  result: ComputeResult;
  comparisons: Array<Pick<ComparisonDto, 'id' | 'referenceId' | 'kind' | 'normalization' | 'rows'>>;
}

/** Parses the stored snapshot text. */
export function readSnapshot(text: string): DatasetSnapshot {
  return JSON.parse(text) as DatasetSnapshot;
}

/** Z(N) rows of a snapshot, as the dataset page shows them. */
export function canonicalRows(snapshot: DatasetSnapshot): Array<{ N: number; value: ValueJson }> {
  return snapshot.result.canonical.map(({ N, value }) => ({ N, value }));
}
