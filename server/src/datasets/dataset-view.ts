import { gunzipSync } from 'node:zlib';
import type { DatasetDto, DatasetSnapshot } from '@traceloom/shared/api';
import { knownSentence, readResultVerdicts } from '@traceloom/shared/format';
import type { EntityManager } from 'typeorm';
import { Dataset, DatasetView } from '../db/entities/index.js';
import { checkRows, type CheckRow } from './dataset-checks.js';
import { canonicalRows, readSnapshot, snapshotOrder } from './snapshot.js';

/** What the dataset page and the lock checks need of a snapshot (`dataset_view`). */
export interface DatasetViewData {
  summary: DatasetDto['snapshot'];
  checks: CheckRow[];
}

/** The view of a parsed snapshot. */
export function viewOf(snapshot: DatasetSnapshot): DatasetViewData {
  return {
    summary: {
      gas: snapshot.gas,
      run: snapshot.run,
      statistics: snapshot.spec.statistics,
      variable: snapshot.spec.variable,
      order: snapshotOrder(snapshot),
      nMax: snapshot.result.canonical.length - 1,
      precision: snapshot.result.numeric?.precision ?? snapshot.spec.precision ?? null,
      known: knownSentence(snapshot.result),
      canonical: canonicalRows(snapshot),
    },
    checks: checkRows(snapshot),
  };
}

/** A new dataset's snapshot as a worker builds it: the run's stored bytes and what to add. */
export interface SnapshotTask {
  /** The run's stored result: gzip of its JSON without class rows. */
  result: Uint8Array;
  /** The run's class-row pages (gzip of JSON arrays), by N and then page. */
  pages: Uint8Array[];
  gas: DatasetSnapshot['gas'];
  run: DatasetSnapshot['run'];
  comparisons: DatasetSnapshot['comparisons'];
}

/** The snapshot text to store and its view, both made in the worker. */
export interface SnapshotOutput {
  ok: true;
  snapshot: string;
  summary: string;
  checks: string;
}

/**
 * Worker task: unpacks a run's result and class pages, builds the dataset snapshot (the spec,
 * the full result with every class row, the comparisons), and answers its text and its view, so
 * the server's main thread neither parses nor serializes the result.
 */
export function snapshotTask(task: SnapshotTask): SnapshotOutput {
  const summary = JSON.parse(gunzipSync(task.result).toString('utf8')) as object;
  const classes = task.pages.flatMap((page) => JSON.parse(gunzipSync(page).toString('utf8')));
  const result = readResultVerdicts({
    ...summary,
    classes,
  } as unknown as DatasetSnapshot['result']);
  const snapshot: DatasetSnapshot = {
    gas: task.gas,
    run: task.run,
    spec: result.spec,
    result,
    comparisons: task.comparisons,
  };
  const view = viewOf(snapshot);
  return {
    ok: true,
    snapshot: JSON.stringify(snapshot),
    summary: JSON.stringify(view.summary),
    checks: JSON.stringify(view.checks),
  };
}

/**
 * The stored view of a dataset. A dataset without one (none is made so today; kept for safety)
 * has it made from its snapshot once and stored.
 */
export async function loadView(
  manager: EntityManager,
  datasetId: string,
): Promise<DatasetViewData> {
  const stored = await manager.getRepository(DatasetView).findOneBy({ datasetId });
  if (stored) {
    return {
      summary: JSON.parse(stored.summary) as DatasetViewData['summary'],
      checks: JSON.parse(stored.checks) as CheckRow[],
    };
  }
  const { snapshot } = await manager
    .getRepository(Dataset)
    .findOneOrFail({ where: { id: datasetId }, select: { id: true, snapshot: true } });
  const view = viewOf(readSnapshot(snapshot));
  await manager.getRepository(DatasetView).insert({
    datasetId,
    summary: JSON.stringify(view.summary),
    checks: JSON.stringify(view.checks),
  });
  return view;
}
