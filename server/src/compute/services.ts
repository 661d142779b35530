import type { DataSource } from 'typeorm';
import type { AppContext } from '../app-context.js';
import { RunEventHub } from '../runs/run-events.js';
import { lazyRemoteRuns } from '../queue/lazy-remote.js';
import { RunExecutor } from '../runs/run-executor.js';
import { createWorkerPools, type WorkerPools } from './pools.js';

/** The background machinery of one app: its worker pools, the run executor, the run events. */
export interface ComputeServices {
  pools: WorkerPools;
  executor: RunExecutor;
  events: RunEventHub;
}

const byDataSource = new WeakMap<DataSource, ComputeServices>();

/**
 * The compute services of the app over `ctx.dataSource`, created on first use. Closing the
 * data source stops them first (queue, then workers), so the server's shutdown and the tests'
 * `close()` never leave worker threads behind.
 */
export function computeServices(ctx: AppContext): ComputeServices {
  const existing = byDataSource.get(ctx.dataSource);
  if (existing) return existing;
  const pools = createWorkerPools(ctx.config.runs);
  const { queueUrl, queueSlots = 16 } = ctx.config.runs;
  const remote = queueUrl ? lazyRemoteRuns(queueUrl, queueSlots) : null;
  const executor = new RunExecutor(ctx.dataSource, pools, ctx.config.runs, console.error, remote);
  const events = new RunEventHub(ctx.dataSource, executor, {
    streamsPerUser: ctx.config.runs.streamsPerUser ?? 8,
    streamsTotal: ctx.config.runs.streamsTotal ?? 200,
  });
  const services = { pools, executor, events };
  byDataSource.set(ctx.dataSource, services);
  const destroy = ctx.dataSource.destroy.bind(ctx.dataSource);
  ctx.dataSource.destroy = async () => {
    events.stop();
    await executor.stop();
    await destroy();
  };
  return services;
}
