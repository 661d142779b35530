import { setTimeout as sleep } from 'node:timers/promises';
import { Queue, QueueEvents } from 'bullmq';
import { Redis } from 'ioredis';
import type { ClassPageData } from '../runs/class-pager.js';
import type { RunMessage } from '../runs/run-on-pool.js';
import type { RunOutput, WorkerRefusal } from '../runs/worker.js';
import {
  CANCEL_CHANNEL,
  CANCEL_TTL_S,
  cancelKey,
  decodeMessage,
  decodeResult,
  RUN_QUEUE,
  type RunJobData,
  type WireMessage,
  type WireResult,
} from './wire.js';

/** How often the server looks at the state of a job it waits for. */
const POLL_MS = 250;

/** A finished job is kept this long in Redis, so a server that was down can still read it. */
const KEEP_S = 24 * 3600;

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
    this.events = new QueueEvents(RUN_QUEUE, { connection: redisConnection(url) });
    this.events.on('progress', ({ jobId, data }) =>
      this.listeners.get(jobId)?.(data as WireMessage),
    );
    this.queue.on('error', (err) => this.log(err));
    this.events.on('error', (err) => this.log(err));
  }

  /**
   * Runs `spec` as job `jobId` (the run id and its attempt: adding the same id twice is one job)
   * and answers its output once a worker finished it; every class-row page reaches `onMessage`
   * first. Rejects when `signal` aborts or the job failed on its worker.
   */
  async run(
    jobId: string,
    spec: unknown,
    signal: AbortSignal,
    onMessage: (m: RunMessage) => void,
  ): Promise<RunOutput | WorkerRefusal> {
    const data: RunJobData = { runId: jobId, spec };
    this.listeners.set(jobId, (m) => onMessage(decodeMessage(m)));
    try {
      await this.add(jobId, data);
      const { output, pages } = await this.finished(jobId, data, signal);
      for (const page of pages) onMessage({ page });
      return output.ok ? { ...output, pages: pages.length } : output;
    } finally {
      this.listeners.delete(jobId);
    }
  }

  private add(jobId: string, data: RunJobData) {
    return this.queue.add('run', data, {
      jobId,
      // a job thrown off its worker (lock lost while Redis was away) runs again; a cancel does not
      attempts: 3,
      removeOnComplete: { age: KEEP_S },
      removeOnFail: { age: KEEP_S },
    });
  }

  private async finished(
    jobId: string,
    data: RunJobData,
    signal: AbortSignal,
  ): Promise<{ output: RunOutput | WorkerRefusal; pages: ClassPageData[] }> {
    for (;;) {
      if (this.closed) return new Promise(() => {}); // the server is stopping: SQLite keeps it
      if (signal.aborted) {
        this.cancel(jobId).catch((err: unknown) => this.log(err));
        throw signal.reason;
      }
      // the state first, then the job: a job read before it finished has no result yet
      const state = await this.queue.getJobState(jobId);
      if (state === 'unknown') {
        await this.add(jobId, data); // lost with Redis's data: queue it again
      } else if (state === 'completed' || state === 'failed') {
        const job = await this.queue.getJob(jobId);
        if (state === 'failed' || !job?.returnvalue) {
          throw new Error(`the worker failed: ${job?.failedReason ?? 'the job left no result'}`);
        }
        const result = decodeResult(job.returnvalue as WireResult);
        await job.remove().catch((err: unknown) => this.log(err));
        return result;
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
