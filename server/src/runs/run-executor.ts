import { gunzipSync, gzipSync } from 'node:zlib';
import type { ComputeResult, Progress } from '@traceloom/shared/engine';
import type { DataSource } from 'typeorm';
import { recordAudit } from '../audit/record-audit.js';
import type { WorkerPools } from '../compute/pools.js';
import type { RunLimits } from '../config.js';
import { Run, type RunStatus } from '../db/entities/index.js';
import { runOnPool, type RunMessage } from './run-on-pool.js';
import { dropClassPages, storeClassPage } from './class-pages.js';
import type { RunQueue } from '../queue/lazy-remote.js';

/** Stored progress is written at most this often (the live value is kept in memory). */
const STORE_EVERY_MS = 250;

/** Time a worker may take to start (load the engine) before its run's clock starts. */
const START_GRACE_MS = 60_000;

/**
 * The cheap routes' result of a run whose class phase failed, marked incomplete with the reason,
 * so the canonical table that was finished is kept (gzip of the result JSON).
 */
function keptPartial(gzip: Uint8Array, progress: Progress | null, error: string): Buffer {
  const partial = JSON.parse(gunzipSync(gzip).toString('utf8')) as ComputeResult;
  const where =
    progress?.phase === 'classSum' && progress.total > 0
      ? ` after ${progress.done.toLocaleString('en-US')} of ${progress.total.toLocaleString('en-US')} ${progress.unit ?? 'steps'}`
      : '';
  partial.incomplete = { phase: 'classSum', reason: `the class table ${error}${where}` };
  return gzipSync(JSON.stringify(partial));
}

/** Reason recorded when a run that was running is found after a restart it was retried for. */
export const INTERRUPTED = 'interrupted by a server restart';

/** Work that is not a stored run but shares the run threads, their queue and the per-user cap. */
interface Job {
  /** Starts the work on a run thread; aborting `signal` must stop it. */
  start(signal: AbortSignal): Promise<void>;
  /** Called when the job leaves the queue without starting (cancelled, or the executor stopped). */
  drop(reason: Error): void;
}

/** One place in line: a stored run, or a job. */
interface Queued {
  runId: string;
  userId: string;
  job?: Job;
}

interface ActiveRun {
  userId: string;
  controller: AbortController;
  progress: Progress | null;
  storedAt: number;
  stop: 'cancel' | 'timeout' | null;
  /** The gzip of the result without the class table, once the cheap routes are done. */
  partial: Uint8Array | null;
}

/**
 * Runs queued runs on the worker pool (or hands them to the job queue in queue mode, see
 * ../queue/README.md), at most `threads` (queue: `slots`) at once, sharing them fairly:
 * one person's runs never hold more than `threads - 1` of them (at least one), and a free thread
 * goes to the oldest run of whoever has the fewest running.
 * Enforces the wall-clock limit by aborting the task (piscina terminates the worker), keeps live
 * progress in memory and stores it at most every 250 ms, and on start re-queues runs a restart
 * interrupted (once; a second interruption fails them with a reason).
 */
export class RunExecutor {
  /** Queued runs and jobs in arrival order, with the person who queued each. */
  private readonly queue: Queued[] = [];
  private jobCount = 0;
  private readonly active = new Map<string, ActiveRun>();
  private stopped = false;
  private readonly endListeners: Array<
    (runId: string, status: RunStatus, error: string | null) => void
  > = [];
  /** Resolves once restart recovery has run. */
  readonly ready: Promise<void>;

  constructor(
    private readonly dataSource: DataSource,
    private readonly pools: WorkerPools,
    private readonly limits: RunLimits,
    private readonly log: (err: unknown) => void = console.error,
    /** The job queue runs go to instead of the pool (`TRACELOOM_QUEUE_URL`), or null. */
    private readonly remote: RunQueue | null = null,
  ) {
    this.ready = this.recover().catch((err: unknown) => this.log(err));
  }

  /** Puts a freshly stored queued run of `userId` in line. */
  enqueue(runId: string, userId: string): void {
    this.queue.push({ runId, userId });
    this.pump();
  }

