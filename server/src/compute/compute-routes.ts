import type { AppContext } from '../app-context.js';
import { parseGasBody } from '../gases/gas-input.js';
import { ANY_ROLE, type RouteSpec } from '../http/route-table.js';
import { createPreviewLimit } from './preview-limit.js';
import { assertPreviewSize, previewCompute } from './preview.js';
import { estimateSpec } from './run-estimate.js';

/**
 * `POST /compute`: the live preview, limited per person; `POST /compute/estimate`: a run's cost
 * and order advice. Both are open to every signed-in role and store nothing.
 */
export function computeRoutes(ctx: AppContext): RouteSpec[] {
  const limit = createPreviewLimit(
    ctx.config.previewLimit?.limit,
    ctx.config.previewLimit?.windowMs,
  );
  return [
    {
      method: 'post',
      path: '/compute',
      access: ANY_ROLE,
      handler: async ({ body, req, res }) => {
        // Bad input is refused on the main path at once and does not count against the limit.
        const spec = parseGasBody(body);
        assertPreviewSize(spec);
        await limit(req, res);
        return previewCompute(ctx, spec);
      },
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
