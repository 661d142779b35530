import type { DatasetSnapshot } from '@traceloom/shared/api';
import { gunzipSync, gzipSync } from 'node:zlib';
import type { MessagePort } from 'node:worker_threads';
import { compute, EngineError, estimateRun, type Progress } from '@traceloom/shared/engine';
import {
  compareSeriesRows,
  impliedWeightsOfRows,
  compareReferenceRowsNumeric,
  type CompareTask,
  type NumericCompareTask,
} from '../comparisons/compare-rows.js';
import { resultMismatches } from '../datasets/result-compare.js';
import { snapshotTask, type SnapshotTask } from '../datasets/dataset-view.js';
import { AppError } from '../http/app-error.js';
import { productTask, type ProductTask } from '../products/product-task.js';
import { checkNormalization } from '../references/normalization-check.js';
import { parseReferenceFile } from '../references/reference-parse.js';
import {
  sectorAssembleTask,
  sectorPartsTask,
  type SectorAssembleTask,
  type SectorPartsTask,
} from './sector-tasks.js';
import { ClassPager, type ClassPageData } from './class-pager.js';

/** A task for the worker pool. */
export type WorkerTask =
  | { kind: 'run'; spec: unknown; port: MessagePort }
  | { kind: 'preview'; spec: unknown }
  | SectorPartsTask
  | SectorAssembleTask
  | SnapshotTask
  | { kind: 'estimate'; spec: unknown }
  | { kind: 'probe'; spec: unknown; port: MessagePort }
  | { kind: 'verify'; snapshot: string }
  | { kind: 'pageResult'; gzip: Uint8Array }
  | ({ kind: 'compare' } & CompareTask)
  | ({ kind: 'compareNumeric' } & NumericCompareTask)
  | ({ kind: 'productForm' } & ProductTask)
  | {
      kind: 'reference';
      bytes: Uint8Array;
      filename: string;
      contentType: string;
      normalization?: string;
      variable?: string;
    };

/** An API error raised in the worker, carried back as plain data. */
export interface WorkerAppError {
  ok: false;
  appError: { status: number; code: string; message: string; field: string | undefined };
}

/**
 * The engine refused the input: a message for a person and the field it names. `internal` marks
 * an engine failure that is not a refusal (a bug met on this input), reported without its stack.
 */
export interface WorkerRefusal {
  ok: false;
  message: string;
  field: string | undefined;
  internal?: boolean;
}

/** A finished run: the gzip of the result JSON without class rows, and the class rows per N. */
export interface RunOutput {
  ok: true;
  gzip: Uint8Array;
  classCounts: Record<string, number>;
  /** Class-row pages sent through the port; absent when the rows are still in `gzip`. */
  pages?: number;
}

function refusal(e: unknown): WorkerRefusal {
  if (e instanceof EngineError) return { ok: false, message: e.message, field: e.field };
  const what = e instanceof Error ? `${e.name}: ${e.message}` : String(e);
  return {
    ok: false,
    message: `the engine failed on this input (${what.slice(0, 200)})`,
    field: undefined,
    internal: true,
  };
}

