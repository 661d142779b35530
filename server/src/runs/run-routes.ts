import { z } from 'zod';
import type { AppContext } from '../app-context.js';
import { GAS_EDITORS } from '../gases/gas-access.js';
import { ANY_ROLE, type RouteSpec } from '../http/route-table.js';
import { parseId, parseInput } from '../http/validate.js';
import { streamRunEvents, type StreamToken } from './run-events.js';
import { AppError } from '../http/app-error.js';
import { cancelRun, getRun, listRuns, startRun, type RunQuery } from './run-service.js';

const runStartSchema = z.strictObject({
  version: z
    .number({ error: 'must be a version number' })
    .int({ error: 'must be a whole number' })
    .min(1, { error: 'must be at least 1' })
    .optional(),
});

/** A whole number from 0 to 999 in a query parameter, or null when absent. */
function queryNumber(raw: unknown, field: string, what: string): number | null {
  if (raw === undefined) return null;
  if (typeof raw !== 'string' || !/^\d{1,3}$/.test(raw)) {
    throw new AppError(400, 'invalid_input', `${field}: must be a whole number ${what}.`, field);
  }
  return Number(raw);
}

/** `?classes=N&classPage=k` of a run read; a page needs its N. */
function runQuery(query: Record<string, unknown>): RunQuery {
  const classes = queryNumber(query['classes'], 'classes', 'N');
  const classPage = queryNumber(query['classPage'], 'classPage', '(a page index from 0)');
  if (classPage !== null && classes === null) {
    throw new AppError(400, 'invalid_input', 'classPage: needs classes=N as well.', 'classPage');
  }
  return { classes, classPage };
}

/** Run routes: start, list, read, watch (server-sent events) and cancel. */
export function runRoutes(ctx: AppContext): RouteSpec[] {
  const gas = (id: string | undefined) => parseId(id, 'The gas');
  const run = (id: string | undefined) => parseId(id, 'The run');
  return [
    {
      method: 'post',
      path: '/gases/:id/runs',
      access: GAS_EDITORS,
      status: 202,
      handler: ({ actor, params, body }) =>
        startRun(ctx, actor, gas(params.id), parseInput(runStartSchema, body ?? {})),
    },
    {
      method: 'get',
      path: '/gases/:id/runs',
      access: ANY_ROLE,
      handler: ({ actor, params }) => listRuns(ctx, actor, gas(params.id)),
    },
    {
      method: 'get',
      path: '/runs/:id',
      access: ANY_ROLE,
      handler: ({ actor, params, req }) => getRun(ctx, actor, run(params.id), runQuery(req.query)),
    },
    {
      method: 'get',
      path: '/runs/:id/events',
      access: ANY_ROLE,
      handler: ({ actor, params, res }) =>
        streamRunEvents(ctx, actor, res.locals.token as StreamToken, run(params.id), res),
    },
    {
      method: 'post',
      path: '/runs/:id/cancel',
      access: GAS_EDITORS,
      handler: ({ actor, params }) => cancelRun(ctx, actor, run(params.id)),
    },
  ];
}
