import type { LoginRequest, LoginResponse } from '@traceloom/shared/api';
import type { AppContext } from '../app-context.js';
import { recordAudit } from '../audit/record-audit.js';
import { User } from '../db/entities/index.js';
import { AppError } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { toUserDto } from '../users/user-dto.js';
import { parsePasswordHash, verifyPassword } from './password.js';
import { signToken } from './tokens.js';

/**
 * Signs a person in. Unknown e-mail, wrong password, a disabled account and an invited account
 * without a password all answer the same 401 `invalid_credentials` after the same scrypt work
 * (the decoy hash stands in). The address and global buckets (express-rate-limit, in the
 * database) run before this; here the account's backoff answers 429 with Retry-After, and the
 * hash waits for a slot of the hashing cap.
 */
export async function login(
  ctx: AppContext,
  input: LoginRequest,
  ip: string,
): Promise<LoginResponse> {
  await ctx.accountBackoff.check(input.email);
  const user = await ctx.dataSource.getRepository(User).findOneBy({ email: input.email });
  const usable = user !== null && parsePasswordHash(user.passwordHash) !== null;
  const stored = usable ? user.passwordHash : ctx.decoyPasswordHash;
  const matches = await ctx.hashGate.run(() => verifyPassword(input.password, stored));
  if (!user || !usable || !matches || user.disabled) {
    await ctx.accountBackoff.fail(input.email);
    throw new AppError(401, 'invalid_credentials', 'The e-mail or password is not right.');
  }
  await ctx.accountBackoff.succeed(input.email);
  await recordAudit(ctx.dataSource.manager, {
    actorId: user.id,
    action: 'auth.login',
    targetType: 'user',
    targetId: user.id,
    detail: { ip },
  });
  const { token, expiresAt } = signToken(
    { sub: user.id, tv: user.tokenVersion, role: user.role },
    ctx.tokenSecret,
    ctx.config.tokenTtlSeconds,
  );
  return { token, expiresAt, user: toUserDto(user) };
}

/** Signs a person out everywhere: bumps their token version, so every token they hold stops. */
export async function logout(ctx: AppContext, actor: Actor): Promise<void> {
  await ctx.dataSource.transaction(async (manager) => {
    await manager.getRepository(User).increment({ id: actor.id }, 'tokenVersion', 1);
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'auth.logout',
      targetType: 'user',
      targetId: actor.id,
    });
  });
}

/** The signed-in person's own record. */
export async function currentUser(ctx: AppContext, actor: Actor) {
  return toUserDto(await ctx.dataSource.getRepository(User).findOneByOrFail({ id: actor.id }));
}
