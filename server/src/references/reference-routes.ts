import type { AppContext } from '../app-context.js';
import { CHECKERS } from '../gases/gas-access.js';
import { ANY_ROLE, type RouteSpec } from '../http/route-table.js';
import { parseId } from '../http/validate.js';
import { deleteReference, listReferenceComparisons, patchReference } from './reference-edit.js';
import { getReference, listReferences, uploadReference } from './reference-service.js';

/** Reference-table routes: upload (multipart field `file`), list, read, edit, delete, comparisons. */
export function referenceRoutes(ctx: AppContext): RouteSpec[] {
  const study = (id: string | undefined) => parseId(id, 'The study');
  const reference = (id: string | undefined) => parseId(id, 'The reference table');
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
      handler: ({ actor, params }) => getReference(ctx, actor, reference(params.id)),
    },
    {
      method: 'patch',
      path: '/references/:id',
      access: CHECKERS,
      handler: ({ actor, params, body }) => patchReference(ctx, actor, reference(params.id), body),
    },
    {
      method: 'delete',
      path: '/references/:id',
      access: CHECKERS,
      status: 204,
      handler: ({ actor, params }) => deleteReference(ctx, actor, reference(params.id)),
    },
    {
      method: 'get',
      path: '/references/:id/comparisons',
      access: ANY_ROLE,
      handler: ({ actor, params }) => listReferenceComparisons(ctx, actor, reference(params.id)),
    },
  ];
}
