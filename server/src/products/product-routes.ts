import type { AppContext } from '../app-context.js';
import { ANY_ROLE, type RouteSpec } from '../http/route-table.js';
import { productQuerySchema } from '@traceloom/shared/api';
import { parseId, parseInput } from '../http/validate.js';
import { productFormOf } from './product-service.js';

/** `GET /runs/:id/product-form`: a product form on request, for every role that sees the run. */
export function productRoutes(ctx: AppContext): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/runs/:id/product-form',
      access: ANY_ROLE,
      handler: ({ actor, params, query }) =>
        productFormOf(
          ctx,
          actor,
          parseId(params.id, 'The run'),
          parseInput(productQuerySchema, query),
        ),
    },
  ];
}
