import { MessageChannel } from 'node:worker_threads';
import {
  EngineError,
  NumericSectorWalk,
  parseGasSpec,
  partFromData,
  SectorWalk,
  type GasSpec,
  type NumericSectorPart,
  type Progress,
  type SectorPartData,
} from '@traceloom/shared/engine';
import Fraction from 'fraction.js';
import type { Piscina } from 'piscina';
import { poolTask } from '../compute/run-task.js';
import type { RunOutput, WorkerRefusal } from '../compute/tasks.js';

/** Sectors one pool task computes at most (several tasks per shell keep every thread busy). */
const CHUNK = 16;

/**
 * What runs a sector run's tasks: the embedded worker pool (piscina), or in queue mode the
 * queue's task jobs, which any worker process may take (`queue/remote-tasks.ts`).
 */
export type TaskPool = Pick<Piscina, 'run'>;

/** True when a stored spec asks for a sector sum (series or numeric: spread over the pool). */
export function isSectorSpec(spec: unknown): boolean {
  return (
    typeof spec === 'object' &&
    spec !== null &&
    'sectors' in spec &&
    !!(spec as { sectors: unknown }).sectors
  );
}

/** A sector part as it comes back from a pool task: series parts as data, numeric parts as is. */
type PartData = SectorPartData | NumericSectorPart;

/** The stopping rule of either mode behind one face: the next shell, and accepting its parts. */
interface Walker {
  next(): number[][] | null;
  accept(parts: PartData[]): void;
  total: number;
}

function walkerFor(gas: GasSpec): Walker {
  if (gas.precision !== undefined) {
    const walk = new NumericSectorWalk(gas);
    return {
      next: () => walk.next(),
      accept: (parts) => walk.accept((parts as NumericSectorPart[]).map((p) => p.terms)),
      total: 0,
    };
  }
  const walk = new SectorWalk(gas, gas.order == null ? null : new Fraction(gas.order));
  return {
    next: () => walk.next(),
    accept: (parts) => walk.accept((parts as SectorPartData[]).map(partFromData)),
    get total() {
      return walk.total;
    },
  };
}

/** The shell's sectors cut into about `threads` tasks of at most CHUNK sectors. */
function chunks(list: number[][], threads: number): number[][][] {
  const size = Math.max(1, Math.min(CHUNK, Math.ceil(list.length / threads)));
  const out: number[][][] = [];
  for (let i = 0; i < list.length; i += size) out.push(list.slice(i, i + size));
  return out;
}

/**
 * A sector run on the worker pool: the walk stays on this thread (it only weighs and compares),
 * each shell's sectors are computed by pool tasks in parallel, progress counts sectors, and the
 * computed shells go to one last task that sums them into the result. Aborting `signal` stops the
 * pool tasks (their workers are terminated) and rejects.
 */
export async function runSectorsOnPool(
  pool: TaskPool,
  threads: number,
  spec: unknown,
  signal: AbortSignal,
  onMessage: (m: Progress | { started: number }) => void,
): Promise<RunOutput | WorkerRefusal> {
  onMessage({ started: Date.now() });
  const t0 = performance.now();
  const shells: PartData[][] = [];
  try {
    const walk = walkerFor(parseGasSpec(spec));
    let done = 0;
    for (let list = walk.next(); list !== null; list = walk.next()) {
      const answers = await Promise.all(
        chunks(list, threads).map(async (sectors) => {
          const r = await poolTask(pool, 'sectorParts', { spec, sectors }, { signal });
          if (r.ok)
            onMessage({ phase: 'sectors', done: (done += r.parts.length), total: walk.total });
          return r;
        }),
      );
      const refused = answers.find((a): a is WorkerRefusal => !a.ok);
      if (refused) return refused;
      const shell = answers.flatMap((a) => (a as { parts: PartData[] }).parts);
      shells.push(shell);
      walk.accept(shell);
    }
  } catch (e) {
    if (e instanceof EngineError) return { ok: false, message: e.message, field: e.field };
    throw e;
  }
  const channel = new MessageChannel();
  channel.port1.on('message', (p: Progress) => onMessage(p));
  try {
    return await poolTask(
      pool,
      'sectorAssemble',
      {
        spec,
        shells: shells as SectorPartData[][],
        sectorsMs: performance.now() - t0,
        port: channel.port2,
      },
      { transferList: [channel.port2], signal },
    );
  } finally {
    channel.port1.close();
  }
}
