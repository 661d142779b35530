import { gzipSync } from 'node:zlib';
import type { MessagePort } from 'node:worker_threads';
import {
  assembleNumericSectors,
  assembleSectors,
  NumericSectorWalk,
  numericSectorContext,
  numericSectorPart,
  parseGasSpec,
  partFromData,
  partToData,
  sectorContext,
  sectorPart,
  SectorWalk,
  type ComputeResult,
  type GasSpec,
  type NumericSectorPart,
  type Progress,
  type SectorPartData,
} from '@traceloom/shared/engine';
import Fraction from 'fraction.js';

/** Compute some sectors of a gas (one worker's share of a shell). */
export interface SectorPartsTask {
  spec: unknown;
  sectors: number[][];
}

/** Sum the computed shells into the result (checks, class table, breakdown). */
export interface SectorAssembleTask {
  spec: unknown;
  /** Series parts as SectorPartData, numeric parts (spec with `precision`) as NumericSectorPart. */
  shells: SectorPartData[][] | NumericSectorPart[][];
  sectorsMs: number;
  port: MessagePort;
}

/** The gases of the given sectors, as plain data (numeric parts are plain data already). */
export function sectorPartsTask(task: SectorPartsTask): {
  ok: true;
  parts: SectorPartData[] | NumericSectorPart[];
} {
  const spec = parseGasSpec(task.spec);
  if (spec.precision !== undefined) {
    const ctx = numericSectorContext(spec);
    return { ok: true, parts: task.sectors.map((n) => numericSectorPart(ctx, n)) };
  }
  const ctx = sectorContext(spec);
  return { ok: true, parts: task.sectors.map((n) => partToData(sectorPart(ctx, n))) };
}

/** A numeric sector sum from its shells: the walk replayed, then summed. */
function assembleNumeric(spec: GasSpec, task: SectorAssembleTask): ComputeResult {
  const shells = task.shells as NumericSectorPart[][];
  const walk = new NumericSectorWalk(spec);
  for (const shell of shells) {
    walk.next();
    walk.accept(shell.map((p) => p.terms));
  }
  const now = () => performance.now();
  return assembleNumericSectors(spec, walk, shells.flat(), {}, task.sectorsMs, now);
}

/** The result of a sector run from its computed shells: gzip of the JSON and class counts. */
export function sectorAssembleTask(task: SectorAssembleTask) {
  const spec = parseGasSpec(task.spec);
  let last = 0;
  const progress = {
    phase(phase: Progress['phase'], total: number) {
      task.port.postMessage({ phase, done: 0, total });
    },
    step(done: number, total: number) {
      const t = Date.now();
      if (t - last < 50) return;
      last = t;
      task.port.postMessage({ phase: 'classSum', done, total });
    },
    tick() {},
  };
  try {
    const result =
      spec.precision !== undefined
        ? assembleNumeric(spec, task)
        : assembleSectors(
            spec,
            SectorWalk.replay(
              spec,
              spec.order == null ? null : new Fraction(spec.order),
              (task.shells as SectorPartData[][]).map((shell) => shell.map(partFromData)),
            ),
            { collectClasses: true },
            progress,
            task.sectorsMs,
            () => performance.now(),
          );
    const classCounts: Record<string, number> = {};
    for (const row of result.classes) classCounts[row.N] = (classCounts[row.N] ?? 0) + 1;
    return { ok: true as const, gzip: gzipSync(JSON.stringify(result)), classCounts };
  } finally {
    task.port.close();
  }
}
