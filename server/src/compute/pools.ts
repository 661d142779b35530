import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Piscina } from 'piscina';
import type { RunLimits } from '../config.js';

/**
 * The worker pools: background runs, quick jobs (preview, comparisons, uploads), and the probe
 * that checks a gas before it is stored — on its own thread, so a preview flood cannot starve it.
 */
export interface WorkerPools {
  runs: Piscina;
  quick: Piscina;
  probe: Piscina;
  destroy(): Promise<void>;
}

/**
 * Where the worker lives: the compiled `dist/server/runs/worker.js` in production; under tsx or
 * Vitest (this module is a .ts file) the TypeScript source, loaded through tsx with the dev
 * tsconfig so `@traceloom/shared` resolves to its source as well.
 */
function workerOptions() {
  const here = import.meta.url;
  if (!here.endsWith('.ts')) return { filename: new URL('../runs/worker.js', here).href };
  const tsconfig = path.resolve(path.dirname(fileURLToPath(here)), '../../tsconfig.dev.json');
  return {
    filename: new URL('../runs/worker.ts', here).href,
    execArgv: [...process.execArgv, '--import', 'tsx'],
    env: { ...process.env, TSX_TSCONFIG_PATH: tsconfig } as Record<string, string>,
  };
}

/** The pool runs compute on: `threads` warm workers, each with the run heap limit. */
export function createRunPool(limits: Pick<RunLimits, 'threads' | 'maxOldGenerationSizeMb'>) {
  return new Piscina({
    ...workerOptions(),
    minThreads: limits.threads,
    maxThreads: limits.threads,
    idleTimeout: 60_000,
    resourceLimits: { maxOldGenerationSizeMb: limits.maxOldGenerationSizeMb },
  });
}

/**
 * Builds the pools. Each run gets a worker with a heap limit (`resourceLimits`); aborting a
 * task's signal terminates its worker, which piscina replaces. Workers are kept warm so the
 * first run does not pay the start-up.
 */
export function createWorkerPools(limits: RunLimits): WorkerPools {
  const base = workerOptions();
  const runs = createRunPool(limits);
  const quick = new Piscina({
    ...base,
    minThreads: 1,
    maxThreads: 2,
    idleTimeout: 60_000,
    resourceLimits: { maxOldGenerationSizeMb: 256 },
  });
  const probe = new Piscina({
    ...base,
    minThreads: 1,
    maxThreads: 1,
    idleTimeout: 60_000,
    resourceLimits: { maxOldGenerationSizeMb: 256 },
  });
  return {
    runs,
    quick,
    probe,
    async destroy() {
      await Promise.all([runs.destroy(), quick.destroy(), probe.destroy()]);
    },
  };
}
