import type { AppContext } from '../app-context.js';
import { AppError } from '../http/app-error.js';
import { PERMISSIONS, invitationAcceptSchema } from '@traceloom/shared/api';
import type { RouteSpec } from '../http/route-table.js';
import { parseInput } from '../http/validate.js';
import { acceptInvitation } from './invitation-keys.js';

/**
 * `GET /dev/mailbox` (admin): what the local mail fake received, newest first; and
 * `POST /invitations/accept` (no sign-in): the invitation mail's key sets a first password.
 */
export function mailRoutes(ctx: AppContext): RouteSpec[] {
  return [
    {
      method: 'post',
      path: '/invitations/accept',
      access: 'public',
      handler: ({ body }) => acceptInvitation(ctx, parseInput(invitationAcceptSchema, body)),
    },
    {
      method: 'get',
      path: '/dev/mailbox',
      access: PERMISSIONS.administer,
      handler: async () => {
        const fake = await ctx.services.mail.mailbox();
        if (!fake) {
          throw new AppError(
            404,
            'mailbox_off',
            'The mailbox exists only while the local mail fake is on (demo and test mode).',
          );
        }
        return fake.list();
      },
    },
  ];
}
