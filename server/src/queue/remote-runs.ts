import { setTimeout as sleep } from 'node:timers/promises';
import { deserialize, serialize } from 'node:v8';
import { Queue, QueueEvents } from 'bullmq';
import { Redis } from 'ioredis';
import { runOnPool, type RunMessage } from '../runs/run-on-pool.js';
import { isSectorSpec } from '../runs/sector-runs.js';
import type { RunOutput, WorkerRefusal } from '../compute/tasks.js';
import { onlyForward, RemoteTaskPool, SECTOR_JOBS_PER_SHELL } from './remote-tasks.js';
import {
  BLOB_TTL_S,
  CANCEL_CHANNEL,
  CANCEL_TTL_S,
  cancelKey,
  decodeMessage,
  inputKey,
  RUN_QUEUE,
  TASK_JOB,
  type JobResult,
  type RunJobData,
  type RunJobOutcome,
  type TaskJobData,
  type WireMessage,
} from './wire.js';

/** How often the server looks at the state of a job it waits for. */
const POLL_MS = 250;

/** How far back the server's first read of the queue's event stream starts (see the constructor). */
const EVENT_REPLAY_MS = 60_000;

/** A finished job is kept this long in Redis, so a server that was down can still read it. */
const KEEP_S = 24 * 3600;

/**
 * The error a failed job gives the executor: a worker that ran out of memory says so with its
 * limit (`ERR_WORKER_OUT_OF_MEMORY`, as the embedded pool's error), anything else its reason.
 */
