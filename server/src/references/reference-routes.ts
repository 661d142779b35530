import type { AppContext } from '../app-context.js';
import { CHECKERS } from '../gases/gas-access.js';
import { ANY_ROLE, type RouteSpec } from '../http/route-table.js';
import { parseId } from '../http/validate.js';
import { getReference, listReferences, uploadReference } from './reference-service.js';

/** Reference-table routes: upload (multipart field `file`), list, read. */
export function referenceRoutes(ctx: AppContext): RouteSpec[] {
  const study = (id: string | undefined) => parseId(id, 'The study');
  return [
    {
      method: 'post',
      path: '/studies/:id/references',
      access: CHECKERS,
      status: 201,
      handler: ({ actor, params, req, res }) =>
        uploadReference(ctx, actor, study(params.id), req, res),
    },
    {
      method: 'get',
      path: '/studies/:id/references',
      access: ANY_ROLE,
      handler: ({ actor, params }) => listReferences(ctx, actor, study(params.id)),
    },
    {
      method: 'get',
      path: '/references/:id',
      access: ANY_ROLE,
      handler: ({ actor, params }) =>
        getReference(ctx, actor, parseId(params.id, 'The reference table')),
    },
  ];
}