  /**
   * Runs `work` on a run thread as one of `userId`'s runs: in the same line, fair share and
   * thread count as stored runs (it counts in `jobsOf`). Aborting `signal` takes it out of the
   * line, or aborts the signal `work` got when it is running; the promise then rejects with the
   * signal's reason.
   */
  submit<T>(
    userId: string,
    work: (signal: AbortSignal) => Promise<T>,
    signal?: AbortSignal,
  ): Promise<T> {
    return new Promise<T>((resolve, reject) => {
      if (this.stopped) return reject(new Error('the run executor has stopped'));
      const runId = `job-${++this.jobCount}`;
      const reason = () =>
        signal?.reason instanceof Error ? signal.reason : new Error('cancelled');
      const job: Job = {
        start: async (jobSignal) => {
          signal?.removeEventListener('abort', leave);
          if (signal?.aborted) return reject(reason());
          const stop = () => this.active.get(runId)?.controller.abort(reason());
          signal?.addEventListener('abort', stop, { once: true });
          try {
            resolve(await work(jobSignal));
          } catch (err) {
            reject(err);
          } finally {
            signal?.removeEventListener('abort', stop);
          }
        },
        drop: reject,
      };
      const leave = () => {
        const index = this.queue.findIndex((q) => q.runId === runId);
        if (index >= 0) this.queue.splice(index, 1);
        job.drop(reason());
      };
      signal?.addEventListener('abort', leave, { once: true });
      this.queue.push({ runId, userId, job });
      this.pump();
    });
  }

  /** Jobs of `userId` queued or running now (they count against the per-user cap with runs). */
  jobsOf(userId: string): number {
    let n = 0;
    for (const q of this.queue) if (q.job && q.userId === userId) n += 1;
    for (const [id, a] of this.active) if (id.startsWith('job-') && a.userId === userId) n += 1;
    return n;
  }

  /** Jobs in line and on a thread now (for tests and the health of the queue). */
  jobCounts(): { queued: number; running: number } {
    const queued = this.queue.filter((q) => q.job).length;
    const running = [...this.active.keys()].filter((id) => id.startsWith('job-')).length;
    return { queued, running };
  }

  /** Worker threads one person's runs may hold at once: always one fewer than there are. */
  get threadsPerUser(): number {
    return Math.max(1, this.capacity - 1);
  }

  /** Runs held at once: the pool's threads, or the queue's slots in queue mode. */
  private get capacity(): number {
    return this.remote?.slots ?? this.limits.threads;
  }

  /** The live progress of a running run, or null when it is not running here. */
  progressOf(runId: string): Progress | null {
    return this.active.get(runId)?.progress ?? null;
  }

  /**
   * Where a run is while this executor holds it (`queued` in line, `running` on a worker, with
   * its live progress), or null once it left (finished, cancelled, or never here).
   */
  stateOf(runId: string): {
    status: 'queued' | 'running';
    done: number;
    total: number;
    phase: string;
    unit?: string;
  } | null {
    const active = this.active.get(runId);
    if (active) {
      const p = active.progress;
      return {
        status: 'running',
        done: p?.done ?? 0,
        total: p?.total ?? 0,
        phase: p?.phase ?? '',
        ...(p?.unit && { unit: p.unit }),
      };
    }
    const queued = this.queue.some((q) => q.runId === runId && !q.job);
    return queued ? { status: 'queued', done: 0, total: 0, phase: '' } : null;
  }

  /** Calls `listener` whenever a run leaves the executor, after its final status is stored. */
  onEnd(listener: (runId: string, status: RunStatus, error: string | null) => void): void {
    this.endListeners.push(listener);
  }

  private ended(runId: string, status: RunStatus, error: string | null): void {
    for (const listener of this.endListeners) listener(runId, status, error);
  }

  /** Takes a run out of the queue, or stops its worker when it is running. */
  cancel(runId: string): void {
    const index = this.queue.findIndex((q) => q.runId === runId);
    if (index >= 0) {
      this.queue.splice(index, 1);
      this.ended(runId, 'cancelled', null);
    }
    const run = this.active.get(runId);
    if (run) {
      run.stop = 'cancel';
      run.controller.abort();
    }
  }

