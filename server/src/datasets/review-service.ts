import { may } from '@traceloom/shared/api';
import type { z } from 'zod';
import type {
  datasetCommentSchema,
  datasetReviewSchema,
  datasetWaiverSchema,
  DatasetDto,
  reviewRequestSchema,
} from '@traceloom/shared/api';
import { In } from 'typeorm';
import type { AppContext } from '../app-context.js';
import { recordAudit } from '../audit/record-audit.js';
import {
  Dataset,
  DatasetComment,
  DatasetReview,
  DatasetReviewRequest,
  DatasetWaiver,
  User,
} from '../db/entities/index.js';
import { AppError, forbidden } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { mailUsers } from '../mail/mailer.js';
import { canSee } from '../studies/study-access.js';
import { loadWritableDataset } from './dataset-access.js';
import { withWaivers } from './dataset-checks.js';
import { loadView } from './dataset-view.js';
import { loadChildren } from './dataset-dto.js';
import { reviewRequestMail, verdictMail } from './dataset-mails.js';
import { getDataset } from './dataset-service.js';

type Input<S extends z.ZodType> = () => z.output<S>;

/** A link to the dataset page in the client, for mails. */
export function datasetLink(ctx: AppContext, datasetId: string): string {
  return `${ctx.services.mail.baseUrl}/datasets/${datasetId}`;
}

function assertOpen(d: Dataset): void {
  if (d.state !== 'draft' && d.state !== 'in_review') {
    throw new AppError(409, 'invalid_state', `The dataset is ${d.state}.`);
  }
}

/**
 * `POST /datasets/:id/review-requests`: the dataset's author or a steward asks reviewers (role
 * reviewer or steward, with access to the study, not the author) to review; the dataset goes
 * in review and each newly asked reviewer gets a mail.
 */
export async function requestReview(
  ctx: AppContext,
  actor: Actor,
  datasetId: string,
  input: Input<typeof reviewRequestSchema>,
): Promise<DatasetDto> {
  const added = await ctx.dataSource.transaction(async (manager) => {
    const d = await loadWritableDataset(manager, actor, datasetId);
    if (d.createdBy.id !== actor.id && !may(actor.role, 'curate')) {
      throw forbidden("Only the dataset's author or a steward may request reviews.");
    }
    assertOpen(d);
    const { reviewerIds } = input();
    const users = await manager
      .getRepository(User)
      .findBy({ id: In(reviewerIds), disabled: false });
    for (const [i, id] of reviewerIds.entries()) {
      const field = `reviewerIds.${i}`;
      const user = users.find((u) => u.id === id);
      if (!user)
        throw new AppError(404, 'not_found', `${field}: no active user has this id.`, field);
      if (!may(user.role, 'review')) {
        throw new AppError(
          400,
          'invalid_input',
          `${field}: ${user.displayName} is not a reviewer or steward.`,
          field,
        );
      }
      if (user.id === d.createdBy.id) {
        throw new AppError(
          400,
          'invalid_input',
          `${field}: the author cannot review their own dataset.`,
          field,
        );
      }
      if (user.id === actor.id) {
        throw new AppError(
          400,
          'invalid_input',
          `${field}: you cannot ask yourself for a review; ask another reviewer or steward.`,
          field,
        );
      }
      const asActor = {
        id: user.id,
        email: user.email,
        displayName: user.displayName,
        role: user.role,
      };
      if (!canSee(asActor, d.study)) {
        throw new AppError(
          400,
          'invalid_input',
          `${field}: ${user.displayName} has no access to this study.`,
          field,
        );
      }
    }
    const repo = manager.getRepository(DatasetReviewRequest);
    const existing = await repo.find({
      where: { dataset: { id: d.id } },
      relations: { reviewer: true },
    });
    const fresh = [...new Set(reviewerIds)].filter(
      (id) => !existing.some((r) => r.reviewer.id === id),
    );
    const now = new Date().toISOString();
    for (const reviewerId of fresh) {
      await repo.insert({
        dataset: { id: d.id },
        reviewer: { id: reviewerId },
        requestedBy: { id: actor.id },
        createdAt: now,
      });
    }
    if (d.state === 'draft') {
      await manager
        .getRepository(Dataset)
        .update({ id: d.id }, { state: 'in_review', updatedAt: now });
    }
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'dataset.review_request',
      targetType: 'dataset',
      targetId: d.id,
      detail: { reviewerIds: fresh, from: d.state, to: 'in_review' },
    });
    return { fresh, d };
  });
  if (added.fresh.length > 0) {
    await mailUsers(
      ctx,
      added.fresh,
      reviewRequestMail(added.d, actor.displayName, datasetLink(ctx, datasetId)),
    );
  }
  return getDataset(ctx, actor, datasetId);
}

