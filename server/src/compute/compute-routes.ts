import type { AppContext } from '../app-context.js';
import { parseGasBody } from '../gases/gas-input.js';
import { ANY_ROLE, type RouteSpec } from '../http/route-table.js';
import { previewCompute } from './preview.js';
import { estimateSpec } from './run-estimate.js';

/**
 * `POST /compute`: the live preview; `POST /compute/estimate`: a run's cost and order advice. Both
 * are open to every signed-in role and store nothing.
 */
export function computeRoutes(ctx: AppContext): RouteSpec[] {
  return [
    {
      method: 'post',
      path: '/compute',
      access: ANY_ROLE,
      handler: ({ body }) => previewCompute(ctx, parseGasBody(body)),
    },
    {
      // what a run of the spec would cost and determine (the editor's warning), stores nothing
      method: 'post',
      path: '/compute/estimate',
      access: ANY_ROLE,
      handler: ({ body }) => estimateSpec(ctx, parseGasBody(body)),
    },
  ];
}
