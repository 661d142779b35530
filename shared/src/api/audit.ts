import { z } from 'zod';
import type { DatasetPersonDto } from './datasets.js';

/** Most events one audit answer gives. */
export const AUDIT_LIMIT_MAX = 500;

const text = (max: number) =>
  z
    .string({ error: `must be a text of at most ${max} characters` })
    .max(max, `must be a text of at most ${max} characters`)
    .optional()
    .transform((v) => (v === '' ? undefined : v));

/** The query of `GET /api/audit?targetType=&targetId=&limit=` (limit 1..500, default 100). */
export const auditQuerySchema = z.looseObject({
  targetType: text(32),
  targetId: text(36),
  limit: z
    .string({ error: `must be a whole number from 1 to ${AUDIT_LIMIT_MAX}` })
    .regex(/^\d{1,4}$/, `must be a whole number from 1 to ${AUDIT_LIMIT_MAX}`)
    .transform(Number)
    .pipe(
      z
        .number()
        .min(1, `must be a whole number from 1 to ${AUDIT_LIMIT_MAX}`)
        .max(AUDIT_LIMIT_MAX, `must be a whole number from 1 to ${AUDIT_LIMIT_MAX}`),
    )
    .default(100),
});

/** An audit query as parsed. */
export type AuditQuery = z.output<typeof auditQuerySchema>;

/** One audit event. */
export interface AuditEventDto {
  id: string;
  action: string;
  targetType: string;
  targetId: string;
  actor: DatasetPersonDto;
  detail: Record<string, unknown>;
  createdAt: string;
}
