import { may } from '@traceloom/shared/api';
import type {
  DatasetCreateRequest,
  DatasetDto,
  DatasetPatchRequest,
  DatasetSummaryDto,
  ReviewInboxEntryDto,
} from '@traceloom/shared/api';
import type { AppContext } from '../app-context.js';
import { recordAudit } from '../audit/record-audit.js';
import { listComparisons } from '../comparisons/comparison-service.js';
import {
  Dataset,
  DatasetReview,
  DatasetReviewRequest,
  DatasetView,
  RunClassPage,
} from '../db/entities/index.js';
import { AppError, forbidden } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { parseId } from '../http/validate.js';
import { loadVisibleRun } from '../runs/run-service.js';
import { canSee, loadVisibleStudy } from '../studies/study-access.js';
import {
  DATASET_RELATIONS,
  DATASET_SUMMARY_SELECT,
  listVisibleDatasets,
  loadVisibleDataset,
  loadWritableDataset,
} from './dataset-access.js';
import { latestVerdicts, person, toDatasetDto, toSummary } from './dataset-dto.js';
import { canEditAuthors, writeAuthors } from './dataset-authors.js';

/**
 * `POST /runs/:id/datasets`: a draft snapshot of a finished run (spec version, full result,
 * stored comparisons). With `supersedesId` it is the next version of a locked or withdrawn
 * dataset of the same study, which stays readable and names its successor.
 */
export async function createDataset(
  ctx: AppContext,
  actor: Actor,
  runId: string,
  input: DatasetCreateRequest,
): Promise<DatasetDto> {
  const run = await loadVisibleRun(ctx, actor, runId);
  if (run.status !== 'done' || !run.result) {
    throw new AppError(
      409,
      'run_not_done',
      `The run is ${run.status}; a dataset needs a finished run.`,
    );
  }
  const comparisons = await listComparisons(ctx, actor, runId);
  const pages = await ctx.dataSource
    .getRepository(RunClassPage)
    .find({ where: { runId }, select: { rows: true }, order: { n: 'ASC', page: 'ASC' } });
  // Unpacked, joined with its class rows and written out on a run thread (the heap it needs).
  const made = await ctx.services.tasks.runTask('datasetSnapshot', {
    result: run.result,
    pages: pages.map((p) => p.rows),
    gas: { id: run.gas.id, title: run.gas.title, version: run.gasVersion.version },
    run: { id: run.id, finishedAt: run.finishedAt, durationMs: run.durationMs },
    comparisons: comparisons.map(({ id, referenceId, kind, normalization, rows }) => ({
      id,
      referenceId,
      kind,
      normalization,
      rows,
    })),
  });
  const id = await ctx.dataSource.transaction(async (manager) => {
    let version = 1;
    let supersedes: { id: string } | null = null;
    if (input.supersedesId) {
      const old = await loadVisibleDataset(manager, actor, input.supersedesId).catch(() => {
        throw new AppError(
          404,
          'not_found',
          'supersedesId: the dataset was not found.',
          'supersedesId',
        );
      });
      if (old.study.id !== run.gas.study.id) {
        throw new AppError(
          400,
          'invalid_input',
          'supersedesId: that dataset belongs to another study.',
          'supersedesId',
        );
      }
      if (old.state !== 'locked' && old.state !== 'withdrawn') {
        throw new AppError(
          409,
          'supersedes_open',
          'supersedesId: only a locked or withdrawn dataset can be superseded; edit the draft instead.',
          'supersedesId',
        );
      }
      const taken = await manager.getRepository(Dataset).existsBy({ supersedes: { id: old.id } });
      if (taken) {
        throw new AppError(
          409,
          'already_superseded',
          'supersedesId: a newer version of that dataset already exists.',
          'supersedesId',
        );
      }
      version = old.version + 1;
      supersedes = { id: old.id };
    }
    const now = new Date().toISOString();
    const repo = manager.getRepository(Dataset);
    const saved = await repo.save(
      repo.create({
        study: { id: run.gas.study.id },
        run: { id: run.id },
        version,
        supersedes,
        title: input.title,
        description: input.description ?? '',
        state: 'draft',
        snapshot: made.snapshot,
        hash: null,
        canonical: null,
        lockedAt: null,
        lockedBy: null,
        createdBy: { id: actor.id },
        createdAt: now,
        updatedAt: now,
      }),
    );
    await manager
      .getRepository(DatasetView)
      .insert({ datasetId: saved.id, summary: made.summary, checks: made.checks });
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'dataset.create',
      targetType: 'dataset',
      targetId: saved.id,
      detail: { runId, version, supersedesId: supersedes?.id ?? null, state: 'draft' },
    });
    return saved.id;
  });
  return getDataset(ctx, actor, id);
}

