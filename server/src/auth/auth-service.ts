import type { LoginRequest, LoginResponse } from '@traceloom/shared/api';
import type { AppContext } from '../app-context.js';
import { recordAudit } from '../audit/record-audit.js';
import { User } from '../db/entities/index.js';
import { AppError } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { toUserDto } from '../users/user-dto.js';
import { verifyPassword } from './password.js';
import { signToken } from './tokens.js';

/**
 * Signs a person in. Unknown e-mail, wrong password and a disabled account all answer the same
 * 401 `invalid_credentials` (and take the same scrypt time); after too many failures for this
 * account + address, 429 `too_many_attempts` with `Retry-After`, even for the right password.
 */
export async function login(
  ctx: AppContext,
  input: LoginRequest,
  ip: string,
): Promise<LoginResponse> {
  const throttleKey = `${input.email}|${ip}`;
  const retryAfter = ctx.loginThrottle.retryAfterSeconds(throttleKey);
  if (retryAfter > 0) {
    throw new AppError(
      429,
      'too_many_attempts',
      `Too many failed sign-ins. Try again in ${Math.ceil(retryAfter / 60)} minute(s).`,
      undefined,
      { 'Retry-After': String(retryAfter) },
    );
  }
  const user = await ctx.dataSource.getRepository(User).findOneBy({ email: input.email });
  const matches = await verifyPassword(input.password, user?.passwordHash ?? ctx.decoyPasswordHash);
  if (!user || !matches || user.disabled) {
    ctx.loginThrottle.recordFailure(throttleKey);
    throw new AppError(401, 'invalid_credentials', 'The e-mail or password is not right.');
  }
  ctx.loginThrottle.reset(throttleKey);
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
