import { gunzipSync } from 'node:zlib';
import type { ComputeResult, RunEstimate } from '@traceloom/shared/engine';
import { readResultVerdicts } from '@traceloom/shared/format';
import { In } from 'typeorm';
import type { AppContext } from '../app-context.js';
import { recordAudit } from '../audit/record-audit.js';
import { assertRunFits, estimateSpec, type RunEstimateDto } from '../compute/run-estimate.js';
import { computeServices } from '../compute/services.js';
import { Run } from '../db/entities/index.js';
import { assertCanChangeGas, loadVisibleGas } from '../gases/gas-access.js';
import { specOf } from '../gases/gas-dto.js';
import { AppError, notFound } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { canSee, STUDY_RELATIONS } from '../studies/study-access.js';
import { toRunSummary, type RunDto, type RunResult, type RunSummary } from './run-dto.js';

/** Statuses a run can still leave. */
export const ACTIVE_STATUSES = ['queued', 'running'] as const;

const RUN_RELATIONS = {
  gas: { study: STUDY_RELATIONS },
  gasVersion: true,
  createdBy: true,
} as const;

/** Loads a run whose study the actor may see; 404 otherwise. */
export async function loadVisibleRun(ctx: AppContext, actor: Actor, runId: string): Promise<Run> {
  const run = await ctx.dataSource
    .getRepository(Run)
    .findOne({ where: { id: runId }, relations: RUN_RELATIONS });
  if (!run || !canSee(actor, run.gas.study)) throw notFound('The run');
  return run;
}

/** The unpacked result JSON of a finished run. */
export function unpackResult(run: Run): ComputeResult | null {
  if (!run.result) return null;
  return readResultVerdicts(JSON.parse(gunzipSync(run.result).toString('utf8')) as ComputeResult);
}

/**
 * Queues a run of the gas at `version` (default: the latest). 429 `too_many_runs` when the
 * actor already has the per-user cap of queued + running runs.
 */
export async function startRun(
  ctx: AppContext,
  actor: Actor,
  gasId: string,
  input: { version?: number | undefined },
): Promise<{ id: string; status: 'queued'; warnings: string[]; estimate: RunEstimate }> {
  const { executor } = computeServices(ctx);
  // estimate before storing anything: refuse a class table that cannot fit, warn on the order
  const judged = await estimateVersion(ctx, actor, gasId, input.version);
  assertRunFits(judged);
  const id = await ctx.dataSource.transaction(async (manager) => {
    const gas = await loadVisibleGas(manager, actor, gasId);
    assertCanChangeGas(actor);
    if (gas.deleted) throw notFound('The gas');
    const wanted = input.version ?? gas.currentVersion;
    const version = gas.versions.find((v) => v.version === wanted);
    if (!version) throw notFound('That version of the gas', 'version');
    const repo = manager.getRepository(Run);
    const open = await repo.countBy({
      createdBy: { id: actor.id },
      status: In([...ACTIVE_STATUSES]),
    });
    const cap = ctx.config.runs.perUserCap;
    if (open >= cap) {
      throw new AppError(
        429,
        'too_many_runs',
        `You already have ${open} runs queued or running; the limit is ${cap}. Wait for one to finish or cancel one.`,
      );
    }
    const { id: runId } = await repo.save(
      repo.create({
        gas: { id: gasId },
        gasVersion: { id: version.id },
        status: 'queued',
        createdBy: { id: actor.id },
        createdAt: new Date().toISOString(),
      }),
    );
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'run.create',
      targetType: 'run',
      targetId: runId,
      detail: { gasId, version: wanted },
    });
    return runId;
  });
  executor.enqueue(id);
  return { id, status: 'queued', warnings: judged.warnings, estimate: judged.estimate };
}

/** The estimate of a run of the gas at `version` (default: the latest); 404 as startRun. */
async function estimateVersion(
  ctx: AppContext,
  actor: Actor,
  gasId: string,
  version: number | undefined,
): Promise<RunEstimateDto> {
  const gas = await loadVisibleGas(ctx.dataSource.manager, actor, gasId);
  assertCanChangeGas(actor);
  if (gas.deleted) throw notFound('The gas');
  const found = gas.versions.find((v) => v.version === (version ?? gas.currentVersion));
  if (!found) throw notFound('That version of the gas', 'version');
  return estimateSpec(ctx, specOf(found));
}

/** The runs of a gas, newest first. */
export async function listRuns(
  ctx: AppContext,
  actor: Actor,
  gasId: string,
): Promise<RunSummary[]> {
  await loadVisibleGas(ctx.dataSource.manager, actor, gasId);
  const { executor } = computeServices(ctx);
  const runs = await ctx.dataSource.getRepository(Run).find({
    where: { gas: { id: gasId } },
    relations: { gas: true, gasVersion: true, createdBy: true },
    order: { createdAt: 'DESC' },
  });
  return runs.map((run) => toRunSummary(run, executor.progressOf(run.id)));
}

/**
 * One run. Without `classes` the result's class rows are left out and `classCounts` given; with
 * `classes=N` only the rows for that N are included.
 */
export async function getRun(
  ctx: AppContext,
  actor: Actor,
  runId: string,
  classesParam: unknown,
): Promise<RunDto> {
  let classesN: number | null = null;
  if (classesParam !== undefined) {
    classesN = Number(classesParam);
    if (typeof classesParam !== 'string' || !/^\d{1,3}$/.test(classesParam)) {
      throw new AppError(400, 'invalid_input', 'classes: must be a whole number N.', 'classes');
    }
  }
  const run = await loadVisibleRun(ctx, actor, runId);
  const full = unpackResult(run);
  let result: RunResult | null = null;
  if (full) {
    const { classes, ...rest } = full;
    result =
      classesN === null ? rest : { ...rest, classes: classes.filter((c) => c.N === classesN) };
  }
  const dto: RunDto = {
    ...toRunSummary(run, computeServices(ctx).executor.progressOf(run.id)),
    studyId: run.gas.study.id,
    spec: specOf(run.gasVersion),
    result,
  };
  if (classesN === null) dto.classCounts = run.classCounts ? JSON.parse(run.classCounts) : {};
  return dto;
}

/** Cancels a queued or running run; 409 `not_active` once it has finished. */
export async function cancelRun(ctx: AppContext, actor: Actor, runId: string): Promise<RunSummary> {
  const run = await loadVisibleRun(ctx, actor, runId);
  assertCanChangeGas(actor);
  const { executor } = computeServices(ctx);
  const now = new Date().toISOString();
  const changed = await ctx.dataSource.transaction(async (manager) => {
    const update = await manager.getRepository(Run).update(
      { id: runId, status: In([...ACTIVE_STATUSES]) },
      {
        status: 'cancelled',
        finishedAt: now,
        durationMs: run.startedAt ? Date.parse(now) - Date.parse(run.startedAt) : null,
      },
    );
    if (!update.affected) return false;
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'run.cancel',
      targetType: 'run',
      targetId: runId,
      detail: { previousStatus: run.status },
    });
    return true;
  });
  if (!changed) {
    throw new AppError(409, 'not_active', `This run has already finished (${run.status}).`);
  }
  executor.cancel(runId);
  return toRunSummary(await loadVisibleRun(ctx, actor, runId));
}
