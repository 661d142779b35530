import type { AppContext } from '../app-context.js';
import { AppError } from '../http/app-error.js';
import type { RouteSpec } from '../http/route-table.js';
import { mailServices } from './mailer.js';

/** `GET /dev/mailbox` (admin): what the local mail fake received, newest first. */
export function mailRoutes(ctx: AppContext): RouteSpec[] {
  const services = mailServices(ctx);
  return [
    {
      method: 'get',
      path: '/dev/mailbox',
      access: ['admin'],
      handler: async () => {
        await services.ready;
        if (!services.fake) {
          throw new AppError(
            404,
            'mailbox_off',
            'The mailbox exists only while the local mail fake is on (demo and test mode).',
          );
        }
        return services.fake.list();
      },
    },
  ];
}
