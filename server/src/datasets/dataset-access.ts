import { may } from '@traceloom/shared/api';
import { In, type EntityManager } from 'typeorm';
import { Dataset } from '../db/entities/index.js';
import { AppError, notFound } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { canSee, STUDY_RELATIONS } from '../studies/study-access.js';

/** Relations every dataset answer needs. */
export const DATASET_RELATIONS = {
  study: STUDY_RELATIONS,
  run: true,
  supersedes: true,
  createdBy: true,
  lockedBy: true,
} as const;

/** Loads a dataset whose study the actor may see; 404 `not_found` when missing or hidden. */
export async function loadVisibleDataset(
  manager: EntityManager,
  actor: Actor,
  datasetId: string,
): Promise<Dataset> {
  const dataset = await manager
    .getRepository(Dataset)
    .findOne({ where: { id: datasetId }, relations: DATASET_RELATIONS });
  if (!dataset || !canSee(actor, dataset.study)) throw notFound('The dataset');
  return dataset;
}

/**
 * Reads a dataset's snapshot and canonical text into `d` (the row is loaded without them): only
 * what exports, locks and verify need, never a page or a list.
 */
export async function withBytes<D extends Pick<Dataset, 'id' | 'snapshot' | 'canonical'>>(
  manager: EntityManager,
  d: D,
): Promise<D> {
  const bytes = await manager.getRepository(Dataset).findOneOrFail({
    where: { id: d.id },
    select: { id: true, snapshot: true, canonical: true },
  });
  d.snapshot = bytes.snapshot;
  d.canonical = bytes.canonical;
  return d;
}

/** 409 `dataset_locked`, the one answer to every write on a locked dataset, whoever asks. */
export function datasetLocked(): AppError {
  return new AppError(
    409,
    'dataset_locked',
    'This dataset is locked: it can be read, exported and verified, never changed.',
  );
}

/**
 * Refuses any write to a locked dataset (409 `dataset_locked`, for every role, admin included)
 * or a withdrawn one (409 `dataset_withdrawn`). Checked before the caller's permissions, so the
 * answer is the same for everyone.
 */
export function assertWritable(dataset: Dataset): void {
  if (dataset.state === 'locked') throw datasetLocked();
  if (dataset.state === 'withdrawn') {
    throw new AppError(
      409,
      'dataset_withdrawn',
      'This dataset was withdrawn; it can only be read.',
    );
  }
}

/** True when the error is SQLite refusing a write to a locked dataset through a trigger. */
export function isLockTrigger(err: unknown): boolean {
  return err instanceof Error && /dataset_locked/.test(err.message);
}

/** Loads the dataset, then refuses a write to it when locked or withdrawn. */
export async function loadWritableDataset(
  manager: EntityManager,
  actor: Actor,
  datasetId: string,
): Promise<Dataset> {
  const dataset = await loadVisibleDataset(manager, actor, datasetId);
  assertWritable(dataset);
  return dataset;
}

/** The columns a dataset list needs: never the snapshot or canonical bytes. */
export const DATASET_SUMMARY_SELECT = {
  id: true,
  version: true,
  title: true,
  state: true,
  hash: true,
  lockedAt: true,
  createdAt: true,
  updatedAt: true,
  study: { id: true },
  run: { id: true },
  supersedes: { id: true, version: true },
  createdBy: { id: true, displayName: true },
} as const;

/** Relations `DATASET_SUMMARY_SELECT` reads. */
export const DATASET_SUMMARY_RELATIONS = {
  study: true,
  run: true,
  supersedes: true,
  createdBy: true,
} as const;

/**
 * The datasets the actor may see (newest first; `studyId` narrows to one study), filtered by
 * access in SQL and loaded without their snapshot bytes: what a list needs.
 */
export async function listVisibleDatasets(
  manager: EntityManager,
  actor: Actor,
  studyId: string | null,
): Promise<Dataset[]> {
  const query = manager
    .getRepository(Dataset)
    .createQueryBuilder('d')
    .select('d.id', 'id')
    .innerJoin('d.study', 's');
  if (studyId !== null) query.andWhere('s.id = :studyId', { studyId });
  if (!may(actor.role, 'everyStudy')) {
    query.andWhere(
      '(s.owner_id = :me OR EXISTS (SELECT 1 FROM "study_member" m WHERE m.study_id = s.id AND m.user_id = :me))',
      { me: actor.id },
    );
  }
  const ids = (await query.getRawMany<{ id: string }>()).map((row) => row.id);
  if (ids.length === 0) return [];
  return manager.getRepository(Dataset).find({
    where: { id: In(ids) },
    select: DATASET_SUMMARY_SELECT,
    relations: DATASET_SUMMARY_RELATIONS,
    order: { createdAt: 'DESC' },
  });
}
