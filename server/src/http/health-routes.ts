import type { HealthDto } from '@traceloom/shared/api';
import type { AppContext } from '../app-context.js';
import { VERSION } from '../version.js';
import type { RouteSpec } from './route-table.js';

/** `GET /api/health`: no sign-in needed; 503 when the database does not answer. */
export function healthRoutes(ctx: AppContext): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/health',
      access: 'public',
      handler: async ({ res }): Promise<HealthDto> => {
        const database = await ctx.dataSource.query('SELECT 1 AS one').then(
          () => 'ok' as const,
          () => 'error' as const,
        );
        if (database !== 'ok') res.status(503);
        return {
          status: database === 'ok' ? 'ok' : 'degraded',
          version: VERSION,
          database,
          mode: ctx.config.mode,
        };
      },
    },
  ];
}
