import {
  datasetCommentSchema,
  datasetCreateSchema,
  datasetLockSchema,
  datasetPatchSchema,
  datasetReviewSchema,
  datasetWaiverSchema,
  reviewRequestSchema,
} from '@traceloom/shared/api';
import type { AppContext } from '../app-context.js';
import { GAS_EDITORS } from '../gases/gas-access.js';
import { ANY_ROLE, type RouteSpec } from '../http/route-table.js';
import { parseId, parseInput } from '../http/validate.js';
import {
  createDataset,
  deleteDataset,
  getDataset,
  listDatasets,
  patchDataset,
  reviewInbox,
} from './dataset-service.js';
import { exportDataset, importDataset, publicDataset, publicExport } from './export-service.js';
import { publicCitation } from './citation-export.js';
import { lockPreview } from './lock-preview.js';
import { lockDataset, withdrawDataset } from './lock-service.js';
import { verifyDataset } from './verify-service.js';
import { addComment, addReview, addWaiver, requestReview } from './review-service.js';

/** No body, or an empty JSON object. */
function isEmpty(body: unknown): boolean {
  return (
    body === undefined ||
    body === null ||
    (typeof body === 'object' && Object.keys(body).length === 0)
  );
}

/**
 * Dataset routes. Every write to a dataset is open to every role at the route level: the
 * handler first refuses any write to a locked dataset with 409 `dataset_locked` (the same answer
 * for everyone, admin included), then checks the caller's part (author, reviewer, steward).
 * Bodies are validated after that check, through the thunks handed to the domain functions.
 */
export function datasetRoutes(ctx: AppContext): RouteSpec[] {
  const id = (value: string | undefined) => parseId(value, 'The dataset');
  return [
    {
      method: 'post',
      path: '/runs/:id/datasets',
      access: GAS_EDITORS,
      status: 201,
      handler: ({ actor, params, body }) =>
        createDataset(
          ctx,
          actor,
          parseId(params.id, 'The run'),
          parseInput(datasetCreateSchema, body),
        ),
    },
    {
      method: 'get',
      path: '/datasets',
      access: ANY_ROLE,
      handler: ({ actor, req }) => listDatasets(ctx, actor, req.query.studyId),
    },
    {
      method: 'post',
      path: '/datasets/import',
      access: ANY_ROLE,
      handler: ({ actor, body }) => importDataset(ctx, actor, body),
    },
    {
      method: 'get',
      path: '/datasets/:id',
      access: ANY_ROLE,
      handler: ({ actor, params }) => getDataset(ctx, actor, id(params.id)),
    },
    {
      method: 'patch',
      path: '/datasets/:id',
      access: ANY_ROLE,
      handler: ({ actor, params, body }) =>
        patchDataset(ctx, actor, id(params.id), () => parseInput(datasetPatchSchema, body)),
    },
    {
      method: 'delete',
      path: '/datasets/:id',
      access: ANY_ROLE,
      handler: ({ actor, params }) => deleteDataset(ctx, actor, id(params.id)),
    },
    {
      method: 'post',
      path: '/datasets/:id/review-requests',
      access: ANY_ROLE,
      handler: ({ actor, params, body }) =>
        requestReview(ctx, actor, id(params.id), () => parseInput(reviewRequestSchema, body)),
    },
    {
      method: 'post',
      path: '/datasets/:id/comments',
      access: ANY_ROLE,
      status: 201,
      handler: ({ actor, params, body }) =>
        addComment(ctx, actor, id(params.id), () => parseInput(datasetCommentSchema, body)),
    },
    {
      method: 'post',
      path: '/datasets/:id/reviews',
      access: ANY_ROLE,
      status: 201,
      handler: ({ actor, params, body }) =>
        addReview(ctx, actor, id(params.id), () => parseInput(datasetReviewSchema, body)),
    },
    {
      method: 'post',
      path: '/datasets/:id/waivers',
      access: ANY_ROLE,
      status: 201,
      handler: ({ actor, params, body }) =>
        addWaiver(ctx, actor, id(params.id), () => parseInput(datasetWaiverSchema, body)),
    },
    {
      method: 'post',
      path: '/datasets/:id/lock',
      access: ANY_ROLE,
      handler: ({ actor, params, body }) =>
        lockDataset(ctx, actor, id(params.id), () =>
          isEmpty(body) ? undefined : parseInput(datasetLockSchema, body),
        ),
    },
    {
      method: 'get',
      path: '/datasets/:id/lock-preview',
      access: ANY_ROLE,
      handler: ({ actor, params }) => lockPreview(ctx, actor, id(params.id)),
    },
    {
      method: 'post',
      path: '/datasets/:id/withdraw',
      access: ANY_ROLE,
      handler: ({ actor, params }) => withdrawDataset(ctx, actor, id(params.id)),
    },
    {
      method: 'post',
      path: '/datasets/:id/verify',
      access: ANY_ROLE,
      handler: ({ actor, params, signal }) => verifyDataset(ctx, actor, id(params.id), signal),
    },
    {
      method: 'get',
      path: '/datasets/:id/export',
      access: ANY_ROLE,
      handler: ({ actor, params, req, res }) =>
        exportDataset(ctx, actor, id(params.id), req.query.format, res),
    },
    {
      method: 'get',
      path: '/review-requests',
      access: ANY_ROLE,
      handler: ({ actor }) => reviewInbox(ctx, actor),
    },
    {
      method: 'get',
      path: '/public/datasets/:hash',
      access: 'public',
      handler: ({ params }) => publicDataset(ctx, params.hash),
    },
    {
      method: 'get',
      path: '/public/datasets/:hash/export',
      access: 'public',
      handler: ({ params, req, res }) => publicExport(ctx, params.hash, req.query.format, res),
    },
    {
      method: 'get',
      path: '/public/datasets/:hash/citation',
      access: 'public',
      handler: ({ params, req, res }) => publicCitation(ctx, params.hash, req.query.format, res),
    },
  ];
}
