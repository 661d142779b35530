import { serialize } from 'node:v8';
import { UnrecoverableError, Worker, type Job } from 'bullmq';
import { createRunPool } from '../compute/pools.js';
import type { ClassPageData } from '../runs/class-pager.js';
import { runOnPool, type RunMessage } from '../runs/run-on-pool.js';
import { redisConnection } from './remote-runs.js';
import { runTaskJob } from './task-jobs.js';
import {
  BLOB_TTL_S,
  CANCEL_CHANNEL,
  cancelKey,
  encodeMessage,
  resultKey,
  RUN_QUEUE,
  TASK_JOB,
  type JobResult,
  type RunJobData,
  type RunJobOutcome,
  type TaskJobData,
} from './wire.js';

/** Progress reports go to the queue at most this often (starts and partial results always). */
const REPORT_EVERY_MS = 250;

/** What a worker process needs: where Redis is, its threads, its lock time, its heap limit. */
export interface WorkerSettings {
  url: string;
  threads: number;
  /** Job lock time; a dead worker's job is retried within about twice this. */
  lockMs: number;
  maxOldGenerationSizeMb: number;
}

/** A running queue worker. */
export interface QueueWorker {
  /** Finishes the jobs in hand (or, with `force`, leaves them to be retried) and stops. */
  close(force?: boolean): Promise<void>;
}

/**
 * Starts taking run jobs: each is computed on this process's own thread pool exactly as the
 * embedded executor does it (`runOnPool`), progress goes out as job progress, and the output with
 * its class-row pages is the job's return value. A cancel message for a job in hand aborts it
 * (its thread is terminated). A job whose worker died is found by the other workers' stalled
 * check (every `lockMs`) once its lock lapsed (`lockMs`), and taken again.
 */
export async function startQueueWorker(
  settings: WorkerSettings,
  log: (err: unknown) => void = console.error,
  onTaken: (jobId: string) => void = () => {},
): Promise<QueueWorker> {
  const pool = createRunPool(settings);
  const held = new Map<string, AbortController>();
  const plain = redisConnection(settings.url);
  const subscriber = redisConnection(settings.url);
  subscriber.on('message', (_channel: string, jobId: string) => held.get(jobId)?.abort());
  await subscriber.subscribe(CANCEL_CHANNEL);

  /** A whole run on this worker's pool: its output and class pages. */
  const runJob = async (job: Job<RunJobData>, signal: AbortSignal): Promise<RunJobOutcome> => {
    const pages: ClassPageData[] = [];
    let reportedAt = 0;
    const report = (m: RunMessage) => {
      if ('page' in m) return void pages.push(m.page);
      if (!('started' in m) && !('partial' in m)) {
        const t = Date.now();
        if (t - reportedAt < REPORT_EVERY_MS) return;
        reportedAt = t;
      }
      job.updateProgress(encodeMessage(m)).catch(log);
    };
    const output = await runOnPool(pool, settings.threads, job.data.spec, signal, report);
    return { output, pages };
  };

  const work = async (job: Job<RunJobData | TaskJobData>): Promise<JobResult> => {
    const jobId = job.id!;
    const controller = new AbortController();
    held.set(jobId, controller);
    onTaken(jobId);
    try {
      if (await plain.get(cancelKey(jobId)))
        throw new UnrecoverableError('aborted before it began');
      const outcome = await (
        job.name === TASK_JOB
          ? runTaskJob(pool, plain, job as Job<TaskJobData>, controller.signal, log)
          : runJob(job as Job<RunJobData>, controller.signal)
      ).catch((err: unknown) => {
        if (controller.signal.aborted) throw new UnrecoverableError('aborted by a cancel');
        if ((err as { code?: unknown }).code === 'ERR_WORKER_OUT_OF_MEMORY') {
          // not retried: another worker with the same limit would run out as well
          throw new UnrecoverableError(
            `ran out of memory (the limit is ${settings.maxOldGenerationSizeMb} MB per run on this worker, TRACELOOM_RUN_HEAP_MB)`,
          );
        }
        throw err;
      });
      // the outcome as bytes beside the job; the job's return value only names them
      const key = resultKey(jobId);
      await plain.set(key, serialize(outcome), 'EX', BLOB_TTL_S);
      return { result: key };
    } finally {
      held.delete(jobId);
    }
  };
  const worker = new Worker<RunJobData | TaskJobData, JobResult>(RUN_QUEUE, work, {
    connection: redisConnection(settings.url),
    concurrency: settings.threads,
    lockDuration: settings.lockMs,
    stalledInterval: settings.lockMs,
    maxStalledCount: 3,
  });
  worker.on('error', log);
  await worker.waitUntilReady();
  return {
    async close(force = false) {
      await worker.close(force);
      await pool.destroy();
      subscriber.disconnect();
      plain.disconnect();
    },
  };
}
