import type { ClassPageData } from '../runs/class-pager.js';
import type { RunMessage } from '../runs/run-on-pool.js';
import type { RunOutput, WorkerRefusal } from '../compute/tasks.js';

/** The BullMQ queue every run job goes through. */
export const RUN_QUEUE = 'traceloom-runs';

/** Redis pub/sub channel a cancel travels on (message: the job id). */
export const CANCEL_CHANNEL = 'traceloom:cancel';

/** Key set for a cancelled job, so a worker that takes it later (a retry) drops it at once. */
export const cancelKey = (jobId: string) => `traceloom:cancelled:${jobId}`;

/** How long a cancel mark is kept, in seconds. */
export const CANCEL_TTL_S = 24 * 3600;

/** A run job's data: the stored spec of the run's gas version. */
export interface RunJobData {
  runId: string;
  spec: unknown;
}

/** A progress report on the queue: a run message with its bytes as base64. */
export type WireMessage =
  Exclude<RunMessage, { partial: Uint8Array } | { page: ClassPageData }> | { partial: string };

/** A run job's outcome, as the blob its return value names: the output and its class pages. */
export interface RunJobOutcome {
  output: RunOutput | WorkerRefusal;
  pages: ClassPageData[];
}

/**
 * Every job's return value: the Redis key of its outcome, written as bytes (v8 serialization,
 * which keeps BigInts and byte arrays) beside the job, so no result travels as base64 or JSON.
 */
export interface JobResult {
  result: string;
}

/** Name of the jobs that carry one task of a split run (a shell's sectors, the sum, the paging). */
export const TASK_JOB = 'task';

/** Tasks a worker takes as task jobs: the parts of a sector run. */
export const TASK_KINDS = ['sectorParts', 'sectorAssemble', 'pageResult'] as const;

/** A task job's data: the Redis key of its task (bytes, as the outcome). */
export interface TaskJobData {
  input: string;
}

/** Where a job's outcome and a task job's input are kept, and for how long (seconds). */
export const resultKey = (jobId: string) => `traceloom:result:${jobId}`;
export const inputKey = (jobId: string) => `traceloom:input:${jobId}`;
export const BLOB_TTL_S = 24 * 3600;

const b64 = (bytes: Uint8Array) => Buffer.from(bytes).toString('base64');
const bytes = (text: string) => new Uint8Array(Buffer.from(text, 'base64'));

/** A run message as a job progress report, or back. */
export function encodeMessage(m: Exclude<RunMessage, { page: ClassPageData }>): WireMessage {
  return 'partial' in m ? { partial: b64(m.partial) } : m;
}

/** The run message a job progress report carries. */
export function decodeMessage(m: WireMessage): RunMessage {
  return 'partial' in m ? { partial: bytes(m.partial) } : m;
}