function workerFailure(reason: string | undefined): Error {
  const memory = /ran out of memory \(the limit is (\d+) MB/.exec(reason ?? '');
  if (memory) {
    return Object.assign(new Error(reason), {
      code: 'ERR_WORKER_OUT_OF_MEMORY',
      limitMb: Number(memory[1]),
    });
  }
  return new Error(`the worker failed: ${reason ?? 'the job left no result'}`);
}

/** A Redis connection as BullMQ needs it: commands wait while Redis is away instead of failing. */
export function redisConnection(url: string): Redis {
  const redis = new Redis(url, { maxRetriesPerRequest: null });
  // one line when Redis goes away (ioredis keeps reconnecting), not one per attempt
  let down = false;
  redis.on('error', (err: Error) => {
    if (!down) console.error(`Redis at ${new URL(url).host}: ${err.message}; reconnecting`);
    down = true;
  });
  redis.on('ready', () => (down = false));
  return redis;
}

/**
 * The server's side of queue mode: hands a run to the BullMQ queue as a job, relays the worker's
 * progress reports, and answers the worker's output once the job completed. SQLite stays the
 * system of record: the executor writes what this answers. A job that vanished from Redis (Redis
 * restarted without its data) is added again; aborting the signal marks the job cancelled,
 * tells the worker holding it (pub/sub) and takes it out of the queue when it still waits.
 */
export class RemoteRuns {
  private readonly connection: Redis;
  private readonly queue: Queue;
  private readonly events: QueueEvents;
  private readonly listeners = new Map<string, (m: WireMessage) => void>();
  private closed = false;

  constructor(
    url: string,
    /** Runs the server hands to the queue at once. */
    readonly slots: number,
    private readonly log: (err: unknown) => void = console.error,
  ) {
    this.connection = redisConnection(url);
    this.queue = new Queue(RUN_QUEUE, { connection: this.connection });
    // Read the event stream from a little before now, not from '$': the client is made on the
    // first run (lazyRemoteRuns) and a job added before its first read would lose its first
    // reports ('started' starts the wall-clock limit). Replayed events of older jobs find no
    // listener; the slack covers a clock difference between this machine and Redis's.
    this.events = new QueueEvents(RUN_QUEUE, {
      connection: redisConnection(url),
      lastEventId: `${Date.now() - EVENT_REPLAY_MS}-0`,
    });
    this.events.on('progress', ({ jobId, data }) =>
      this.listeners.get(jobId)?.(data as WireMessage),
    );
    this.queue.on('error', (err) => this.log(err));
    this.events.on('error', (err) => this.log(err));
  }

  /**
   * Runs `spec` as job `jobId` (the run id and its attempt: adding the same id twice is one job)
   * and answers its output once a worker finished it; every class-row page reaches `onMessage`
   * first. A sector sum is split instead: the walk stays here and each shell's sectors, the sum
   * and the paging go out as task jobs any worker may take (`RemoteTaskPool`), exactly as the
   * embedded pool spreads them over its threads. Rejects when `signal` aborts or a job failed.
   */
  async run(
    jobId: string,
    spec: unknown,
    signal: AbortSignal,
    onMessage: (m: RunMessage) => void,
  ): Promise<RunOutput | WorkerRefusal> {
    if (isSectorSpec(spec)) {
      const pool = new RemoteTaskPool(this, jobId);
      return runOnPool(pool, SECTOR_JOBS_PER_SHELL, spec, signal, onMessage);
    }
    const data: RunJobData = { runId: jobId, spec };
    // a retried job starts again from nothing: its progress must not go back
    const forward = onlyForward(onMessage);
    this.listeners.set(jobId, (m) => forward(decodeMessage(m)));
    try {
      await this.add('run', jobId, data);
      const { output, pages } = await this.outcome<RunJobOutcome>(
        jobId,
        () => this.add('run', jobId, data),
        signal,
      );
      for (const page of pages) onMessage({ page });
      return output.ok ? { ...output, pages: pages.length } : output;
    } finally {
      this.listeners.delete(jobId);
    }
  }

  /**
   * Runs one task of a split run as task job `jobId` and answers what the worker's pool
   * answered; its progress reports reach `onProgress`. The task travels as bytes in Redis.
   */
  async runTask(
    jobId: string,
    task: unknown,
    signal: AbortSignal,
    onProgress?: (m: WireMessage) => void,
  ): Promise<unknown> {
    const data: TaskJobData = { input: inputKey(jobId) };
    const put = async () => {
      await this.connection.set(data.input, serialize(task), 'EX', BLOB_TTL_S);
      await this.add(TASK_JOB, jobId, data);
    };
    if (onProgress) this.listeners.set(jobId, onProgress);
    try {
      await put();
      return await this.outcome<unknown>(jobId, put, signal);
    } finally {
      this.listeners.delete(jobId);
      this.connection.del(data.input).catch(() => {});
    }
  }

  private add(name: string, jobId: string, data: RunJobData | TaskJobData) {
    return this.queue.add(name, data, {
      jobId,
      // a job thrown off its worker (lock lost while Redis was away) runs again; a cancel does not
      attempts: 3,
      removeOnComplete: { age: KEEP_S },
      removeOnFail: { age: KEEP_S },
    });
  }

  /** Waits for job `jobId` and reads its outcome (the bytes its return value names) once. */
  private async outcome<T>(
    jobId: string,
    readd: () => Promise<unknown>,
    signal: AbortSignal,
  ): Promise<T> {
    for (;;) {
      if (this.closed) return new Promise(() => {}); // the server is stopping: SQLite keeps it
      if (signal.aborted) {
        this.cancel(jobId).catch((err: unknown) => this.log(err));
        throw signal.reason;
      }
      // the state first, then the job: a job read before it finished has no result yet
      const state = await this.queue.getJobState(jobId);
      if (state === 'unknown') {
        await readd(); // lost with Redis's data: queue it again
      } else if (state === 'completed' || state === 'failed') {
        const job = await this.queue.getJob(jobId);
        const key = (job?.returnvalue as JobResult | undefined)?.result;
        if (state === 'failed' || !key) throw workerFailure(job?.failedReason);
        const bytes = await this.connection.getBuffer(key);
        if (!bytes) throw workerFailure('its result was lost from Redis');
        await job!.remove().catch((err: unknown) => this.log(err));
        this.connection.del(key).catch(() => {});
        return deserialize(bytes) as T;
      }
      await sleep(POLL_MS, undefined, { signal }).catch(() => {});
    }
  }

  /** Marks job `jobId` cancelled, tells its worker, and removes it if it still waits. */
  private async cancel(jobId: string): Promise<void> {
    await this.connection.set(cancelKey(jobId), '1', 'EX', CANCEL_TTL_S);
    await this.connection.publish(CANCEL_CHANNEL, jobId);
    const job = await this.queue.getJob(jobId);
    // an active job is locked by its worker and cannot be removed: the cancel message stops it
    const state = job ? await job.getState() : 'gone';
    if (['waiting', 'delayed', 'prioritized'].includes(state)) await job!.remove().catch(() => {});
  }

  /** Stops waiting and closes the connections (runs stay `running` in SQLite for recovery). */
  async close(): Promise<void> {
    this.closed = true;
    await this.events.close();
    await this.queue.close();
    this.connection.disconnect();
  }
}
