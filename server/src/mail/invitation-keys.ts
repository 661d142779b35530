import { createHmac, timingSafeEqual } from 'node:crypto';
import type { z } from 'zod';
import type { invitationAcceptSchema } from '@traceloom/shared/api';
import { IsNull } from 'typeorm';
import type { AppContext } from '../app-context.js';
import { recordAudit } from '../audit/record-audit.js';
import { hashPassword } from '../auth/password.js';
import { assertStrongPassword } from '../auth/password-policy.js';
import { Invitation, User } from '../db/entities/index.js';
import { AppError } from '../http/app-error.js';

/** How long an invitation key works. */
export const INVITATION_DAYS = 7;

function signature(key: Buffer, payload: string): string {
  return createHmac('sha256', key).update(`invitation:${payload}`).digest('base64url');
}

/** True when `sig` is the payload's signature under any key that still verifies. */
function signedByUs(ctx: AppContext, payload: string, sig: string): boolean {
  const given = Buffer.from(sig);
  return ctx.tokenKeys.all.some((key) => {
    const expected = Buffer.from(signature(key, payload));
    return given.length === expected.length && timingSafeEqual(given, expected);
  });
}

/**
 * The key an invitation mail carries: `<invitation id>.<expiry ms>.<HMAC-SHA256>` under the
 * app's 256-bit secret. Nothing is stored: the signature proves the key, and the invitation's
 * `accepted_at` makes it single-use.
 */
export function invitationKey(ctx: AppContext, invitationId: string, now = Date.now()): string {
  const payload = `${invitationId}.${now + INVITATION_DAYS * 24 * 3600 * 1000}`;
  return `${payload}.${signature(ctx.tokenSecret, payload)}`;
}

/**
 * `POST /invitations/accept` (no sign-in): the key from the mail sets the invited account's first
 * password, once, before it expires. Every refusal is the same 400 `invalid_invitation`.
 */
export async function acceptInvitation(
  ctx: AppContext,
  input: z.output<typeof invitationAcceptSchema>,
): Promise<void> {
  const refused = () =>
    new AppError(
      400,
      'invalid_invitation',
      'This invitation link is unknown, already used or expired; ask an admin for a new one.',
      'key',
    );
  const [invitationId, expires, sig] = input.key.split('.') as [string, string, string];
  if (!signedByUs(ctx, `${invitationId}.${expires}`, sig)) throw refused();
  if (Number(expires) < Date.now()) throw refused();
  // Single use, checked before the costly hash: a spent or unknown invitation costs no scrypt.
  const open = await ctx.dataSource
    .getRepository(Invitation)
    .findOneBy({ id: invitationId, acceptedAt: IsNull() });
  if (!open) throw refused();
  const person = await ctx.dataSource.getRepository(User).findOneBy({ email: open.email });
  if (!person || person.disabled) throw refused();
  assertStrongPassword(input.password, [person.email, person.displayName]);
  const passwordHash = await hashPassword(input.password, ctx.config.scrypt);
  await ctx.dataSource.transaction(async (manager) => {
    const invitations = manager.getRepository(Invitation);
    const invitation = await invitations.findOneBy({ id: invitationId, acceptedAt: IsNull() });
    if (!invitation) throw refused();
    const users = manager.getRepository(User);
    const user = await users.findOneBy({ email: invitation.email });
    if (!user || user.disabled) throw refused();
    const now = new Date().toISOString();
    const spent = await invitations.update(
      { id: invitation.id, acceptedAt: IsNull() },
      { acceptedAt: now },
    );
    if (!spent.affected) throw refused();
    await users.update({ id: user.id }, { passwordHash, tokenVersion: user.tokenVersion + 1 });
    await recordAudit(manager, {
      actorId: user.id,
      action: 'invitation.accept',
      targetType: 'invitation',
      targetId: invitation.id,
      detail: { userId: user.id },
    });
  });
}
