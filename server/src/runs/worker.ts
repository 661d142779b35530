import { gzipSync } from 'node:zlib';
import type { MessagePort } from 'node:worker_threads';
import { compute, EngineError, estimateRun, type Progress } from '@traceloom/shared/engine';
import {
  compareSeriesRows,
  compareReferenceRowsNumeric,
  type CompareTask,
  type NumericCompareTask,
} from '../comparisons/compare-rows.js';
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

/** A task for the worker pool. */
export type WorkerTask =
  | { kind: 'run'; spec: unknown; port: MessagePort }
  | { kind: 'preview'; spec: unknown }
  | SectorPartsTask
  | SectorAssembleTask
  | { kind: 'estimate'; spec: unknown }
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

/** A finished run: the gzip of the result JSON and the class rows per N. */
export interface RunOutput {
  ok: true;
  gzip: Uint8Array;
  classCounts: Record<string, number>;
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

function runTask(spec: unknown, port: MessagePort): RunOutput | WorkerRefusal {
  port.postMessage({ started: Date.now() });
  try {
    const result = compute(spec, {
      onProgress: (p: Progress) => port.postMessage(p),
      // the cheap routes' result, kept by the executor if the class phase fails
      onPartial: (partial) => port.postMessage({ partial: gzipSync(JSON.stringify(partial)) }),
      collectClasses: true,
    });
    const classCounts: Record<string, number> = {};
    for (const row of result.classes) classCounts[row.N] = (classCounts[row.N] ?? 0) + 1;
    const gzip = gzipSync(JSON.stringify(result));
    return { ok: true, gzip, classCounts };
  } catch (e) {
    return refusal(e);
  } finally {
    port.close();
  }
}

/**
 * The pool's entry point; runs in a worker thread, never on the server's main thread. `run`
 * computes a gas spec with progress sent through `port`; `preview` answers the result itself;
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
    case 'compare':
      try {
        return { ok: true, rows: compareSeriesRows(task) };
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
