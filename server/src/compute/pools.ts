import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Piscina } from 'piscina';
import type { RunLimits } from '../config.js';

/**
 * The worker pools (each started on first use): background runs, quick jobs (preview, comparisons, uploads), and the probe
 * that checks a gas before it is stored — on its own thread, so a preview flood cannot starve it.
 */
export interface WorkerPools {
  readonly runs: Piscina;
  readonly quick: Piscina;
  readonly probe: Piscina;
  /** The pools whose threads have been started. */
  started(): PoolName[];
  /**
   * Starts `names` (default: all) and resolves once each of their warm threads has loaded the
   * engine — the server does it after it starts listening, tests that time answers before theirs.
   */
  warm(names?: readonly PoolName[]): Promise<void>;
  /** Terminates the started pools' threads; no pool starts afterwards. */
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

/** Which pool a task kind runs on. */
export type PoolName = 'runs' | 'quick' | 'probe';

/** The heap limit (MB) of a quick or probe thread; run threads take `maxOldGenerationSizeMb`. */
export const SMALL_HEAP_MB = 256;

/** Each pool's heap limit per thread, in MB (what an out-of-memory message names). */
export function poolHeapMb(
  limits: Pick<RunLimits, 'maxOldGenerationSizeMb'>,
): Record<PoolName, number> {
  return { runs: limits.maxOldGenerationSizeMb, quick: SMALL_HEAP_MB, probe: SMALL_HEAP_MB };
}

/**
 * Builds the pools lazily: a pool's threads start the first time a task needs it, so an app
 * that never computes starts no thread (`started` says which pools exist). Each run gets a
 * worker with a heap limit (`resourceLimits`); aborting a task's signal terminates its worker,
 * which piscina replaces; once started, workers are kept warm (`idleTimeout`).
 */
export function createWorkerPools(limits: RunLimits): WorkerPools {
  const base = workerOptions();
  const make: Record<PoolName, () => Piscina> = {
    runs: () => createRunPool(limits),
    quick: () =>
      new Piscina({
        ...base,
        minThreads: 1,
        maxThreads: 2,
        idleTimeout: 60_000,
        resourceLimits: { maxOldGenerationSizeMb: SMALL_HEAP_MB },
      }),
    probe: () =>
      new Piscina({
        ...base,
        minThreads: 1,
        maxThreads: 1,
        idleTimeout: 60_000,
        resourceLimits: { maxOldGenerationSizeMb: SMALL_HEAP_MB },
      }),
  };
  const made = new Map<PoolName, Piscina>();
  let closed = false;
  const get = (name: PoolName): Piscina => {
    if (closed) throw new Error('the worker pools are closed');
    let pool = made.get(name);
    if (!pool) made.set(name, (pool = make[name]()));
    return pool;
  };
  return {
    get runs() {
      return get('runs');
    },
    get quick() {
      return get('quick');
    },
    get probe() {
      return get('probe');
    },
    started: () => [...made.keys()],
    async warm(names = ['runs', 'quick', 'probe']) {
      // A refused task per warm thread: answered as soon as a worker has loaded its module.
      const tasks = names.flatMap((name) => {
        const pool = get(name);
        const n = name === 'runs' ? limits.threads : 1;
        return Array.from({ length: n }, () => pool.run({ kind: 'preview', spec: null }));
      });
      await Promise.all(tasks);
    },
    async destroy() {
      closed = true;
      await Promise.all([...made.values()].map((pool) => pool.destroy()));
      made.clear();
    },
  };
}
