import { loginSchema } from '@traceloom/shared/api';
import type { AppContext } from '../app-context.js';
import { parseInput } from '../http/validate.js';
import { ANY_ROLE, type RouteSpec } from '../http/route-table.js';
import { currentUser, login, logout } from './auth-service.js';

/** Sign-in routes. */
export function authRoutes(ctx: AppContext): RouteSpec[] {
  return [
    {
      method: 'post',
      path: '/auth/login',
      access: 'public',
      handler: ({ body, req }) => login(ctx, parseInput(loginSchema, body), req.ip ?? 'unknown'),
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
