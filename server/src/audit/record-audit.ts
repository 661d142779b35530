import type { EntityManager } from 'typeorm';
import { AuditEvent } from '../db/entities/index.js';
import { studyOfTargetSql } from './audit-study.js';

/** What one audit event says. */
export interface AuditEntry {
  actorId: string;
  /** Dotted action name, e.g. `study.create`. */
  action: string;
  targetType:
    'user' | 'study' | 'invitation' | 'gas' | 'run' | 'reference' | 'comparison' | 'dataset';
  targetId: string;
  detail?: Record<string, unknown>;
}

async function studyOf(manager: EntityManager, entry: AuditEntry): Promise<string | null> {
  const sql = studyOfTargetSql(entry.targetType, '?');
  if (!sql) return null;
  const rows = (await manager.query(`SELECT ${sql} AS "studyId"`, [entry.targetId])) as Array<{
    studyId: string | null;
  }>;
  return rows[0]?.studyId ?? null;
}

/**
 * Writes an audit event through `manager` — pass the transaction's manager so the event commits
 * or rolls back with the change it describes. The event stores the study its target belongs to
 * (looked up here), which decides who may read it.
 */
export async function recordAudit(manager: EntityManager, entry: AuditEntry): Promise<void> {
  await manager.getRepository(AuditEvent).insert({
    actor: { id: entry.actorId },
    action: entry.action,
    targetType: entry.targetType,
    targetId: entry.targetId,
    studyId: await studyOf(manager, entry),
    detail: JSON.stringify(entry.detail ?? {}),
    createdAt: new Date().toISOString(),
  });
}