const ROW_N = /^\{"N":(\d+)/;

/**
 * Computes a run. Class rows stream out page by page through `port` (`{page}` messages) as the
 * engine produces them, so the worker never holds the class table; the answer is the gzip of the
 * result without class rows. The port stays open: the server closes it once every page arrived.
 */
function runTask(spec: unknown, port: MessagePort): RunOutput | WorkerRefusal {
  port.postMessage({ started: Date.now() });
  const pager = new ClassPager((page) => port.postMessage({ page }));
  try {
    const { classes: _none, ...summary } = compute(spec, {
      onProgress: (p: Progress) => port.postMessage(p),
      // the cheap routes' result, kept by the executor if the class phase fails
      onPartial: (partial) => port.postMessage({ partial: gzipSync(JSON.stringify(partial)) }),
      onClassText: (text) => pager.add(Number(ROW_N.exec(text)?.[1] ?? -1), text),
      collectClasses: false,
    });
    pager.flush();
    const gzip = gzipSync(JSON.stringify(summary));
    return { ok: true, gzip, classCounts: pager.counts, pages: pager.pages };
  } catch (e) {
    return refusal(e);
  }
}

/** Splits the class rows out of a whole result's gzip into pages (for results built elsewhere). */
function pageResult(gzip: Uint8Array): { gzip: Uint8Array; pages: ClassPageData[] } {
  const { classes = [], ...summary } = JSON.parse(gunzipSync(gzip).toString('utf8')) as {
    classes?: Array<{ N: number }>;
  };
  const pages: ClassPageData[] = [];
  const pager = new ClassPager((page) => pages.push(page));
  for (const row of classes) pager.add(row.N, JSON.stringify(row));
  pager.flush();
  return { gzip: gzipSync(JSON.stringify(summary)), pages };
}

/**
 * The pool's entry point; runs in a worker thread, never on the server's main thread. `run`
 * computes a gas spec with progress sent through `port`; `preview` answers the result itself;
 * `pageResult` splits a whole result's class rows into pages; `probe` evaluates a cut-down spec before a gas is stored (saying through `port` when it
 * begins); `verify` parses a dataset snapshot, computes its spec again and lists the differences;
 * `compare` gives reference-row verdicts for a finished run (`compareNumeric`: a numeric run,
 * within tolerance); `productForm` writes one series or the grand function as a product;
 * `reference` reads an uploaded
 * table (content checks, rows, expression syntax).
 */
export default function work(task: WorkerTask): unknown {
  switch (task.kind) {
    case 'run':
      return runTask(task.spec, task.port);
    case 'sectorParts':
      try {
        return sectorPartsTask(task);
      } catch (e) {
        return refusal(e);
      }
    case 'sectorAssemble':
      try {
        return sectorAssembleTask(task);
      } catch (e) {
        return refusal(e);
      }
    case 'preview':
      try {
        return { ok: true, result: compute(task.spec) };
      } catch (e) {
        return refusal(e);
      }
    case 'estimate':
      try {
        return { ok: true, estimate: estimateRun(task.spec) };
      } catch (e) {
        return refusal(e);
      }
    case 'probe':
      // Says when the work begins, so the probe's clock leaves out a worker's start-up.
      task.port.postMessage({ started: Date.now() });
      try {
        compute(task.spec);
        return { ok: true };
      } catch (e) {
        return refusal(e);
      }
    case 'pageResult':
      return pageResult(task.gzip);
    case 'datasetSnapshot':
      return snapshotTask(task);
    case 'verify':
      try {
        const snapshot = JSON.parse(task.snapshot) as DatasetSnapshot;
        const fresh = compute(snapshot.spec, { collectClasses: true });
        return { ok: true, mismatches: resultMismatches(snapshot.result, fresh) };
      } catch (e) {
        return refusal(e);
      }
    case 'compare':
      try {
        return {
          ok: true,
          rows: compareSeriesRows(task),
          impliedWeights: impliedWeightsOfRows(task),
        };
      } catch (e) {
        return refusal(e);
      }
    case 'compareNumeric':
      try {
        return { ok: true, rows: compareReferenceRowsNumeric(task) };
      } catch (e) {
        return refusal(e);
      }
    case 'productForm':
      try {
        return { ok: true, product: productTask(task) };
      } catch (e) {
        return refusal(e);
      }
    case 'reference':
      try {
        const bytes = Buffer.from(task.bytes.buffer, task.bytes.byteOffset, task.bytes.byteLength);
        const parsed = parseReferenceFile(bytes, task.filename, task.contentType);
        parsed.normalization = (task.normalization ?? parsed.normalization ?? '1').trim() || '1';
        checkNormalization(
          parsed.normalization,
          task.variable ?? 'q',
          parsed.rows,
          parsed.numeric ?? false,
        );
        return { ok: true, parsed };
      } catch (e) {
        if (!(e instanceof AppError)) throw e;
        const { status, code, message, field } = e;
        return { ok: false, appError: { status, code, message, field } } satisfies WorkerAppError;
      }
  }
}
