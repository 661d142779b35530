import type { MessagePort } from 'node:worker_threads';
import type { RunMessage } from '../runs/run-on-pool.js';
import type { TaskPool } from '../runs/sector-runs.js';
import type { RemoteRuns } from './remote-runs.js';

/**
 * Task jobs one shell of a sector run is cut into (at most 16 sectors each, as on the embedded
 * pool): enough for several workers to share a shell without a job per sector.
 */
export const SECTOR_JOBS_PER_SHELL = 8;

const never = new AbortController().signal;

/**
 * The queue standing in for the worker pool of a sector run (`runOnPool` takes either): each
 * task becomes a task job `<run job id>-t<k>` that any worker process may take, its answer comes
 * back as it left the worker's pool, and a task that reports through a port (the sum) has its
 * job progress posted to that port. Aborting a task's signal cancels its job.
 */
export class RemoteTaskPool implements TaskPool {
  private count = 0;

  constructor(
    private readonly remote: Pick<RemoteRuns, 'runTask'>,
    private readonly runJobId: string,
  ) {}

  run(task: unknown, options?: { signal?: unknown }): Promise<unknown> {
    const { port, ...plain } = task as { port?: MessagePort };
    const jobId = `${this.runJobId}-t${++this.count}`;
    const signal = (options?.signal as AbortSignal | undefined) ?? never;
    return this.remote.runTask(jobId, plain, signal, port && ((m) => port.postMessage(m)));
  }
}

const isProgress = (m: RunMessage): m is Extract<RunMessage, { phase: string }> => 'phase' in m;

/**
 * Passes on a job's messages but never lets its progress go back: a job taken again after its
 * worker died starts from nothing, and its reports are dropped until they pass what was shown
 * (a phase seen before the current one, or fewer done in the current one).
 */
export function onlyForward(onMessage: (m: RunMessage) => void): (m: RunMessage) => void {
  const phases: string[] = [];
  let done = -1;
  return (m) => {
    if (!isProgress(m)) return onMessage(m);
    const at = phases.indexOf(m.phase);
    const current = phases.length - 1;
    if (at === -1) {
      phases.push(m.phase);
      done = m.done;
      return onMessage(m);
    }
    if (at < current || m.done < done) return;
    done = m.done;
    onMessage(m);
  };
}