/** The datasets the actor may see, newest first; `studyId` narrows to one study. */
export async function listDatasets(
  ctx: AppContext,
  actor: Actor,
  studyId: unknown,
): Promise<DatasetSummaryDto[]> {
  const manager = ctx.dataSource.manager;
  let id: string | null = null;
  if (studyId !== undefined) {
    id = parseId(typeof studyId === 'string' ? studyId : undefined, 'The study');
    await loadVisibleStudy(manager, actor, id);
  }
  const visible = await listVisibleDatasets(manager, actor, id);
  return Promise.all(visible.map((d) => toSummary(manager, d)));
}

/** One dataset with snapshot summary, checks, reviews and comments. */
export async function getDataset(
  ctx: AppContext,
  actor: Actor,
  datasetId: string,
): Promise<DatasetDto> {
  const manager = ctx.dataSource.manager;
  return toDatasetDto(manager, await loadVisibleDataset(manager, actor, datasetId), actor);
}

function assertCanEditDraft(actor: Actor, d: Dataset): void {
  if (d.state !== 'draft') {
    throw new AppError(
      409,
      'not_draft',
      'Only a draft can be edited or deleted; this one is in review.',
    );
  }
  if (d.createdBy.id !== actor.id && !may(actor.role, 'editAnyDraft')) {
    throw forbidden("Only the dataset's author, a steward or an admin may edit or delete a draft.");
  }
}

/**
 * `PATCH /datasets/:id`: title and description of a draft; the citation's authors until the
 * lock (`writeAuthors`). A body with authors only may reach a dataset in review.
 */
export async function patchDataset(
  ctx: AppContext,
  actor: Actor,
  datasetId: string,
  patch: () => DatasetPatchRequest,
): Promise<DatasetDto> {
  await ctx.dataSource.transaction(async (manager) => {
    const d = await loadWritableDataset(manager, actor, datasetId);
    // The caller's part before the body is read: someone who may change neither is refused.
    if (!canEditAuthors(actor, d)) assertCanEditDraft(actor, d);
    const { authors, ...input } = patch();
    if (authors !== undefined) await writeAuthors(manager, actor, d, authors);
    if (input.title === undefined && input.description === undefined) return;
    assertCanEditDraft(actor, d);
    const before = { title: d.title, description: d.description };
    await manager
      .getRepository(Dataset)
      .update({ id: d.id }, { ...input, updatedAt: new Date().toISOString() });
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'dataset.update',
      targetType: 'dataset',
      targetId: d.id,
      detail: { before, after: input },
    });
  });
  return getDataset(ctx, actor, datasetId);
}

/** `DELETE /datasets/:id`: drafts only. */
export async function deleteDataset(
  ctx: AppContext,
  actor: Actor,
  datasetId: string,
): Promise<void> {
  await ctx.dataSource.transaction(async (manager) => {
    const d = await loadWritableDataset(manager, actor, datasetId);
    assertCanEditDraft(actor, d);
    await manager.getRepository(Dataset).delete({ id: d.id });
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'dataset.delete',
      targetType: 'dataset',
      targetId: d.id,
      detail: { title: d.title, version: d.version, state: d.state },
    });
  });
}

/** `GET /review-requests`: the datasets the actor was asked to review, newest request first. */
export async function reviewInbox(ctx: AppContext, actor: Actor): Promise<ReviewInboxEntryDto[]> {
  const manager = ctx.dataSource.manager;
  const requests = await manager.getRepository(DatasetReviewRequest).find({
    where: { reviewer: { id: actor.id } },
    // Never the snapshot bytes: the study's owner and members only, for the access check.
    select: {
      id: true,
      createdAt: true,
      dataset: {
        ...DATASET_SUMMARY_SELECT,
        study: { id: true, owner: { id: true }, members: { id: true, user: { id: true } } },
      },
      requestedBy: { id: true, displayName: true },
    },
    relations: { dataset: DATASET_RELATIONS, requestedBy: true },
    order: { createdAt: 'DESC' },
  });
  const out: ReviewInboxEntryDto[] = [];
  for (const r of requests) {
    if (!canSee(actor, r.dataset.study)) continue;
    const reviews = await manager.getRepository(DatasetReview).find({
      where: { dataset: { id: r.dataset.id } },
      relations: { reviewer: true },
      order: { createdAt: 'ASC' },
    });
    out.push({
      dataset: await toSummary(manager, r.dataset),
      requestedBy: person(r.requestedBy),
      requestedAt: r.createdAt,
      myVerdict: latestVerdicts(reviews).get(actor.id) ?? null,
    });
  }
  return out;
}