  /** Stops taking work and terminates the pools (running runs stay `running` for recovery). */
  async stop(): Promise<void> {
    this.stopped = true;
    for (const q of this.queue.splice(0)) q.job?.drop(new Error('the run executor has stopped'));
    for (const [id, a] of this.active) if (id.startsWith('job-')) a.controller.abort();
    await this.ready;
    await this.remote?.close();
    await this.pools.destroy();
  }

  private async recover(): Promise<void> {
    const now = new Date().toISOString();
    await this.dataSource.transaction(async (manager) => {
      const interrupted = await manager.getRepository(Run).find({
        where: { status: 'running' },
        relations: { createdBy: true },
      });
      for (const run of interrupted) {
        const retry = run.requeues < 1;
        await manager
          .getRepository(Run)
          .update(
            { id: run.id },
            retry
              ? { status: 'queued', requeues: run.requeues + 1, startedAt: null, progressDone: 0 }
              : { status: 'failed', error: INTERRUPTED, finishedAt: now },
          );
        await recordAudit(manager, {
          actorId: run.createdBy.id,
          action: retry ? 'run.requeue' : 'run.fail',
          targetType: 'run',
          targetId: run.id,
          detail: { reason: INTERRUPTED, automatic: true },
        });
      }
    });
    const queued = await this.dataSource.getRepository(Run).find({
      where: { status: 'queued' },
      select: { id: true, createdBy: { id: true } },
      relations: { createdBy: true },
      order: { createdAt: 'ASC' },
    });
    for (const { id, createdBy } of queued) {
      if (!this.queue.some((q) => q.runId === id))
        this.queue.push({ runId: id, userId: createdBy.id });
    }
    this.pump();
  }

  /**
   * Fair share: the next run is the oldest queued run of the person with the fewest runs on a
   * thread now, among those below `threadsPerUser`; null when nobody may start one.
   */
  private next(): Queued | null {
    const running = new Map<string, number>();
    for (const { userId } of this.active.values())
      running.set(userId, (running.get(userId) ?? 0) + 1);
    let best = -1;
    for (let i = 0; i < this.queue.length; i++) {
      const n = running.get(this.queue[i]!.userId) ?? 0;
      if (n >= this.threadsPerUser) continue;
      if (best < 0 || n < (running.get(this.queue[best]!.userId) ?? 0)) best = i;
    }
    return best < 0 ? null : this.queue.splice(best, 1)[0]!;
  }

  private pump(): void {
    while (!this.stopped && this.active.size < this.capacity) {
      const picked = this.next();
      if (!picked) break;
      const { runId, userId, job } = picked;
      const run: ActiveRun = {
        userId,
        controller: new AbortController(),
        progress: null,
        storedAt: 0,
        stop: null,
        partial: null,
      };
      this.active.set(runId, run);
      const work = job ? job.start(run.controller.signal) : this.execute(runId, run);
      work
        .catch((err: unknown) => this.log(err))
        .finally(() => {
          this.active.delete(runId);
          this.pump();
        });
    }
  }

