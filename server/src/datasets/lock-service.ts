import { may } from '@traceloom/shared/api';
import type { DatasetLockInput } from '@traceloom/shared/api';
import type { EntityManager } from 'typeorm';
import type { AppContext } from '../app-context.js';
import { recordAudit } from '../audit/record-audit.js';
import { Dataset } from '../db/entities/index.js';
import { AppError, forbidden } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { mailUsers } from '../mail/mailer.js';
import { datasetLocked, isLockTrigger, loadWritableDataset, withBytes } from './dataset-access.js';
import { loadView } from './dataset-view.js';
import {
  APPROVER_CANNOT_LOCK,
  citationOf,
  loadChildren,
  lockBlockers,
  person,
} from './dataset-dto.js';
import { lockMail } from './dataset-mails.js';
import { datasetLink } from './review-service.js';

/**
 * The dataset if `actor` may lock it now (a steward, not its creator, nothing blocking), with its
 * children; 403 or 409 `not_ready` naming what blocks otherwise.
 */
export async function loadLockable(manager: EntityManager, actor: Actor, datasetId: string) {
  const d = await loadWritableDataset(manager, actor, datasetId);
  if (!may(actor.role, 'lock')) throw forbidden('Only a steward may lock a dataset.');
  if (d.createdBy.id === actor.id) {
    throw new AppError(
      403,
      'own_dataset',
      'You created this dataset; another steward must lock it.',
    );
  }
  const children = await loadChildren(manager, d.id);
  const blockers = lockBlockers(d, children, actor.id, (await loadView(manager, d.id)).checks);
  if (blockers.includes(APPROVER_CANNOT_LOCK)) {
    throw new AppError(
      403,
      'approved_by_you',
      'You approved this dataset; another steward must lock it.',
    );
  }
  if (blockers.length > 0) {
    throw new AppError(
      409,
      'not_ready',
      `The dataset cannot be locked yet: ${blockers.join('; ')}.`,
    );
  }
  return { d: await withBytes(manager, d), children };
}

/** How long a confirmed lock preview stays good. */
const CONFIRMATION_MS = 15 * 60_000;

/** The preview's lock time, if it is from the last 15 minutes (400 naming `lockedAt` otherwise). */
function confirmedTime(lockedAt: string): string {
  const age = Date.now() - Date.parse(lockedAt);
  if (!(age >= -5_000 && age <= CONFIRMATION_MS)) {
    throw new AppError(
      400,
      'invalid_input',
      'lockedAt: the confirmation is older than 15 minutes; open the lock dialog again.',
      'lockedAt',
    );
  }
  return new Date(lockedAt).toISOString();
}

/**
 * `POST /datasets/:id/lock` (a steward who is not the dataset's author): needs the dataset in
 * review, at least one approval (latest verdict per reviewer) and every check passing or waived.
 * Hashes the RFC 8785 canonical JSON of snapshot + metadata with SHA-256, stores both, and mails
 * the author and the reviewers. From then on the database triggers refuse any change. With a
 * confirmed preview (`{lockedAt, hash}`) the lock uses that time and must give that hash.
 */
export async function lockDataset(
  ctx: AppContext,
  actor: Actor,
  datasetId: string,
  confirmed?: () => DatasetLockInput | undefined,
): Promise<{ hash: string }> {
  const locked = await ctx.dataSource
    .transaction(async (manager) => {
      const { d, children } = await loadLockable(manager, actor, datasetId);
      const confirmation = confirmed?.();
      const lockedAt = confirmation
        ? confirmedTime(confirmation.lockedAt)
        : new Date().toISOString();
      const { canonical, hash } = await ctx.services.tasks.runTask('lockDocument', {
        dataset: d,
        children,
        lockedBy: person(actor),
        lockedAt,
      });
      if (confirmation && confirmation.hash !== hash) {
        throw new AppError(
          409,
          'changed',
          'The dataset changed since the lock was confirmed; look at the new hash and confirm again.',
        );
      }
      await manager.getRepository(Dataset).update(
        { id: d.id },
        {
          state: 'locked',
          hash,
          canonical,
          lockedAt,
          lockedBy: { id: actor.id },
          updatedAt: lockedAt,
        },
      );
      await recordAudit(manager, {
        actorId: actor.id,
        action: 'dataset.lock',
        targetType: 'dataset',
        targetId: d.id,
        detail: { hash, from: d.state, to: 'locked' },
      });
      const recipients = [d.createdBy.id, ...children.requests.map((r) => r.reviewer.id)];
      return { d: { ...d, hash, lockedAt }, recipients, hash };
    })
    .catch((err: unknown) => {
      throw isLockTrigger(err) ? datasetLocked() : err;
    });
  const citation = citationOf(locked.d) ?? '';
  await mailUsers(
    ctx,
    locked.recipients,
    lockMail(locked.d, actor.displayName, locked.hash, citation, datasetLink(ctx, datasetId)),
  );
  return { hash: locked.hash };
}

/** `POST /datasets/:id/withdraw` (steward): a draft or a dataset in review is withdrawn. */
export async function withdrawDataset(
  ctx: AppContext,
  actor: Actor,
  datasetId: string,
): Promise<{ state: 'withdrawn' }> {
  await ctx.dataSource.transaction(async (manager) => {
    const d = await loadWritableDataset(manager, actor, datasetId);
    if (!may(actor.role, 'lock')) throw forbidden('Only a steward may withdraw a dataset.');
    const now = new Date().toISOString();
    await manager
      .getRepository(Dataset)
      .update({ id: d.id }, { state: 'withdrawn', updatedAt: now });
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'dataset.withdraw',
      targetType: 'dataset',
      targetId: d.id,
      detail: { from: d.state, to: 'withdrawn' },
    });
  });
  return { state: 'withdrawn' };
}
