import { PERMISSIONS, inviteSchema, userPatchSchema } from '@traceloom/shared/api';
import type { AppContext } from '../app-context.js';
import { ANY_ROLE, type RouteSpec } from '../http/route-table.js';
import { parseId, parseInput } from '../http/validate.js';
import { inviteUser, listUsers, patchUser, userDirectory } from './user-service.js';

/** User administration (admin) and the member directory (everyone signed in). */
export function userRoutes(ctx: AppContext): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/users',
      access: PERMISSIONS.administer,
      handler: () => listUsers(ctx),
    },
    {
      method: 'post',
      path: '/users',
      access: PERMISSIONS.administer,
      status: 201,
      handler: ({ actor, body }) => inviteUser(ctx, actor, parseInput(inviteSchema, body)),
    },
    {
      method: 'get',
      path: '/users/directory',
      access: ANY_ROLE,
      handler: () => userDirectory(ctx),
    },
    {
      method: 'patch',
      path: '/users/:id',
      access: PERMISSIONS.administer,
      handler: ({ actor, params, body }) =>
        patchUser(ctx, actor, parseId(params.id, 'The user'), parseInput(userPatchSchema, body)),
    },
  ];
}