/** `POST /datasets/:id/comments`: anyone with access comments on the dataset or on one row N. */
export async function addComment(
  ctx: AppContext,
  actor: Actor,
  datasetId: string,
  input: Input<typeof datasetCommentSchema>,
): Promise<DatasetDto> {
  await ctx.dataSource.transaction(async (manager) => {
    const d = await loadWritableDataset(manager, actor, datasetId);
    const { body, N } = input();
    const { nMax } = (await loadView(manager, d.id)).summary;
    if (N !== undefined && N > nMax) {
      throw new AppError(400, 'invalid_input', `N: this dataset has rows N = 0..${nMax}.`, 'N');
    }
    const saved = await manager.getRepository(DatasetComment).save({
      dataset: { id: d.id },
      author: { id: actor.id },
      rowN: N ?? null,
      body,
      createdAt: new Date().toISOString(),
    });
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'dataset.comment',
      targetType: 'dataset',
      targetId: d.id,
      detail: { commentId: saved.id, N: N ?? null },
    });
  });
  return getDataset(ctx, actor, datasetId);
}

/** `POST /datasets/:id/reviews`: a requested reviewer's verdict; the author gets a mail. */
export async function addReview(
  ctx: AppContext,
  actor: Actor,
  datasetId: string,
  input: Input<typeof datasetReviewSchema>,
): Promise<DatasetDto> {
  const done = await ctx.dataSource.transaction(async (manager) => {
    const d = await loadWritableDataset(manager, actor, datasetId);
    const { requests } = await loadChildren(manager, d.id);
    const mine = requests.filter((r) => r.reviewer.id === actor.id);
    if (mine.length === 0) {
      throw forbidden('Only a reviewer asked to review this dataset may give a verdict.');
    }
    // Separation of duties: a request someone made of themselves does not count.
    if (mine.every((r) => r.requestedBy.id === actor.id)) {
      throw forbidden('You asked for this review yourself; another person must review it.');
    }
    if (d.state !== 'in_review')
      throw new AppError(409, 'invalid_state', `The dataset is ${d.state}.`);
    const { verdict, comment } = input();
    const saved = await manager.getRepository(DatasetReview).save({
      dataset: { id: d.id },
      reviewer: { id: actor.id },
      verdict,
      comment,
      createdAt: new Date().toISOString(),
    });
    await recordAudit(manager, {
      actorId: actor.id,
      action: `dataset.review.${verdict}`,
      targetType: 'dataset',
      targetId: d.id,
      detail: { reviewId: saved.id, verdict },
    });
    return { d, verdict, comment };
  });
  await mailUsers(
    ctx,
    [done.d.createdBy.id],
    verdictMail(done.d, actor.displayName, done.verdict, done.comment, datasetLink(ctx, datasetId)),
  );
  return getDataset(ctx, actor, datasetId);
}

/** `POST /datasets/:id/waivers` (steward): a written reason accepts a failing check row (or check). */
export async function addWaiver(
  ctx: AppContext,
  actor: Actor,
  datasetId: string,
  input: Input<typeof datasetWaiverSchema>,
): Promise<DatasetDto> {
  await ctx.dataSource.transaction(async (manager) => {
    const d = await loadWritableDataset(manager, actor, datasetId);
    if (!may(actor.role, 'lock')) throw forbidden('Only a steward may waive a check.');
    assertOpen(d);
    const { check, N, reason } = input();
    const rows = withWaivers((await loadView(manager, d.id)).checks, []).filter(
      (c) => c.check === check,
    );
    if (rows.length === 0)
      throw new AppError(
        400,
        'invalid_input',
        `check: this dataset has no check "${check}".`,
        'check',
      );
    const failing = rows.filter((c) => c.status === 'fails' && (N === undefined || c.N === N));
    if (failing.length === 0) {
      const where = N === undefined ? '' : ` at N = ${N}`;
      throw new AppError(
        400,
        'invalid_input',
        `${N === undefined ? 'check' : 'N'}: the check passes${where}; only a check that fails can be waived.`,
        N === undefined ? 'check' : 'N',
      );
    }
    const saved = await manager.getRepository(DatasetWaiver).save({
      dataset: { id: d.id },
      check,
      rowN: N ?? null,
      reason,
      waivedBy: { id: actor.id },
      createdAt: new Date().toISOString(),
    });
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'dataset.waive',
      targetType: 'dataset',
      targetId: d.id,
      detail: { waiverId: saved.id, check, N: N ?? null, reason },
    });
  });
  return getDataset(ctx, actor, datasetId);
}
