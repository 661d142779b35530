import { gzipSync } from 'node:zlib';
import type { MessagePort } from 'node:worker_threads';
import {
  assembleSectors,
  parseGasSpec,
  partFromData,
  partToData,
  sectorContext,
  sectorPart,
  SectorWalk,
  type Progress,
  type SectorPartData,
} from '@traceloom/shared/engine';
import Fraction from 'fraction.js';

/** Compute some sectors of a gas (one worker's share of a shell). */
export interface SectorPartsTask {
  kind: 'sectorParts';
  spec: unknown;
  sectors: number[][];
}

/** Sum the computed shells into the result (checks, class table, breakdown). */
export interface SectorAssembleTask {
  kind: 'sectorAssemble';
  spec: unknown;
  shells: SectorPartData[][];
  sectorsMs: number;
  port: MessagePort;
}

/** The gases of the given sectors, as plain data. */
export function sectorPartsTask(task: SectorPartsTask): { ok: true; parts: SectorPartData[] } {
  const ctx = sectorContext(parseGasSpec(task.spec));
  return { ok: true, parts: task.sectors.map((n) => partToData(sectorPart(ctx, n))) };
}

/** The result of a sector run from its computed shells: gzip of the JSON and class counts. */
export function sectorAssembleTask(task: SectorAssembleTask) {
  const spec = parseGasSpec(task.spec);
  const cap = spec.order == null ? null : new Fraction(spec.order);
  const walk = SectorWalk.replay(
    spec,
    cap,
    task.shells.map((shell) => shell.map(partFromData)),
  );
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
    const result = assembleSectors(
      spec,
      walk,
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
