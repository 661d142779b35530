import { may } from '@traceloom/shared/api';
import type { DatasetDto, DatasetPersonDto, DatasetSummaryDto } from '@traceloom/shared/api';
import type { EntityManager } from 'typeorm';
import {
  Dataset,
  DatasetComment,
  DatasetReview,
  DatasetReviewRequest,
  DatasetWaiver,
  type User,
} from '../db/entities/index.js';
import type { Actor } from '../http/route-table.js';
import { withWaivers, type CheckRow } from './dataset-checks.js';
import { loadView } from './dataset-view.js';
import { canEditAuthors, datasetAuthors } from './dataset-authors.js';

function authorsOf(d: Dataset, children: DatasetChildren) {
  const { authors, edited } = datasetAuthors(d, children);
  return { authors, authorsEdited: edited };
}

/** A person as datasets name them (no e-mail: exports and the public page carry these). */
export function person(user: Pick<User, 'id' | 'displayName'>): DatasetPersonDto {
  return { id: user.id, displayName: user.displayName };
}

/**
 * The dataset that supersedes `dataset`, if any (the newest one); with `lockedOnly` only a
 * locked one, as the public page may name (a draft successor stays private).
 */
export async function supersededBy(
  manager: EntityManager,
  datasetId: string,
  lockedOnly = false,
): Promise<{ id: string; version: number } | null> {
  const next = await manager.getRepository(Dataset).findOne({
    where: { supersedes: { id: datasetId }, ...(lockedOnly ? { state: 'locked' as const } : {}) },
    order: { version: 'DESC' },
  });
  return next ? { id: next.id, version: next.version } : null;
}

/** A dataset (loaded with `DATASET_RELATIONS`) as a list shows it. */
export async function toSummary(
  manager: EntityManager,
  d: Dataset,
  known?: DatasetChildren,
): Promise<DatasetSummaryDto> {
  const children = known ?? (await loadChildren(manager, d.id));
  const verdicts = [...latestVerdicts(children.reviews).values()];
  const approved = d.state === 'in_review' && verdicts.includes('approve');
  // Lists read no snapshot: only an approved dataset needs its check rows (kept beside it).
  const checks = approved ? (await loadView(manager, d.id)).checks : [];
  return {
    id: d.id,
    studyId: d.study.id,
    runId: d.run.id,
    title: d.title,
    version: d.version,
    state: d.state,
    hash: d.hash,
    lockedAt: d.lockedAt,
    supersedes: d.supersedes ? { id: d.supersedes.id, version: d.supersedes.version } : null,
    supersededBy: await supersededBy(manager, d.id),
    createdBy: person(d.createdBy),
    createdAt: d.createdAt,
    updatedAt: d.updatedAt,
    approved,
    // Ready for a steward who has not approved it (the approving steward may not lock).
    readyToLock: approved && lockBlockers(d, children, '', checks).length === 0,
  };
}

/** Everything a dataset's children say: requests, reviews, comments and waivers, oldest first. */
export async function loadChildren(manager: EntityManager, datasetId: string) {
  const where = { dataset: { id: datasetId } };
  const order = { createdAt: 'ASC' } as const;
  const [requests, reviews, comments, waivers] = await Promise.all([
    manager
      .getRepository(DatasetReviewRequest)
      .find({ where, order, relations: { reviewer: true, requestedBy: true } }),
    manager.getRepository(DatasetReview).find({ where, order, relations: { reviewer: true } }),
    manager.getRepository(DatasetComment).find({ where, order, relations: { author: true } }),
    manager.getRepository(DatasetWaiver).find({ where, order, relations: { waivedBy: true } }),
  ]);
  return { requests, reviews, comments, waivers };
}

/** Children of one dataset, as `loadChildren` gives them. */
export type DatasetChildren = Awaited<ReturnType<typeof loadChildren>>;

/** The latest verdict of each reviewer, by reviewer id. */
export function latestVerdicts(
  reviews: readonly DatasetReview[],
): Map<string, 'approve' | 'changes'> {
  const latest = new Map<string, 'approve' | 'changes'>();
  for (const r of reviews) latest.set(r.reviewer.id, r.verdict);
  return latest;
}

/** The citation line: title, version, lock date, hash. */
export function citationOf(
  d: Pick<Dataset, 'title' | 'version' | 'lockedAt' | 'hash'>,
): string | null {
  if (!d.hash || !d.lockedAt) return null;
  return `${d.title}, version ${d.version}, Traceloom dataset locked ${d.lockedAt.slice(0, 10)}, SHA-256 ${d.hash}.`;
}

/** The sentence shown when the would-be locker approved the dataset themselves. */
export const APPROVER_CANNOT_LOCK = 'you approved it, so another steward must lock it';

/**
 * Why the dataset cannot be locked now by `lockerId` (state, approvals, checks that fail, and
 * separation of duties: the steward who approved may not lock); empty when it can. `checks` are
 * the dataset's check rows (`loadView`).
 */
export function lockBlockers(
  d: Pick<Dataset, 'state'>,
  children: DatasetChildren,
  lockerId: string,
  checks: readonly CheckRow[],
): string[] {
  const out: string[] = [];
  if (d.state !== 'in_review') out.push('the dataset must be in review');
  const verdicts = latestVerdicts(children.reviews);
  if (verdicts.get(lockerId) === 'approve') out.push(APPROVER_CANNOT_LOCK);
  const approvals = [...verdicts].filter(([id, v]) => v === 'approve' && id !== lockerId);
  if (approvals.length === 0) out.push('no other reviewer has approved it yet');
  const failing = withWaivers(checks, children.waivers).filter((c) => c.status === 'fails');
  if (failing.length > 0) out.push(`${failing.length} check row(s) fail and are not waived`);
  return out;
}

/** The full dataset answer for `actor`, with what they may do now. */
export async function toDatasetDto(
  manager: EntityManager,
  d: Dataset,
  actor: Actor,
): Promise<DatasetDto> {
  const children = await loadChildren(manager, d.id);
  const view = await loadView(manager, d.id);
  const open = d.state === 'draft' || d.state === 'in_review';
  const isCreator = d.createdBy.id === actor.id;
  const curator = may(actor.role, 'curate');
  const steward = may(actor.role, 'lock');
  const requested = children.requests.some((r) => r.reviewer.id === actor.id);
  const blockers = lockBlockers(d, children, actor.id, view.checks);
  return {
    ...(await toSummary(manager, d, children)),
    description: d.description,
    snapshot: view.summary,
    checks: withWaivers(view.checks, children.waivers),
    reviewRequests: children.requests.map((r) => ({
      reviewer: person(r.reviewer),
      requestedBy: person(r.requestedBy),
      at: r.createdAt,
    })),
    reviews: children.reviews.map((r) => ({
      id: r.id,
      reviewer: person(r.reviewer),
      verdict: r.verdict,
      comment: r.comment,
      at: r.createdAt,
    })),
    comments: children.comments.map((c) => ({
      id: c.id,
      author: person(c.author),
      N: c.rowN,
      body: c.body,
      at: c.createdAt,
    })),
    citation: citationOf(d),
    ...authorsOf(d, children),
    can: {
      edit: d.state === 'draft' && (isCreator || may(actor.role, 'editAnyDraft')),
      editAuthors: canEditAuthors(actor, d),
      requestReview: open && (isCreator || curator),
      review: d.state === 'in_review' && requested,
      waive: open && steward,
      lock: steward && !isCreator && blockers.length === 0,
      withdraw: open && steward,
    },
    lockBlockers: steward && !isCreator ? blockers : [],
  };
}
