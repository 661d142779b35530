import type { AppContext } from '../app-context.js';
import { parseGasBody } from '../gases/gas-input.js';
import { ANY_ROLE, type RouteSpec } from '../http/route-table.js';
import { previewCompute } from './preview.js';

/** `POST /compute`: the live preview, open to every signed-in role (it stores nothing). */
export function computeRoutes(ctx: AppContext): RouteSpec[] {
  return [
    {
      method: 'post',
      path: '/compute',
      access: ANY_ROLE,
      handler: ({ body }) => previewCompute(ctx, parseGasBody(body)),
    },
  ];
}
