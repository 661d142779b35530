import type { AuditEventDto } from '@traceloom/shared/api';
import type { AppContext } from '../app-context.js';
import { AuditEvent } from '../db/entities/index.js';
import { AppError } from '../http/app-error.js';
import type { RouteSpec } from '../http/route-table.js';

/** Most events one answer gives. */
export const AUDIT_LIMIT_MAX = 500;

function textParam(value: unknown, name: string, max: number): string | undefined {
  if (value === undefined || value === '') return undefined;
  if (typeof value !== 'string' || value.length > max) {
    throw new AppError(
      400,
      'invalid_input',
      `${name}: must be a text of at most ${max} characters.`,
      name,
    );
  }
  return value;
}

/**
 * `GET /audit?targetType=&targetId=&limit=` (steward, admin): audit events, newest first —
 * every state change, review and lock, with who did it and the details.
 */
export async function listAudit(
  ctx: AppContext,
  query: Record<string, unknown>,
): Promise<AuditEventDto[]> {
  const targetType = textParam(query.targetType, 'targetType', 32);
  const targetId = textParam(query.targetId, 'targetId', 36);
  const rawLimit = query.limit === undefined ? '100' : query.limit;
  const limit = Number(rawLimit);
  if (
    typeof rawLimit !== 'string' ||
    !/^\d{1,4}$/.test(rawLimit) ||
    limit < 1 ||
    limit > AUDIT_LIMIT_MAX
  ) {
    throw new AppError(
      400,
      'invalid_input',
      `limit: must be a whole number from 1 to ${AUDIT_LIMIT_MAX}.`,
      'limit',
    );
  }
  const where: Record<string, string> = {};
  if (targetType) where.targetType = targetType;
  if (targetId) where.targetId = targetId.toLowerCase();
  const events = await ctx.dataSource.getRepository(AuditEvent).find({
    where,
    relations: { actor: true },
    order: { createdAt: 'DESC' },
    take: limit,
  });
  return events.map((e) => ({
    id: e.id,
    action: e.action,
    targetType: e.targetType,
    targetId: e.targetId,
    actor: { id: e.actor.id, displayName: e.actor.displayName },
    detail: JSON.parse(e.detail) as Record<string, unknown>,
    createdAt: e.createdAt,
  }));
}

/** The audit log route. */
export function auditRoutes(ctx: AppContext): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/audit',
      access: ['steward', 'admin'],
      handler: ({ req }) => listAudit(ctx, req.query as Record<string, unknown>),
    },
  ];
}
