import type { ClassPageData } from '../runs/class-pager.js';
import type { RunMessage } from '../runs/run-on-pool.js';
import type { RunOutput, WorkerRefusal } from '../runs/worker.js';

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

/** A finished job's return value: the output and every class-row page, bytes as base64. */
export interface WireResult {
  output: (Omit<RunOutput, 'gzip'> & { gzip: string }) | WorkerRefusal;
  pages: Array<Omit<ClassPageData, 'gzip'> & { gzip: string }>;
}

const b64 = (bytes: Uint8Array) => Buffer.from(bytes).toString('base64');
const bytes = (text: string) => new Uint8Array(Buffer.from(text, 'base64'));

/** A run's output and pages as the job's return value (JSON-safe). */
export function encodeResult(
  output: RunOutput | WorkerRefusal,
  pages: ClassPageData[],
): WireResult {
  return {
    output: output.ok ? { ...output, gzip: b64(output.gzip) } : output,
    pages: pages.map((p) => ({ ...p, gzip: b64(p.gzip) })),
  };
}

/** The output and pages back from a job's return value. */
export function decodeResult(wire: WireResult): {
  output: RunOutput | WorkerRefusal;
  pages: ClassPageData[];
} {
  return {
    output: wire.output.ok ? { ...wire.output, gzip: bytes(wire.output.gzip) } : wire.output,
    pages: wire.pages.map((p) => ({ ...p, gzip: bytes(p.gzip) })),
  };
}

/** A run message as a job progress report, or back. */
export function encodeMessage(m: Exclude<RunMessage, { page: ClassPageData }>): WireMessage {
  return 'partial' in m ? { partial: b64(m.partial) } : m;
}

/** The run message a job progress report carries. */
export function decodeMessage(m: WireMessage): RunMessage {
  return 'partial' in m ? { partial: bytes(m.partial) } : m;
}
