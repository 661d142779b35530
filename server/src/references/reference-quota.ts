import type { EntityManager } from 'typeorm';
import { ReferenceTable } from '../db/entities/index.js';
import { AppError } from '../http/app-error.js';
import { sizeText as size } from './reference-density.js';

/** How much reference-table data a study and a person may keep. */
export interface ReferenceQuota {
  /** Tables one study may hold. */
  studyTables: number;
  /** Uploaded bytes one study may hold. */
  studyBytes: number;
  /** Tables one person may have uploaded (all studies together). */
  userTables: number;
  /** Uploaded bytes one person may have uploaded (all studies together). */
  userBytes: number;
}

const MB = 1024 * 1024;

/** The defaults (docs/operations.md); deleting a table gives its share back. */
export const DEFAULT_REFERENCE_QUOTA: ReferenceQuota = {
  studyTables: 200,
  studyBytes: 50 * MB,
  userTables: 300,
  userBytes: 100 * MB,
};

async function usage(
  manager: EntityManager,
  column: 'study_id' | 'created_by_id',
  id: string,
): Promise<{ tables: number; bytes: number }> {
  const row = await manager
    .getRepository(ReferenceTable)
    .createQueryBuilder('r')
    .select('count(*)', 'tables')
    .addSelect('coalesce(sum(r.size_bytes), 0)', 'bytes')
    .where(`r.${column} = :id`, { id })
    .getRawOne<{ tables: number; bytes: number }>();
  return { tables: Number(row?.tables ?? 0), bytes: Number(row?.bytes ?? 0) };
}

/**
 * Refuses a new table of `bytes` that would take the study or its uploader past a quota:
 * 429 `too_many_references` for the count, 413 `reference_quota` for the bytes, each naming
 * `file`, the limit and how to free room. Counts what is stored now, so deletions give room back.
 */
export async function assertWithinQuota(
  manager: EntityManager,
  quota: ReferenceQuota,
  who: { userId: string; studyId: string },
  bytes: number,
): Promise<void> {
  const checks = [
    {
      owner: 'This study',
      used: await usage(manager, 'study_id', who.studyId),
      tables: quota.studyTables,
      bytesCap: quota.studyBytes,
    },
    {
      owner: 'You',
      used: await usage(manager, 'created_by_id', who.userId),
      tables: quota.userTables,
      bytesCap: quota.userBytes,
    },
  ];
  for (const { owner, used, tables, bytesCap } of checks) {
    const has = owner === 'You' ? 'have uploaded' : 'holds';
    if (used.tables + 1 > tables) {
      throw new AppError(
        429,
        'too_many_references',
        `file: ${owner} ${has} ${used.tables} reference tables, the limit is ${tables}; delete one no locked dataset uses first. Nothing was stored.`,
        'file',
      );
    }
    if (used.bytes + bytes > bytesCap) {
      throw new AppError(
        413,
        'reference_quota',
        `file: ${owner} ${has} ${size(used.bytes)} of reference tables; with this file (${size(bytes)}) that is more than the limit of ${size(bytesCap)}. Delete a table no locked dataset uses first. Nothing was stored.`,
        'file',
      );
    }
  }
}
