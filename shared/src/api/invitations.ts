import { z } from 'zod';
import { API_LIMITS } from './fields.js';

/** Body of `POST /api/invitations/accept`: the key from the invitation mail and a first password. */
export const invitationAcceptSchema = z.strictObject({
  key: z
    .string({ error: 'must be the key from the invitation mail' })
    .max(200, 'must be the key from the invitation mail')
    .regex(
      /^[0-9a-f-]{36}\.\d{13}\.[A-Za-z0-9_-]{43}$/,
      'must be the key from the invitation mail',
    ),
  password: z
    .string({ error: 'must be a text value' })
    .min(12, 'must be at least 12 characters')
    .max(API_LIMITS.passwordMax, `must be at most ${API_LIMITS.passwordMax} characters`),
});
