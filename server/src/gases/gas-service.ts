import type { GasDto, GasSummary, GasVersionDto } from '@traceloom/shared/api';
import type { GasSpec } from '@traceloom/shared/engine';
import { In, type EntityManager } from 'typeorm';
import type { AppContext } from '../app-context.js';
import { recordAudit } from '../audit/record-audit.js';
import { Gas, GasVersion, Run } from '../db/entities/index.js';
import { notFound } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { loadVisibleStudy } from '../studies/study-access.js';
import { assertCanChangeGas, loadVisibleGas } from './gas-access.js';
import { personRef, specOf, toGasDto, toGasVersionDto } from './gas-dto.js';

/** The title a spec gives its gas. */
function titleOf(spec: GasSpec): string {
  return spec.title?.trim() || 'untitled gas';
}

/** The study's gases (not deleted), most recently changed first, each with its latest run. */
export async function listGases(
  ctx: AppContext,
  actor: Actor,
  studyId: string,
): Promise<GasSummary[]> {
  const manager = ctx.dataSource.manager;
  await loadVisibleStudy(manager, actor, studyId);
  const gases = await manager.getRepository(Gas).find({
    where: { study: { id: studyId }, deleted: false },
    relations: { study: true, versions: true, updatedBy: true },
    order: { updatedAt: 'DESC' },
  });
  const runs = gases.length
    ? await manager.getRepository(Run).find({
        where: { gas: { id: In(gases.map((g) => g.id)) } },
        relations: { gas: true },
        select: { id: true, status: true, finishedAt: true, createdAt: true, gas: { id: true } },
        order: { createdAt: 'DESC' },
      })
    : [];
  return gases.map((gas) => {
    const spec = specOf(gas.versions.find((v) => v.version === gas.currentVersion)!);
    const last = runs.find((run) => run.gas.id === gas.id);
    return {
      id: gas.id,
      studyId: gas.study.id,
      title: gas.title,
      statistics: spec.statistics,
      weightsKind: spec.weights.kind,
      version: gas.currentVersion,
      updatedAt: gas.updatedAt,
      updatedBy: personRef(gas.updatedBy),
      lastRun: last ? { id: last.id, status: last.status, finishedAt: last.finishedAt } : null,
    };
  });
}

/** Stores version `version` of a gas and touches the gas. */
async function addVersion(
  manager: EntityManager,
  actor: Actor,
  gasId: string,
  version: number,
  spec: GasSpec,
  now: string,
): Promise<void> {
  await manager.getRepository(GasVersion).insert({
    gas: { id: gasId },
    version,
    spec: JSON.stringify(spec),
    createdBy: { id: actor.id },
    createdAt: now,
  });
}

/** Defines a new gas (version 1) in a study the actor may see. */
export async function createGas(
  ctx: AppContext,
  actor: Actor,
  studyId: string,
  spec: GasSpec,
): Promise<GasDto> {
  return ctx.dataSource.transaction(async (manager) => {
    await loadVisibleStudy(manager, actor, studyId);
    assertCanChangeGas(actor);
    const now = new Date().toISOString();
    const repo = manager.getRepository(Gas);
    const { id } = await repo.save(
      repo.create({
        study: { id: studyId },
        title: titleOf(spec),
        currentVersion: 1,
        deleted: false,
        updatedBy: { id: actor.id },
        createdAt: now,
        updatedAt: now,
      }),
    );
    await addVersion(manager, actor, id, 1, spec, now);
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'gas.create',
      targetType: 'gas',
      targetId: id,
      detail: { studyId, title: titleOf(spec), version: 1 },
    });
    return toGasDto(await loadVisibleGas(manager, actor, id));
  });
}

/** One gas (deleted ones too, by id). */
export async function getGas(ctx: AppContext, actor: Actor, gasId: string): Promise<GasDto> {
  return toGasDto(await loadVisibleGas(ctx.dataSource.manager, actor, gasId));
}

/** One stored version of a gas; 404 naming `version` when it has no such version. */
export async function getGasVersion(
  ctx: AppContext,
  actor: Actor,
  gasId: string,
  versionText: string | undefined,
): Promise<GasVersionDto> {
  const gas = await loadVisibleGas(ctx.dataSource.manager, actor, gasId);
  const version = gas.versions.find((v) => String(v.version) === versionText);
  if (!version) throw notFound('That version of the gas', 'version');
  return toGasVersionDto(version);
}

/** Saves a new version of a gas; earlier versions and their runs are kept as they were. */
export async function updateGas(
  ctx: AppContext,
  actor: Actor,
  gasId: string,
  spec: GasSpec,
): Promise<GasDto> {
  return ctx.dataSource.transaction(async (manager) => {
    const gas = await loadVisibleGas(manager, actor, gasId);
    if (gas.deleted) throw notFound('The gas');
    assertCanChangeGas(actor);
    const now = new Date().toISOString();
    const version = gas.currentVersion + 1;
    await addVersion(manager, actor, gasId, version, spec, now);
    await manager.getRepository(Gas).update(
      { id: gasId },
      {
        currentVersion: version,
        title: titleOf(spec),
        updatedBy: { id: actor.id },
        updatedAt: now,
      },
    );
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'gas.update',
      targetType: 'gas',
      targetId: gasId,
      detail: { version, title: titleOf(spec), previousVersion: gas.currentVersion },
    });
    return toGasDto(await loadVisibleGas(manager, actor, gasId));
  });
}

/** Soft-deletes a gas: gone from lists; versions and runs stay readable by id. */
export async function deleteGas(ctx: AppContext, actor: Actor, gasId: string): Promise<void> {
  await ctx.dataSource.transaction(async (manager) => {
    const gas = await loadVisibleGas(manager, actor, gasId);
    if (gas.deleted) throw notFound('The gas');
    assertCanChangeGas(actor);
    await manager
      .getRepository(Gas)
      .update({ id: gasId }, { deleted: true, updatedAt: new Date().toISOString() });
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'gas.delete',
      targetType: 'gas',
      targetId: gasId,
      detail: { title: gas.title },
    });
  });
}