  private async execute(runId: string, active: ActiveRun): Promise<void> {
    const repo = this.dataSource.getRepository(Run);
    const run = await repo.findOne({
      where: { id: runId },
      relations: { gasVersion: true, createdBy: true },
    });
    if (!run || run.status !== 'queued') return;
    const claimed = await this.update(
      { id: runId, status: 'queued' },
      { status: 'running', startedAt: new Date().toISOString(), error: null },
    );
    if (!claimed.affected) return;
    await this.dataSource.transaction((manager) => dropClassPages(manager, runId));
    // Class rows arrive page by page while the worker computes; each is stored as it comes.
    let pageWrites: Promise<unknown> = Promise.resolve();
    let startedAt = new Date();
    const limit = () => {
      active.stop = 'timeout';
      active.controller.abort();
    };
    // Until the worker says it has begun (a fresh worker first loads the engine), only a
    // generous start-up limit applies; the run's own wall-clock limit starts with the work.
    // In queue mode a run may wait in Redis for a free worker: its clock starts with the work.
    let timer = this.remote
      ? undefined
      : setTimeout(limit, this.limits.wallClockMs + START_GRACE_MS);
    const onMessage = (p: RunMessage): void => {
      if ('partial' in p) {
        active.partial = p.partial;
        return;
      }
      if ('page' in p) {
        const page = p.page;
        pageWrites = pageWrites.then(() =>
          this.dataSource.transaction((manager) => storeClassPage(manager, runId, page)),
        );
        return;
      }
      if ('started' in p) {
        clearTimeout(timer);
        timer = setTimeout(limit, this.limits.wallClockMs);
        startedAt = new Date();
        this.update({ id: runId, status: 'running' }, { startedAt: startedAt.toISOString() }).catch(
          (err: unknown) => this.log(err),
        );
        return;
      }
      active.progress = p;
      const t = Date.now();
      if (t - active.storedAt < STORE_EVERY_MS) return;
      active.storedAt = t;
      this.update(
        { id: runId, status: 'running' },
        { progressDone: p.done, progressTotal: p.total, progressPhase: p.phase },
      ).catch((err: unknown) => this.log(err));
    };
    let outcome: Partial<Run> & { status: RunStatus };
    try {
      const spec: unknown = JSON.parse(run.gasVersion.spec);
      const signal = active.controller.signal;
      const output = this.remote
        ? await this.remote.run(`${runId}-a${run.requeues}`, spec, signal, onMessage)
        : await runOnPool(this.pools.runs, this.limits.threads, spec, signal, onMessage);
      outcome = output.ok
        ? {
            status: 'done',
            result: Buffer.from(output.gzip),
            classCounts: JSON.stringify(output.classCounts),
            progressDone: active.progress?.total ?? 0,
            progressTotal: active.progress?.total ?? 0,
            progressPhase: 'done',
          }
        : {
            status: 'failed',
            error: output.field ? `${output.field}: ${output.message}` : output.message,
          };
    } catch (err) {
      outcome = this.stoppedOutcome(active, err);
    } finally {
      clearTimeout(timer);
    }
    try {
      await pageWrites;
    } catch (err) {
      this.log(err);
      outcome = { status: 'failed', error: 'the class table could not be stored' };
    }
    if (outcome.status !== 'done') {
      await this.dataSource.transaction((manager) => dropClassPages(manager, runId));
    }
    if (outcome.status === 'cancelled') return this.ended(runId, 'cancelled', null); // stored by the cancel
    if (outcome.status === 'failed' && active.partial) {
      outcome.result = keptPartial(active.partial, active.progress, outcome.error ?? 'failed');
    }
    const finishedAt = new Date();
    await this.dataSource.transaction(async (manager) => {
      const done = await manager.getRepository(Run).update(
        { id: runId, status: 'running' },
        {
          ...outcome,
          finishedAt: finishedAt.toISOString(),
          durationMs: finishedAt.getTime() - startedAt.getTime(),
        },
      );
      if (!done.affected) return;
      await recordAudit(manager, {
        actorId: run.createdBy.id,
        action: outcome.status === 'done' ? 'run.finish' : 'run.fail',
        targetType: 'run',
        targetId: runId,
        detail: { status: outcome.status, error: outcome.error ?? null, automatic: true },
      });
    });
    this.ended(runId, outcome.status, outcome.error ?? null);
  }

  /** One conditional update of a run, in its own (serialized) transaction. */
  private update(where: { id: string; status: RunStatus }, changes: Partial<Run>) {
    return this.dataSource.transaction((manager) =>
      manager.getRepository(Run).update(where, changes),
    );
  }

  private stoppedOutcome(active: ActiveRun, err: unknown): Partial<Run> & { status: RunStatus } {
    if (active.stop === 'cancel') return { status: 'cancelled' };
    if (active.stop === 'timeout') {
      const seconds = this.limits.wallClockMs / 1000;
      return {
        status: 'failed',
        error: `stopped after the wall-clock limit of ${seconds} s for one run`,
      };
    }
    const code = (err as { code?: unknown }).code;
    if (code === 'ERR_WORKER_OUT_OF_MEMORY') {
      // a queue worker names its own limit
      const mb = (err as { limitMb?: number }).limitMb ?? this.limits.maxOldGenerationSizeMb;
      return { status: 'failed', error: `ran out of memory (the limit is ${mb} MB per run)` };
    }
    this.log(err);
    return { status: 'failed', error: 'the computation stopped unexpectedly' };
  }
}
