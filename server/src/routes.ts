import type { AppContext } from './app-context.js';
import { auditRoutes } from './audit/audit-routes.js';
import { authRoutes } from './auth/auth-routes.js';
import { comparisonRoutes } from './comparisons/comparison-routes.js';
import { computeRoutes } from './compute/compute-routes.js';
import { datasetRoutes } from './datasets/dataset-routes.js';
import { gasRoutes } from './gases/gas-routes.js';
import { healthRoutes } from './http/health-routes.js';
import type { RouteSpec } from './http/route-table.js';
import { mailRoutes } from './mail/mail-routes.js';
import { productRoutes } from './products/product-routes.js';
import { referenceRoutes } from './references/reference-routes.js';
import { runRoutes } from './runs/run-routes.js';
import { studyRoutes } from './studies/study-routes.js';
import { userRoutes } from './users/user-routes.js';

/**
 * The whole API route table (paths below `/api`). `createApp` builds the router from it and the
 * authorization test matrix is generated from it: add a feature's routes here.
 */
export function apiRoutes(ctx: AppContext): RouteSpec[] {
  return [
    ...healthRoutes(ctx),
    ...authRoutes(ctx),
    ...userRoutes(ctx),
    ...studyRoutes(ctx),
    ...gasRoutes(ctx),
    ...computeRoutes(ctx),
    ...runRoutes(ctx),
    ...productRoutes(ctx),
    ...referenceRoutes(ctx),
    ...comparisonRoutes(ctx),
    ...datasetRoutes(ctx),
    ...auditRoutes(ctx),
    ...mailRoutes(ctx),
  ];
}
