import { createHash } from 'node:crypto';
import { gzipSync } from 'node:zlib';
import { compute, type GasSpecInput, type ValueJson } from '@traceloom/shared/engine';
import type { DataSource, EntityManager } from 'typeorm';
import { recordAudit } from '../audit/record-audit.js';
import { compareSeriesRows } from '../comparisons/compare-rows.js';
import { parseReferenceFile, referenceFacts } from '../references/reference-parse.js';
import { Comparison, Gas, GasVersion, ReferenceTable, Run, type User } from './entities/index.js';

/** The harmonic trap: Z_L = q^(L/2)/(1-q^L), whose grand function is (-kappa q^(1/2); q)_inf. */
const TRAP: GasSpecInput = {
  format: 'traceloom.gas/1',
  title: 'harmonic trap',
  statistics: 'fermion',
  variable: 'q',
  step: '1/2',
  order: '40',
  nMax: 8,
  classTable: 6,
  weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
  grand: { kind: 'expression', expression: 'qpoch(-kappa*q^(1/2), q, inf)' },
};

/** Our ring kernel: c_p = q^|p| on the half-integers. */
const RING: GasSpecInput = {
  format: 'traceloom.gas/1',
  title: 'ring kernel c_p = q^|p|',
  statistics: 'fermion',
  variable: 'q',
  step: '1/2',
  order: '30',
  nMax: 6,
  classTable: 5,
  weights: { kind: 'spectrum', expression: 'q^abs(p)', offset: '1/2', from: null, to: null },
};

/** The ring kernel deformed by a second scale, here tied to the first as t = q^2. */
const DEFORMED_RING: GasSpecInput = {
  format: 'traceloom.gas/1',
  title: 'deformed ring kernel, t = q^2',
  statistics: 'fermion',
  variable: 'q',
  step: '1/2',
  order: '30',
  nMax: 6,
  classTable: 5,
  weights: {
    kind: 'spectrum',
    expression: 'q^abs(p)/(1+q^(2*abs(p)))',
    offset: '1/2',
    from: null,
    to: null,
  },
};

/**
 * An invented colleague's preprint table for the trap: q^(-N^2/2) Z(N) = 1/(q;q)_N, whose
 * coefficients count partitions into at most N parts (OEIS A008284). Row N = 4 carries one
 * deliberately wrong coefficient: 7 q^5 where 6 is right (partitions of 5 into at most 4 parts).
 */
const PREPRINT_CSV = [
  'N,value,note',
  '1,"1 + q + q^2 + q^3 + q^4 + q^5 + O(q^6)",eq. (3.4)',
  '2,"1 + q + 2*q^2 + 2*q^3 + 3*q^4 + 3*q^5 + O(q^6)",eq. (3.4)',
  '3,"1 + q + 2*q^2 + 3*q^3 + 4*q^4 + 5*q^5 + O(q^6)",table 2',
  '4,"1 + q + 2*q^2 + 3*q^3 + 5*q^4 + 7*q^5 + O(q^6)",table 2',
  '',
].join('\n');

async function seedGas(
  manager: EntityManager,
  studyId: string,
  author: User,
  spec: GasSpecInput,
  now: string,
) {
  const gas = await manager.getRepository(Gas).save({
    study: { id: studyId },
    title: spec.title!,
    currentVersion: 1,
    deleted: false,
    updatedBy: { id: author.id },
    createdAt: now,
    updatedAt: now,
  });
  const version = await manager.getRepository(GasVersion).save({
    gas: { id: gas.id },
    version: 1,
    spec: JSON.stringify(compute(spec).spec),
    createdBy: { id: author.id },
    createdAt: now,
  });
  const started = Date.now();
  const result = compute(JSON.parse(version.spec));
  const classCounts: Record<string, number> = {};
  for (const row of result.classes) classCounts[row.N] = (classCounts[row.N] ?? 0) + 1;
  const run = await manager.getRepository(Run).save({
    gas: { id: gas.id },
    gasVersion: { id: version.id },
    status: 'done',
    progressDone: spec.classTable ?? 0,
    progressTotal: spec.classTable ?? 0,
    progressPhase: 'done',
    result: gzipSync(JSON.stringify(result)),
    classCounts: JSON.stringify(classCounts),
    startedAt: now,
    finishedAt: new Date().toISOString(),
    durationMs: Date.now() - started,
    createdBy: { id: author.id },
    createdAt: now,
  });
  for (const [action, targetType, targetId] of [
    ['gas.create', 'gas', gas.id],
    ['run.create', 'run', run.id],
    ['run.finish', 'run', run.id],
  ] as const) {
    await recordAudit(manager, {
      actorId: author.id,
      action,
      targetType,
      targetId,
      detail: { seeded: true },
    });
  }
  return { runId: run.id, result };
}

/**
 * The demo study's gases (the trap and two ring kernels of our own), each with a finished run
 * computed here through the engine, and the preprint reference table with its stored comparison
 * against the trap's run (one mismatch). Idempotent: does nothing when the study has gases.
 */
export async function seedDemoGases(
  dataSource: DataSource,
  studyId: string,
  author: User,
  reviewer: User,
): Promise<void> {
  if (await dataSource.getRepository(Gas).existsBy({ study: { id: studyId } })) return;
  await dataSource.transaction(async (manager) => {
    const now = new Date().toISOString();
    const trap = await seedGas(manager, studyId, author, TRAP, now);
    await seedGas(manager, studyId, author, RING, now);
    await seedGas(manager, studyId, author, DEFORMED_RING, now);

    const bytes = Buffer.from(PREPRINT_CSV);
    const parsed = parseReferenceFile(bytes, 'preprint-table-2.csv', 'text/csv');
    const normalization = 'q^(-N^2/2)';
    const table = await manager.getRepository(ReferenceTable).save({
      study: { id: studyId },
      title: "Colleague's preprint, table 2",
      fileBytes: bytes,
      filename: 'preprint-table-2.csv',
      contentType: 'text/csv',
      sha256: createHash('sha256').update(bytes).digest('hex'),
      rows: JSON.stringify(parsed.rows),
      ...referenceFacts(bytes, parsed.rows),
      normalization,
      variable: 'q',
      note: 'Low-N table for the harmonic trap, as sent to us before submission.',
      createdBy: { id: reviewer.id },
      createdAt: now,
    });
    const rows = compareSeriesRows({
      canonical: trap.result.canonical.map((row) => row.value as ValueJson),
      variable: 'q',
      order: trap.result.spec.order ?? null,
      normalization,
      rows: parsed.rows,
    });
    const comparison = await manager.getRepository(Comparison).save({
      run: { id: trap.runId },
      reference: { id: table.id },
      kind: 'reference',
      normalization,
      verdicts: JSON.stringify(rows),
      createdBy: { id: reviewer.id },
      createdAt: now,
    });
    await recordAudit(manager, {
      actorId: reviewer.id,
      action: 'reference.create',
      targetType: 'reference',
      targetId: table.id,
      detail: { seeded: true },
    });
    await recordAudit(manager, {
      actorId: reviewer.id,
      action: 'comparison.create',
      targetType: 'comparison',
      targetId: comparison.id,
      detail: { seeded: true },
    });
  });
}
