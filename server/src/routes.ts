import type { AppContext } from './app-context.js';
import { authRoutes } from './auth/auth-routes.js';
import { healthRoutes } from './http/health-routes.js';
import type { RouteSpec } from './http/route-table.js';
import { studyRoutes } from './studies/study-routes.js';
import { userRoutes } from './users/user-routes.js';

/**
 * The whole API route table (paths below `/api`). `createApp` builds the router from it and the
 * authorization test matrix is generated from it: add a feature's routes here.
 */
export function apiRoutes(ctx: AppContext): RouteSpec[] {
  return [...healthRoutes(ctx), ...authRoutes(ctx), ...userRoutes(ctx), ...studyRoutes(ctx)];
}
