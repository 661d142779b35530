import type { DataSource } from 'typeorm';
import { createWorkerPools, poolHeapMb, type WorkerPools } from './compute/pools.js';
import { TaskRunner } from './compute/run-task.js';
import type { ServerConfig } from './config.js';
import { Mailer } from './mail/mailer.js';
import { lazyRemoteRuns } from './queue/lazy-remote.js';
import { RunEventHub } from './runs/run-events.js';
import { RunExecutor } from './runs/run-executor.js';

/** Verify answers kept per locked dataset and hash (its bytes cannot change). */
export class VerifyCache {
  private readonly entries = new Map<string, readonly string[]>();

  constructor(private readonly max = 200) {}

  /** The mismatches found for `key`, or undefined. */
  get(key: string): readonly string[] | undefined {
    return this.entries.get(key);
  }

  /** Keeps `mismatches` for `key`, dropping the oldest entry beyond `max`. */
  set(key: string, mismatches: readonly string[]): void {
    this.entries.delete(key);
    this.entries.set(key, mismatches);
    if (this.entries.size > this.max) this.entries.delete(this.entries.keys().next().value!);
  }
}

/**
 * The background machinery of one app, built once by `createApp` and closed by its `close()`:
 * the worker pools (each started on first use, so an app that never computes starts no thread),
 * the task runner on them, the run executor with its queue, the run event streams, the mailer
 * (the local fake starts on first use) and the verify cache.
 */
export interface AppServices {
  pools: WorkerPools;
  tasks: TaskRunner;
  executor: RunExecutor;
  events: RunEventHub;
  mail: Mailer;
  verifications: VerifyCache;
  /** Stops streams, the queue and the workers, and the mail fake; idempotent. */
  close(): Promise<void>;
}

/**
 * Builds the services over `dataSource`. The executor starts restart recovery at once (database
 * only; threads start when a run needs one).
 */
export function createServices(
  dataSource: DataSource,
  config: ServerConfig,
  log: (err: unknown) => void = console.error,
): AppServices {
  const pools = createWorkerPools(config.runs);
  const { queueUrl, queueSlots = 16 } = config.runs;
  const remote = queueUrl ? lazyRemoteRuns(queueUrl, queueSlots) : null;
  const executor = new RunExecutor(dataSource, pools, config.runs, log, remote);
  const events = new RunEventHub(dataSource, executor, {
    streamsPerUser: config.runs.streamsPerUser ?? 8,
    streamsTotal: config.runs.streamsTotal ?? 200,
  });
  const mail = new Mailer(config.mail, config.mode, config.port);
  let closing: Promise<void> | null = null;
  return {
    pools,
    tasks: new TaskRunner(pools, poolHeapMb(config.runs)),
    executor,
    events,
    mail,
    verifications: new VerifyCache(),
    close() {
      closing ??= (async () => {
        events.stop();
        await executor.stop();
        await mail.close();
      })();
      return closing;
    },
  };
}
