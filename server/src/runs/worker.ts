import { gzipSync } from 'node:zlib';
import type { MessagePort } from 'node:worker_threads';
import { compute, EngineError, type Progress } from '@traceloom/shared/engine';
import { compareReferenceRows, type CompareTask } from '../comparisons/compare-rows.js';

/** A task for the worker pool. */
export type WorkerTask =
  | { kind: 'run'; spec: unknown; port: MessagePort }
  | { kind: 'preview'; spec: unknown }
  | ({ kind: 'compare' } & CompareTask);

/** The engine refused the input: a message for a person and the field it names. */
export interface WorkerRefusal {
  ok: false;
  message: string;
  field: string | undefined;
}

/** A finished run: the gzip of the result JSON and the class rows per N. */
export interface RunOutput {
  ok: true;
  gzip: Uint8Array;
  classCounts: Record<string, number>;
}

function refusal(e: unknown): WorkerRefusal {
  if (e instanceof EngineError) return { ok: false, message: e.message, field: e.field };
  throw e;
}

function runTask(spec: unknown, port: MessagePort): RunOutput | WorkerRefusal {
  port.postMessage({ started: Date.now() });
  try {
    const result = compute(spec, {
      onProgress: (p: Progress) => port.postMessage(p),
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
 * `compare` gives reference-row verdicts for a finished run.
 */
export default function work(task: WorkerTask): unknown {
  switch (task.kind) {
    case 'run':
      return runTask(task.spec, task.port);
    case 'preview':
      try {
        return { ok: true, result: compute(task.spec) };
      } catch (e) {
        return refusal(e);
      }
    case 'compare':
      try {
        return { ok: true, rows: compareReferenceRows(task) };
      } catch (e) {
        return refusal(e);
      }
  }
}
