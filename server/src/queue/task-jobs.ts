import { deserialize } from 'node:v8';
import { MessageChannel } from 'node:worker_threads';
import type { Job } from 'bullmq';
import { UnrecoverableError } from 'bullmq';
import type { Redis } from 'ioredis';
import type { TaskPool } from '../runs/sector-runs.js';
import { TASK_KINDS, type TaskJobData } from './wire.js';

/** The sum's progress goes to the queue at most this often. */
const REPORT_EVERY_MS = 250;

/**
 * A worker's side of a task job (one part of a split sector run): reads the task's bytes from
 * Redis, runs it on this process's pool exactly as the embedded executor would, and answers
 * what the pool answered. The sum reports its progress through a port: it goes out as job
 * progress. Only the parts of a sector run are taken (`TASK_KINDS`).
 */
export async function runTaskJob(
  pool: TaskPool,
  redis: Redis,
  job: Job<TaskJobData>,
  signal: AbortSignal,
  log: (err: unknown) => void,
): Promise<unknown> {
  const bytes = await redis.getBuffer(job.data.input);
  if (!bytes) throw new Error('the task was lost from Redis before a worker took it');
  const task = deserialize(bytes) as { kind: string };
  if (!(TASK_KINDS as readonly string[]).includes(task.kind)) {
    throw new UnrecoverableError(`a task job of kind "${task.kind}" is not taken`);
  }
  if (task.kind !== 'sectorAssemble') return pool.run(task, { signal });
  const channel = new MessageChannel();
  let reportedAt = 0;
  channel.port1.on('message', (m: unknown) => {
    const t = Date.now();
    if (t - reportedAt < REPORT_EVERY_MS) return;
    reportedAt = t;
    job.updateProgress(m as object).catch(log);
  });
  try {
    return await pool.run(
      { ...task, port: channel.port2 },
      { transferList: [channel.port2], signal },
    );
  } finally {
    channel.port1.close();
  }
}
