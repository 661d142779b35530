import type { RunDto, RunEstimateDto, RunSummary } from '@traceloom/shared/api';
import type { ComputeResult, RunEstimate } from '@traceloom/shared/engine';
import { readResultVerdicts } from '@traceloom/shared/format';
import { In } from 'typeorm';
import type { AppContext } from '../app-context.js';
import { recordAudit } from '../audit/record-audit.js';
import { assertRunFits, estimateSpec } from '../compute/run-estimate.js';
import { Run, RunClassPage } from '../db/entities/index.js';
import { assertCanChangeGas, loadVisibleGas } from '../gases/gas-access.js';
import { specOf } from '../gases/gas-dto.js';
import { AppError, notFound } from '../http/app-error.js';
import { JsonPieces, type Actor } from '../http/route-table.js';
import { canSee, STUDY_RELATIONS } from '../studies/study-access.js';
import { classRowsJson, resultJson } from './class-pages.js';
import { toRunSummary } from './run-dto.js';

/** Statuses a run can still leave. */
export const ACTIVE_STATUSES = ['queued', 'running'] as const;

const RUN_RELATIONS = {
  gas: { study: STUDY_RELATIONS },
  gasVersion: true,
  createdBy: true,
} as const;

/** A run's columns without its result bytes, for lists. */
const SUMMARY_COLUMNS = {
  id: true,
  status: true,
  progressDone: true,
  progressTotal: true,
  progressPhase: true,
  startedAt: true,
  finishedAt: true,
  durationMs: true,
  error: true,
  createdAt: true,
  gas: { id: true },
  gasVersion: { id: true, version: true },
  createdBy: { id: true, displayName: true },
} as const;

/** Loads a run whose study the actor may see; 404 otherwise. */
export async function loadVisibleRun(ctx: AppContext, actor: Actor, runId: string): Promise<Run> {
  const run = await ctx.dataSource
    .getRepository(Run)
    .findOne({ where: { id: runId }, relations: RUN_RELATIONS });
  if (!run || !canSee(actor, run.gas.study)) throw notFound('The run');
  return run;
}

/**
 * The result of a finished run, unpacked and parsed; `classes` adds every class row (read from
 * the class pages). For the engine-side uses (comparisons, dataset snapshots); answers to the
 * client never parse the stored JSON (see `getRun`).
 */
export async function loadResult(
  ctx: AppContext,
  run: Run,
  { classes = false } = {},
): Promise<ComputeResult | null> {
  if (!run.result) return null;
  const summary = JSON.parse((await resultJson(run.result)).toString('utf8')) as Omit<
    ComputeResult,
    'classes'
  >;
  const rows: ComputeResult['classes'] = [];
  if (classes) {
    const manager = ctx.dataSource.manager;
    for (const n of Object.keys(run.classCounts ? JSON.parse(run.classCounts) : {})) {
      const parts: Buffer[] = [];
      for await (const part of classRowsJson(manager, run.id, Number(n))) {
        parts.push(typeof part === 'string' ? Buffer.from(part) : part);
      }
      rows.push(...(JSON.parse(Buffer.concat(parts).toString('utf8')) as typeof rows));
    }
  }
  // verdicts stored under the older side names (expected/found) read as computed/supplied
  return readResultVerdicts({ ...summary, classes: rows });
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
  const { executor } = ctx.services;
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
    // verifications waiting for or holding a run thread count as runs
    const open =
      (await repo.countBy({ createdBy: { id: actor.id }, status: In([...ACTIVE_STATUSES]) })) +
      executor.jobsOf(actor.id);
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
  executor.enqueue(id, actor.id);
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
  const { executor } = ctx.services;
  const runs = await ctx.dataSource.getRepository(Run).find({
    where: { gas: { id: gasId } },
    select: SUMMARY_COLUMNS,
    relations: { gas: true, gasVersion: true, createdBy: true },
    order: { createdAt: 'DESC' },
  });
  return runs.map((run) => toRunSummary(run, executor.progressOf(run.id)));
}

/** What a read of one run asks for: the class rows of one N, and one page of them. */
export interface RunQuery {
  classes: number | null;
  /** Only with `classes`. */
  classPage: number | null;
}

/**
 * One run. Without `classes` the result's class rows are left out and `classCounts` (rows per N)
 * and `classPages` (stored pages per N) given; with `classes=N` the rows for that N are included,
 * with `classPage=k` as well only the k-th page of them (0-based). The answer is assembled as
 * text from the stored pieces: the stored JSON is unpacked off the main thread and never parsed.
 */
export async function getRun(
  ctx: AppContext,
  actor: Actor,
  runId: string,
  { classes: classesN, classPage: page }: RunQuery = { classes: null, classPage: null },
): Promise<JsonPieces> {
  const run = await loadVisibleRun(ctx, actor, runId);
  const dto: Omit<RunDto, 'result'> = {
    ...toRunSummary(run, ctx.services.executor.progressOf(run.id)),
    studyId: run.gas.study.id,
    spec: specOf(run.gasVersion),
  };
  if (classesN === null) {
    dto.classCounts = run.classCounts ? JSON.parse(run.classCounts) : {};
    dto.classPages = await classPageCounts(ctx, runId);
  }
  return new JsonPieces(runAnswer(ctx, run, dto, classesN, page));
}

/** The pieces of a run answer: the DTO head, the stored result, and the asked class rows. */
async function* runAnswer(
  ctx: AppContext,
  run: Run,
  dto: Omit<RunDto, 'result'>,
  classesN: number | null,
  page: number | null,
): AsyncGenerator<Buffer | string> {
  yield `${JSON.stringify(dto).slice(0, -1)},"result":`;
  if (!run.result) return yield 'null}';
  const result = await resultJson(run.result);
  if (classesN === null) return yield* [result, '}'];
  yield result.subarray(0, result.length - 1); // without its closing brace
  yield ',"classes":';
  yield* classRowsJson(ctx.dataSource.manager, run.id, classesN, page);
  yield '}}';
}

/** Stored class-row pages per N of a run. */
async function classPageCounts(ctx: AppContext, runId: string): Promise<Record<string, number>> {
  const rows: Array<{ n: number; pages: number }> = await ctx.dataSource
    .getRepository(RunClassPage)
    .createQueryBuilder('p')
    .select('p.n', 'n')
    .addSelect('count(*)', 'pages')
    .where('p.run_id = :runId', { runId })
    .groupBy('p.n')
    .getRawMany();
  return Object.fromEntries(rows.map((r) => [String(r.n), Number(r.pages)]));
}

/** Cancels a queued or running run; 409 `not_active` once it has finished. */
export async function cancelRun(ctx: AppContext, actor: Actor, runId: string): Promise<RunSummary> {
  const run = await loadVisibleRun(ctx, actor, runId);
  assertCanChangeGas(actor);
  const { executor } = ctx.services;
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
