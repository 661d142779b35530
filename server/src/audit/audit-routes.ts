import { PERMISSIONS, may } from '@traceloom/shared/api';
import { auditQuerySchema, type AuditEventDto, type AuditQuery } from '@traceloom/shared/api';
import { parseInput } from '../http/validate.js';
import type { AppContext } from '../app-context.js';
import { AuditEvent } from '../db/entities/index.js';
import type { Actor, RouteSpec } from '../http/route-table.js';
import { ADMIN_ONLY_DETAIL_KEYS } from './audit-study.js';

/**
 * `GET /audit?targetType=&targetId=&limit=` (steward, admin): audit events, newest first —
 * every state change, review and lock, with who did it and the details. An admin reads every
 * event; a steward only the events of studies they own or belong to, without e-mail or network
 * addresses (events about users and invitations belong to no study: admins only).
 */
export async function listAudit(
  ctx: AppContext,
  actor: Actor,
  { targetType, targetId, limit }: AuditQuery,
): Promise<AuditEventDto[]> {
  const qb = ctx.dataSource
    .getRepository(AuditEvent)
    .createQueryBuilder('e')
    .innerJoinAndSelect('e.actor', 'actor')
    .orderBy('e.createdAt', 'DESC')
    .take(limit);
  if (targetType) qb.andWhere('e.targetType = :targetType', { targetType });
  if (targetId) qb.andWhere('e.targetId = :targetId', { targetId: targetId.toLowerCase() });
  const admin = may(actor.role, 'everyStudy');
  if (!admin) {
    // Scoped in SQL: only events of studies the reader owns or is a member of.
    qb.andWhere(
      `e.studyId IN (SELECT s."id" FROM "study" s WHERE s."owner_id" = :me
        UNION SELECT m."study_id" FROM "study_member" m WHERE m."user_id" = :me)`,
      { me: actor.id },
    );
  }
  const events = await qb.getMany();
  return events.map((e) => {
    const detail = JSON.parse(e.detail) as Record<string, unknown>;
    return {
      id: e.id,
      action: e.action,
      targetType: e.targetType,
      targetId: e.targetId,
      actor: { id: e.actor.id, displayName: e.actor.displayName },
      detail: admin ? detail : withoutAddresses(detail),
      createdAt: e.createdAt,
    };
  });
}

/** `detail` without the keys that carry e-mail or network addresses (at any depth). */
export function withoutAddresses(detail: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(detail)) {
    if (ADMIN_ONLY_DETAIL_KEYS.includes(key)) continue;
    out[key] =
      value && typeof value === 'object' && !Array.isArray(value)
        ? withoutAddresses(value as Record<string, unknown>)
        : value;
  }
  return out;
}

/** The audit log route. */
export function auditRoutes(ctx: AppContext): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/audit',
      access: PERMISSIONS.readAudit,
      handler: ({ actor, query }) => listAudit(ctx, actor, parseInput(auditQuerySchema, query)),
    },
  ];
}
