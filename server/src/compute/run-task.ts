import type { Transferable } from 'node:worker_threads';
import type { Piscina } from 'piscina';
import { AppError } from '../http/app-error.js';
import type { PoolName, WorkerPools } from './pools.js';
import { specRefusal } from './refusal.js';
import type {
  TaskInput,
  TaskKind,
  TaskMessage,
  TaskOutput,
  TaskResult,
  WorkerRefusal,
} from './tasks.js';

/** The pool each kind runs on: computations as heavy as a run get a run thread. */
export const POOL_OF: Readonly<Record<TaskKind, PoolName>> = {
  run: 'runs',
  sectorParts: 'runs',
  sectorAssemble: 'runs',
  pageResult: 'runs',
  verify: 'runs',
  datasetSnapshot: 'runs',
  datasetExport: 'runs',
  lockDocument: 'runs',
  compareNumeric: 'runs',
  preview: 'quick',
  estimate: 'quick',
  compare: 'quick',
  productForm: 'quick',
  reference: 'quick',
  probe: 'probe',
};

/** How one task is bounded and how its failures read. */
export interface TaskOptions {
  /** Wall-clock limit: at it the task is aborted (its worker terminated) and `onTimeout` thrown. */
  timeoutMs?: number;
  /** The error for the wall-clock limit (default 422 `too_heavy`). */
  onTimeout?: () => AppError;
  /** The caller's abort (a client that left, a cancelled job): the worker is terminated. */
  signal?: AbortSignal;
  /** Ports handed to the worker with the input. */
  transferList?: Transferable[];
  /** The error for a refusal (default `refusalError`). */
  refused?: (refusal: WorkerRefusal) => AppError;
  /** The error when the worker ran out of its heap (default 422 `cannot_compute`). */
  outOfMemory?: () => AppError;
}

/**
 * The API error for a worker's refusal: an API error raised in the worker keeps its status and
 * code; an engine refusal is 400 `invalid_spec` naming the field (`specRefusal`).
 */
export function refusalError(refusal: WorkerRefusal): AppError {
  if (refusal.status !== undefined && refusal.code !== undefined) {
    return new AppError(refusal.status, refusal.code, refusal.message, refusal.field);
  }
  return specRefusal(refusal);
}

/**
 * One task on `pool`, typed by its kind: the answer is its output or the refusal. Aborting
 * `signal` terminates the task's worker and rejects. The run path (embedded executor and queue
 * worker process, which hold their pool themselves) calls this directly; everything else goes
 * through `TaskRunner.runTask`.
 */
export async function poolTask<K extends TaskKind>(
  pool: Pick<Piscina, 'run'>,
  kind: K,
  input: TaskInput<K>,
  options: { signal?: AbortSignal; transferList?: Transferable[] } = {},
): Promise<TaskResult<K>> {
  const message = { kind, ...input } as TaskMessage<K>;
  return (await pool.run(message, options as Parameters<Piscina['run']>[1])) as TaskResult<K>;
}

/** Runs tasks on the app's pools; owns their abort, wall-clock limit and error mapping. */
export class TaskRunner {
  /** `heapMb`: each pool's heap limit per thread, named in an out-of-memory message. */
  constructor(
    private readonly pools: Pick<WorkerPools, PoolName>,
    private readonly heapMb: Partial<Record<PoolName, number>> = {},
  ) {}

  /**
   * Runs a task of `kind` on its pool (`POOL_OF`) and answers its output; throws the API error
   * for a refusal, the wall-clock limit, a worker out of memory, or the caller's abort.
   */
  async runTask<K extends TaskKind>(
    kind: K,
    input: TaskInput<K>,
    options: TaskOptions = {},
  ): Promise<TaskOutput<K>> {
    const answer = await this.attempt(kind, input, options);
    if (!answer.ok) throw (options.refused ?? refusalError)(answer);
    return answer;
  }

  /** As `runTask`, but a refusal is answered (not thrown) for callers that record it. */
  async attempt<K extends TaskKind>(
    kind: K,
    input: TaskInput<K>,
    options: TaskOptions = {},
  ): Promise<TaskResult<K>> {
    const poolName = POOL_OF[kind];
    const pool = this.pools[poolName];
    const controller = new AbortController();
    const { signal, timeoutMs } = options;
    let timer: NodeJS.Timeout | undefined;
    let cancel = () => {};
    const stopped = new Promise<never>((_, reject) => {
      cancel = () => {
        reject(cancelled(signal?.reason));
        controller.abort();
      };
      if (timeoutMs !== undefined) {
        timer = setTimeout(() => {
          reject(options.onTimeout?.() ?? tooHeavy(timeoutMs));
          controller.abort();
        }, timeoutMs);
      }
    });
    stopped.catch(() => undefined);
    if (signal?.aborted) cancel();
    signal?.addEventListener('abort', cancel, { once: true });
    const work = poolTask(pool, kind, input, {
      signal: controller.signal,
      ...(options.transferList && { transferList: options.transferList }),
    });
    work.catch(() => undefined);
    try {
      return await Promise.race([work, stopped]);
    } catch (err) {
      if ((err as { code?: unknown }).code === 'ERR_WORKER_OUT_OF_MEMORY') {
        throw options.outOfMemory?.() ?? outOfMemory(this.heapMb[poolName]);
      }
      throw err;
    } finally {
      clearTimeout(timer);
      signal?.removeEventListener('abort', cancel);
    }
  }
}

function tooHeavy(ms: number): AppError {
  return new AppError(422, 'too_heavy', `This took longer than its limit of ${ms / 1000} s.`);
}

/**
 * The error for a worker that hit its heap limit (`ERR_WORKER_OUT_OF_MEMORY`): says so, names
 * the limit when it is known and what to ask for less of.
 */
export function outOfMemory(limitMb?: number): AppError {
  const limit =
    limitMb === undefined ? '' : ` (the limit is ${limitMb} MB per task on this server)`;
  return new AppError(
    422,
    'cannot_compute',
    `The computation ran out of memory${limit}: ask for less — a smaller N_max, a lower order, ` +
      'a smaller class table or fewer rows.',
  );
}

function cancelled(reason: unknown): AppError {
  if (reason instanceof AppError) return reason;
  return new AppError(503, 'cancelled', 'The request was cancelled before it finished.');
}
