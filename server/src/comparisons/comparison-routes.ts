import type { AppContext } from '../app-context.js';
import { CHECKERS } from '../gases/gas-access.js';
import { ANY_ROLE, type RouteSpec } from '../http/route-table.js';
import { parseId } from '../http/validate.js';
import { createComparison, listComparisons } from './comparison-service.js';

/** Comparison routes: compare a run with a reference table or its grand check; list them. */
export function comparisonRoutes(ctx: AppContext): RouteSpec[] {
  const run = (id: string | undefined) => parseId(id, 'The run');
  return [
    {
      method: 'post',
      path: '/runs/:id/comparisons',
      access: CHECKERS,
      status: 201,
      handler: ({ actor, params, body }) => createComparison(ctx, actor, run(params.id), body),
    },
    {
      method: 'get',
      path: '/runs/:id/comparisons',
      access: ANY_ROLE,
      handler: ({ actor, params }) => listComparisons(ctx, actor, run(params.id)),
    },
  ];
}
