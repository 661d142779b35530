import type { DataSource } from 'typeorm';
import type { AppContext } from '../app-context.js';
import { RunExecutor } from '../runs/run-executor.js';
import { createWorkerPools, type WorkerPools } from './pools.js';

/** The background machinery of one app: its worker pools and the run executor. */
export interface ComputeServices {
  pools: WorkerPools;
  executor: RunExecutor;
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
  const executor = new RunExecutor(ctx.dataSource, pools, ctx.config.runs);
  const services = { pools, executor };
  byDataSource.set(ctx.dataSource, services);
  const destroy = ctx.dataSource.destroy.bind(ctx.dataSource);
  ctx.dataSource.destroy = async () => {
    await executor.stop();
    await destroy();
  };
  return services;
}
