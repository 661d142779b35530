import type { RemoteRuns } from './remote-runs.js';

/** What the run executor needs of the queue in queue mode. */
export type RunQueue = Pick<RemoteRuns, 'slots' | 'run' | 'close'>;

/**
 * The queue client for `url`, loaded (with BullMQ and ioredis) on the first run only, so a
 * server without `TRACELOOM_QUEUE_URL` never loads the queue modules.
 */
export function lazyRemoteRuns(url: string, slots: number): RunQueue {
  let loaded: Promise<RemoteRuns> | null = null;
  const load = () =>
    (loaded ??= import('./remote-runs.js').then((m) => new m.RemoteRuns(url, slots)));
  return {
    slots,
    run: async (...args) => (await load()).run(...args),
    close: async () => {
      if (loaded) await (await loaded).close();
    },
  };
}
