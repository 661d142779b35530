import type { AppContext } from '../app-context.js';
import { recordAudit } from '../audit/record-audit.js';
import { invitationMail } from '../datasets/dataset-mails.js';
import { Invitation, User } from '../db/entities/index.js';
import { AppError, notFound } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { invitationKey } from '../mail/invitation-keys.js';
import { mailUsers, type OutgoingMail } from '../mail/mailer.js';
import { isUnusablePasswordHash } from './password.js';

/** The answer to every reset request, whether or not the address has an account. */
export const RESET_ANSWER = {
  message:
    'If an active account has this address, a link to choose a new password is on its way (it works once, for 7 days).',
};

function resetMail(name: string, link: string): OutgoingMail {
  return {
    subject: 'Choose a new Traceloom password',
    text: `Hello ${name},\n\nSomeone (we hope you) asked to choose a new password for this Traceloom account.\nChoose it here (the link works once, for 7 days):\n${link}\nIf it was not you, ignore this mail: your password stays as it is.\n\n-- \nTraceloom\n`,
  };
}

async function newInvitation(
  ctx: AppContext,
  user: User,
  by: Pick<User, 'id'>,
  action: string,
): Promise<Invitation> {
  return ctx.dataSource.transaction(async (manager) => {
    const invitations = manager.getRepository(Invitation);
    const invitation = await invitations.save(
      invitations.create({
        email: user.email,
        role: user.role,
        invitedBy: { id: by.id },
        createdAt: new Date().toISOString(),
        acceptedAt: null,
      }),
    );
    await recordAudit(manager, {
      actorId: by.id,
      action,
      targetType: 'user',
      targetId: user.id,
      detail: { invitationId: invitation.id },
    });
    return invitation;
  });
}

function link(ctx: AppContext, invitationId: string): string {
  return `${ctx.services.mail.baseUrl}/welcome/${invitationKey(ctx, invitationId)}`;
}

/**
 * `POST /auth/password-reset` (no sign-in; behind the sign-in rate limits): mails an active
 * account a single-use link to choose a new password (the invitation mechanism). The answer is
 * the same, and comes as fast, whether or not the address has an account: the work runs after
 * the answer.
 */
export function requestPasswordReset(
  ctx: AppContext,
  email: string,
  log: (err: unknown) => void = console.error,
): typeof RESET_ANSWER {
  void (async () => {
    const user = await ctx.dataSource.getRepository(User).findOneBy({ email });
    if (!user || user.disabled) return;
    const invitation = await newInvitation(ctx, user, user, 'user.password_reset');
    await mailUsers(ctx, [user.id], resetMail(user.displayName, link(ctx, invitation.id)));
  })().catch(log);
  return RESET_ANSWER;
}

/**
 * `POST /users/:id/invitations` (admin): sends an invited person who has not chosen a password
 * yet a fresh invitation mail. 409 `already_active` once they have one (they reset it
 * themselves from the sign-in page).
 */
export async function reinviteUser(ctx: AppContext, actor: Actor, userId: string) {
  const user = await ctx.dataSource.getRepository(User).findOneBy({ id: userId });
  if (!user) throw notFound('The user');
  if (!isUnusablePasswordHash(user.passwordHash)) {
    throw new AppError(
      409,
      'already_active',
      `${user.displayName} has chosen a password; they can ask for a new one from the sign-in page.`,
    );
  }
  if (user.disabled) throw new AppError(409, 'disabled', `${user.displayName} is disabled.`);
  const invitation = await newInvitation(ctx, user, actor, 'user.reinvite');
  await mailUsers(
    ctx,
    [user.id],
    invitationMail(user.displayName, user.role, actor.displayName, link(ctx, invitation.id)),
  );
  return {
    invitation: { id: invitation.id, email: invitation.email, createdAt: invitation.createdAt },
  };
}
