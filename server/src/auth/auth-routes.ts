import { PERMISSIONS, loginSchema, passwordResetSchema } from '@traceloom/shared/api';
import type { AppContext } from '../app-context.js';
import { parseId, parseInput } from '../http/validate.js';
import { ANY_ROLE, type RouteSpec } from '../http/route-table.js';
import { currentUser, login, logout } from './auth-service.js';
import { reinviteUser, requestPasswordReset } from './password-reset.js';

/** Sign-in routes, password reset by mail, and the admin's invitation resend. */
export function authRoutes(ctx: AppContext): RouteSpec[] {
  return [
    {
      method: 'post',
      path: '/auth/login',
      access: 'public',
      handler: ({ body, req }) => login(ctx, parseInput(loginSchema, body), req.ip ?? 'unknown'),
    },
    {
      method: 'post',
      path: '/auth/password-reset',
      access: 'public',
      status: 202,
      handler: ({ body }) => requestPasswordReset(ctx, parseInput(passwordResetSchema, body).email),
    },
    {
      method: 'post',
      path: '/users/:id/invitations',
      access: PERMISSIONS.administer,
      status: 201,
      handler: ({ actor, params }) => reinviteUser(ctx, actor, parseId(params.id, 'The user')),
    },
    {
      method: 'get',
      path: '/auth/me',
      access: ANY_ROLE,
      handler: ({ actor }) => currentUser(ctx, actor),
    },
    {
      method: 'post',
      path: '/auth/logout',
      access: ANY_ROLE,
      status: 204,
      handler: ({ actor }) => logout(ctx, actor),
    },
  ];
}
