import { may } from '@traceloom/shared/api';
import type { ReferenceRow } from '@traceloom/shared/api';
import { referencePatchSchema } from '@traceloom/shared/api';
import type { ReferenceComparisonDto, ReferenceDto, RowVerdictDto } from '@traceloom/shared/api';
import { readVerdict } from '@traceloom/shared/format';
import type { AppContext } from '../app-context.js';
import { recordAudit } from '../audit/record-audit.js';
import { Comparison, Dataset, ReferenceTable } from '../db/entities/index.js';
import { AppError, forbidden } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { parseInput } from '../http/validate.js';
import { checkNormalization } from './normalization-check.js';
import { isNumericTable } from './reference-parse.js';
import { getReference, loadVisibleReference } from './reference-service.js';

/** The uploader, or a role that edits gases, may change or delete a table of a visible study. */
function assertCanChange(actor: Actor, table: ReferenceTable): void {
  const editor = may(actor.role, 'editGases');
  if (!editor && table.createdBy.id !== actor.id) throw forbidden();
}

/** Titles of the locked (or later withdrawn) datasets whose snapshot holds a comparison with it. */
async function lockedUsers(ctx: AppContext, table: ReferenceTable): Promise<string[]> {
  // The snapshot is JSON.stringify output: a comparison with this table reads exactly so.
  const needle = `"referenceId":"${table.id}"`;
  const rows = await ctx.dataSource
    .getRepository(Dataset)
    .createQueryBuilder('d')
    .select(['d.id', 'd.title', 'd.version'])
    .where('d.study_id = :study', { study: table.study.id })
    .andWhere('d.locked_at IS NOT NULL')
    .andWhere('instr(d.snapshot, :needle) > 0', { needle })
    .getMany();
  return rows.map((d) => `“${d.title}” (version ${d.version})`);
}

async function refuseIfLocked(ctx: AppContext, table: ReferenceTable, what: string) {
  const users = await lockedUsers(ctx, table);
  if (!users.length) return;
  const sets = users.length === 1 ? 'the locked dataset' : 'the locked datasets';
  throw new AppError(
    409,
    'reference_in_locked_dataset',
    `This table cannot be ${what}: ${sets} ${users.join(', ')} cite a comparison with it.`,
  );
}

/**
 * `PATCH /references/:id`: changes the title, normalization or note. A new normalization is
 * checked like an upload's; comparisons already stored keep the normalization they used.
 */
export async function patchReference(
  ctx: AppContext,
  actor: Actor,
  referenceId: string,
  body: unknown,
): Promise<ReferenceDto> {
  const input = parseInput(referencePatchSchema, body);
  const table = await loadVisibleReference(ctx, actor, referenceId);
  assertCanChange(actor, table);
  await refuseIfLocked(ctx, table, 'edited');
  if (input.normalization !== undefined) {
    const rows = JSON.parse(table.rows) as ReferenceRow[];
    checkNormalization(input.normalization, table.variable, rows, isNumericTable(rows));
  }
  await ctx.dataSource.transaction(async (manager) => {
    await manager.getRepository(ReferenceTable).update({ id: table.id }, input);
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'reference.update',
      targetType: 'reference',
      targetId: table.id,
      detail: { studyId: table.study.id, fields: Object.keys(input) },
    });
  });
  return getReference(ctx, actor, table.id);
}

/** `DELETE /references/:id`: removes the table and its comparisons unless a locked dataset cites it. */
export async function deleteReference(
  ctx: AppContext,
  actor: Actor,
  referenceId: string,
): Promise<void> {
  const table = await loadVisibleReference(ctx, actor, referenceId);
  assertCanChange(actor, table);
  await refuseIfLocked(ctx, table, 'deleted');
  await ctx.dataSource.transaction(async (manager) => {
    await manager.getRepository(Comparison).delete({ reference: { id: table.id } });
    await manager.getRepository(ReferenceTable).delete({ id: table.id });
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'reference.delete',
      targetType: 'reference',
      targetId: table.id,
      detail: { studyId: table.study.id, title: table.title },
    });
  });
}

/** `GET /references/:id/comparisons`: every comparison with the table, newest first, with its run. */
export async function listReferenceComparisons(
  ctx: AppContext,
  actor: Actor,
  referenceId: string,
): Promise<ReferenceComparisonDto[]> {
  const table = await loadVisibleReference(ctx, actor, referenceId);
  // Explicit columns: the run's result bytes are never read for a list.
  const list = await ctx.dataSource
    .getRepository(Comparison)
    .createQueryBuilder('c')
    .innerJoin('c.run', 'run')
    .innerJoin('run.gas', 'gas')
    .innerJoin('run.gasVersion', 'gv')
    .select(['c.id', 'c.normalization', 'c.verdicts', 'c.createdAt'])
    .addSelect(['run.id', 'gas.id', 'gas.title', 'gv.id', 'gv.version'])
    .where('c.reference_id = :id', { id: table.id })
    .orderBy('c.created_at', 'DESC')
    .getMany();
  return list.map((c) => {
    const rows = (JSON.parse(c.verdicts) as RowVerdictDto[]).map(readVerdict);
    return {
      id: c.id,
      runId: c.run.id,
      gasId: c.run.gas.id,
      gasTitle: c.run.gas.title,
      gasVersion: c.run.gasVersion.version,
      normalization: c.normalization,
      summary: { agreeing: rows.filter((r) => r.agrees).length, total: rows.length },
      createdAt: c.createdAt,
    };
  });
}
