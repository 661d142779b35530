import type {
  DirectoryEntryDto,
  InviteRequest,
  InviteResponse,
  UserDto,
  UserPatchRequest,
} from '@traceloom/shared/api';
import type { AppContext } from '../app-context.js';
import { recordAudit } from '../audit/record-audit.js';
import { unusablePasswordHash } from '../auth/password.js';
import { isUniqueViolation } from '../db/constraint-errors.js';
import { Invitation, User } from '../db/entities/index.js';
import { AppError, notFound } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { invitationMail } from '../datasets/dataset-mails.js';
import { invitationKey } from '../mail/invitation-keys.js';
import { mailUsers } from '../mail/mailer.js';
import { toDirectoryEntry, toUserDto } from './user-dto.js';

/** Every user, oldest first (admin view). */
export async function listUsers(ctx: AppContext): Promise<UserDto[]> {
  const users = await ctx.dataSource.getRepository(User).find({ order: { createdAt: 'ASC' } });
  return users.map(toUserDto);
}

/** Active (not disabled) users by name, for choosing study members. */
export async function userDirectory(ctx: AppContext): Promise<DirectoryEntryDto[]> {
  const users = await ctx.dataSource
    .getRepository(User)
    .find({ where: { disabled: false }, order: { displayName: 'ASC' } });
  return users.map(toDirectoryEntry);
}

/**
 * Invites a person: creates their account with an unusable password, records the invitation and
 * mails the invitation to the new account's address (from the database). 409 `email_taken` when
 * the address already has an account.
 */
export async function inviteUser(
  ctx: AppContext,
  actor: Actor,
  input: InviteRequest,
): Promise<InviteResponse> {
  const emailTaken = () =>
    new AppError(409, 'email_taken', 'An account with this e-mail already exists.', 'email');
  const answer = await ctx.dataSource
    .transaction(async (manager) => {
      const users = manager.getRepository(User);
      if (await users.existsBy({ email: input.email })) throw emailTaken();
      const now = new Date().toISOString();
      const user = await users.save(
        users.create({
          email: input.email,
          displayName: input.displayName,
          role: input.role,
          passwordHash: unusablePasswordHash(),
          tokenVersion: 0,
          disabled: false,
          createdAt: now,
        }),
      );
      const invitations = manager.getRepository(Invitation);
      const invitation = await invitations.save(
        invitations.create({
          email: input.email,
          role: input.role,
          invitedBy: { id: actor.id },
          createdAt: now,
          acceptedAt: null,
        }),
      );
      await recordAudit(manager, {
        actorId: actor.id,
        action: 'user.invite',
        targetType: 'user',
        targetId: user.id,
        detail: { email: input.email, role: input.role, invitationId: invitation.id },
      });
      return {
        user: toUserDto(user),
        invitation: { id: invitation.id, email: invitation.email, createdAt: invitation.createdAt },
      };
    })
    .catch((err: unknown) => {
      throw isUniqueViolation(err) ? emailTaken() : err;
    });
  const link = `${ctx.services.mail.baseUrl}/welcome/${invitationKey(ctx, answer.invitation.id)}`;
  await mailUsers(
    ctx,
    [answer.user.id],
    invitationMail(answer.user.displayName, answer.user.role, actor.displayName, link),
  );
  return answer;
}

/**
 * Changes a user's role, disabled flag or display name. A role change or disabling revokes the
 * user's tokens (token version + 1). Admins cannot demote or disable themselves (400
 * `self_change`), so there is always someone left to undo a mistake.
 */
export async function patchUser(
  ctx: AppContext,
  actor: Actor,
  userId: string,
  patch: UserPatchRequest,
): Promise<UserDto> {
  return ctx.dataSource.transaction(async (manager) => {
    const users = manager.getRepository(User);
    const user = await users.findOneBy({ id: userId });
    if (!user) throw notFound('The user');
    const roleChanges = patch.role !== undefined && patch.role !== user.role;
    const disabling = patch.disabled === true && !user.disabled;
    if (user.id === actor.id && (roleChanges || patch.disabled === true)) {
      const field = roleChanges ? 'role' : 'disabled';
      throw new AppError(
        400,
        'self_change',
        'You cannot change your own role or disable yourself.',
        field,
      );
    }
    const before = {
      role: user.role,
      disabled: Boolean(user.disabled),
      displayName: user.displayName,
    };
    if (patch.role !== undefined) user.role = patch.role;
    if (patch.disabled !== undefined) user.disabled = patch.disabled;
    if (patch.displayName !== undefined) user.displayName = patch.displayName;
    if (roleChanges || disabling) user.tokenVersion += 1;
    await users.save(user);
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'user.update',
      targetType: 'user',
      targetId: user.id,
      detail: { before, after: patch },
    });
    return toUserDto(user);
  });
}
