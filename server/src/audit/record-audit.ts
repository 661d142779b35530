import type { EntityManager } from 'typeorm';
import { AuditEvent } from '../db/entities/index.js';

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

/**
 * Writes an audit event through `manager` — pass the transaction's manager so the event commits
 * or rolls back with the change it describes.
 */
export async function recordAudit(manager: EntityManager, entry: AuditEntry): Promise<void> {
  await manager.getRepository(AuditEvent).insert({
    actor: { id: entry.actorId },
    action: entry.action,
    targetType: entry.targetType,
    targetId: entry.targetId,
    detail: JSON.stringify(entry.detail ?? {}),
    createdAt: new Date().toISOString(),
  });
}
