import { MessageChannel } from 'node:worker_threads';
import type { Progress } from '@traceloom/shared/engine';
import type { ClassPageData } from './class-pager.js';
import { isSectorSpec, runSectorsOnPool, type TaskPool } from './sector-runs.js';
import { poolTask } from '../compute/run-task.js';
import type { RunOutput, WorkerRefusal } from '../compute/tasks.js';

/** What a run reports while it computes: progress, its start, the cheap routes' result, pages. */
export type RunMessage =
  Progress | { started: number } | { partial: Uint8Array } | { page: ClassPageData };

/**
 * Computes one run's spec on `pool` (a sector sum spread over `threads` tasks, anything else as
 * one task) and reports through `onMessage`. Every class-row page reaches `onMessage` before the
 * promise resolves; the output then counts them in `pages`. Aborting `signal` terminates the
 * task's worker and rejects. The embedded executor and the queue worker process both run this.
 */
export async function runOnPool(
  pool: TaskPool,
  threads: number,
  spec: unknown,
  signal: AbortSignal,
  onMessage: (m: RunMessage) => void,
): Promise<RunOutput | WorkerRefusal> {
  let pagesSeen = 0;
  let pageArrived = () => {};
  const forward = (m: RunMessage) => {
    if ('page' in m) {
      pagesSeen += 1;
      onMessage(m);
      pageArrived();
      return;
    }
    onMessage(m);
  };
  if (isSectorSpec(spec)) {
    const output = await runSectorsOnPool(pool, threads, spec, signal, forward);
    if (!output.ok) return output;
    // A result assembled from sectors still holds its class rows: page them now.
    const paged = await poolTask(pool, 'pageResult', { gzip: output.gzip }, { signal });
    if (!paged.ok) return paged;
    for (const page of paged.pages) forward({ page });
    return { ...output, gzip: paged.gzip, pages: paged.pages.length };
  }
  const channel = new MessageChannel();
  channel.port1.on('message', forward);
  try {
    const output = await poolTask(
      pool,
      'run',
      { spec, port: channel.port2 },
      { transferList: [channel.port2], signal },
    );
    // The pages travel on their own port: wait for the last ones before closing it.
    if (output.ok && output.pages !== undefined && pagesSeen < output.pages) {
      const expected = output.pages;
      await new Promise<void>((resolve) => {
        pageArrived = () => {
          if (pagesSeen >= expected) resolve();
        };
      });
    }
    return output;
  } finally {
    channel.port1.close();
  }
}
