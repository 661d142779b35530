import type { DatasetSnapshot } from '@traceloom/shared/api';
import { gunzipSync, gzipSync } from 'node:zlib';
import { compute, estimateRun, type Progress } from '@traceloom/shared/engine';
import {
  compareSeriesRows,
  compareReferenceRowsNumeric,
  impliedWeightsOfRows,
} from '../comparisons/compare-rows.js';
import {
  refusalOf,
  type TaskInput,
  type TaskKind,
  type TaskMessage,
  type TaskOutput,
  type TaskResult,
} from '../compute/tasks.js';
import { resultMismatches } from '../datasets/result-compare.js';
import { snapshotTask } from '../datasets/dataset-view.js';
import { exportTask, lockDocumentTask } from '../datasets/export-task.js';
import { productTask } from '../products/product-task.js';
import { checkNormalization } from '../references/normalization-check.js';
import { parseReferenceFile } from '../references/reference-parse.js';
import { sectorAssembleTask, sectorPartsTask } from './sector-tasks.js';
import { ClassPager, type ClassPageData } from './class-pager.js';

const ROW_N = /^\{"N":(\d+)/;

/**
 * Computes a run. Class rows stream out page by page through `port` (`{page}` messages) as the
 * engine produces them, so the worker never holds the class table; the answer is the gzip of the
 * result without class rows. The port stays open: the server closes it once every page arrived.
 */
function runTask({ spec, port }: TaskInput<'run'>): TaskOutput<'run'> {
  port.postMessage({ started: Date.now() });
  const pager = new ClassPager((page) => port.postMessage({ page }));
  const { classes: _none, ...summary } = compute(spec, {
    onProgress: (p: Progress) => port.postMessage(p),
    // the cheap routes' result, kept by the executor if the class phase fails
    onPartial: (partial) => port.postMessage({ partial: gzipSync(JSON.stringify(partial)) }),
    onClassText: (text) => pager.add(Number(ROW_N.exec(text)?.[1] ?? -1), text),
    collectClasses: false,
  });
  pager.flush();
  const gzip = gzipSync(JSON.stringify(summary));
  return { gzip, classCounts: pager.counts, pages: pager.pages };
}

/** Splits the class rows out of a whole result's gzip into pages (for results built elsewhere). */
function pageResult({ gzip }: TaskInput<'pageResult'>): TaskOutput<'pageResult'> {
  const { classes = [], ...summary } = JSON.parse(gunzipSync(gzip).toString('utf8')) as {
    classes?: Array<{ N: number }>;
  };
  const pages: ClassPageData[] = [];
  const pager = new ClassPager((page) => pages.push(page));
  for (const row of classes) pager.add(row.N, JSON.stringify(row));
  pager.flush();
  return { gzip: gzipSync(JSON.stringify(summary)), pages };
}

/** Reads an uploaded table: content checks, rows, expression syntax, the normalization. */
function referenceTask(task: TaskInput<'reference'>): TaskOutput<'reference'> {
  const bytes = Buffer.from(task.bytes.buffer, task.bytes.byteOffset, task.bytes.byteLength);
  const parsed = parseReferenceFile(bytes, task.filename, task.contentType);
  parsed.normalization = (task.normalization ?? parsed.normalization ?? '1').trim() || '1';
  checkNormalization(
    parsed.normalization,
    task.variable ?? 'q',
    parsed.rows,
    parsed.numeric ?? false,
  );
  return { parsed };
}

/** One handler per task kind, typed by `TaskTypes`; each throws to refuse. */
const HANDLERS: { [K in TaskKind]: (input: TaskInput<K>) => TaskOutput<K> } = {
  run: runTask,
  sectorParts: sectorPartsTask,
  sectorAssemble: sectorAssembleTask,
  pageResult,
  preview: ({ spec }) => ({ result: compute(spec) }),
  estimate: ({ spec }) => ({ estimate: estimateRun(spec) }),
  probe: ({ spec, port }) => {
    // Says when the work begins, so the probe's clock leaves out a worker's start-up.
    port.postMessage({ started: Date.now() });
    compute(spec);
    return {};
  },
  verify: ({ snapshot }) => {
    const stored = JSON.parse(snapshot) as DatasetSnapshot;
    const fresh = compute(stored.spec, { collectClasses: true });
    return { mismatches: resultMismatches(stored.result, fresh) };
  },
  datasetSnapshot: snapshotTask,
  datasetExport: exportTask,
  lockDocument: lockDocumentTask,
  compare: (task) => ({
    rows: compareSeriesRows(task),
    impliedWeights: impliedWeightsOfRows(task),
  }),
  compareNumeric: (task) => ({ rows: compareReferenceRowsNumeric(task) }),
  productForm: (task) => ({ product: productTask(task) }),
  reference: referenceTask,
};

/**
 * The pool's entry point; runs in a worker thread, never on the server's main thread. Looks up
 * the task's handler (see `TaskTypes` for what each kind does) and answers its output with
 * `ok: true`, or the one refusal shape when the handler throws (`refusalOf`).
 */
export default function work<K extends TaskKind>(task: TaskMessage<K>): TaskResult<K> {
  const handler = HANDLERS[task.kind] as (input: TaskInput<K>) => TaskOutput<K>;
  try {
    return { ok: true, ...handler(task) };
  } catch (e) {
    return refusalOf(e);
  }
}
