import { PERMISSIONS } from '@traceloom/shared/api';
import { once } from 'node:events';
import { Router, type Request, type RequestHandler, type Response } from 'express';
import type { Role } from '@traceloom/shared/api';
import { forbidden } from './app-error.js';

/** The signed-in person behind a request, as loaded from the database for that request. */
export interface Actor {
  id: string;
  email: string;
  displayName: string;
  role: Role;
}

/** What a route handler receives. */
export interface RouteContext {
  /** The signed-in person; `null` only on public routes. */
  actor: Actor | null;
  params: Record<string, string>;
  /** The parsed query string (routes validate it with a schema before a service sees it). */
  query: Record<string, unknown>;
  body: unknown;
  /** Aborts when the client goes away before the answer is written (cancel its work then). */
  signal: AbortSignal;
  req: Request;
  res: Response;
}

/** A signed-in context, as protected routes receive it. */
export interface ActorContext extends RouteContext {
  actor: Actor;
}

/**
 * A JSON answer written piece by piece from stored JSON bytes, never parsed or re-serialized on
 * the main thread; a handler returns it instead of a value. The router writes each piece as it
 * comes and waits for the socket to drain, so a large answer is never held whole.
 */
export class JsonPieces {
  constructor(readonly pieces: AsyncIterable<Buffer | string>) {}
}

/** HTTP methods the route table knows. */
export type HttpMethod = 'get' | 'post' | 'put' | 'patch' | 'delete';

/**
 * One API route: the single place that says who may call it. The router is built from these
 * entries and the authorization test matrix is generated from the same list, so a route cannot
 * exist without a matrix entry.
 */
export interface RouteSpec {
  method: HttpMethod;
  /** Express path below `/api`, e.g. `/studies/:id`. */
  path: string;
  /** `public` needs no token; otherwise the roles allowed past the route-level check. */
  access: 'public' | readonly Role[];
  /** Success status; defaults to 200, or 204 when the handler returns nothing. */
  status?: number;
  handler: (ctx: ActorContext) => unknown;
}

/** Every role, for routes any signed-in person may call (resource checks may still refuse). */
export const ANY_ROLE: readonly Role[] = PERMISSIONS.signedIn;

/** `METHOD /path`, the key tests and logs use for a route. */
export function routeKey(route: Pick<RouteSpec, 'method' | 'path'>): string {
  return `${route.method.toUpperCase()} ${route.path}`;
}

/**
 * Builds an Express router from the table: public routes run directly; protected ones run
 * `authenticate` (which sets `res.locals.actor` or answers 401), then the role check (403).
 */
export function buildRouter(routes: readonly RouteSpec[], authenticate: RequestHandler): Router {
  const router = Router();
  for (const route of routes) {
    const guards: RequestHandler[] =
      route.access === 'public' ? [] : [authenticate, requireRole(route.access)];
    router[route.method](route.path, ...guards, async (req, res) => {
      res.status(route.status ?? 200);
      const gone = new AbortController();
      res.once('close', () => {
        if (!res.writableFinished) gone.abort(new Error('the client went away'));
      });
      const ctx = {
        actor: (res.locals.actor as Actor | undefined) ?? null,
        params: req.params as Record<string, string>,
        query: req.query as Record<string, unknown>,
        body: req.body as unknown,
        signal: gone.signal,
        req,
        res,
      };
      const result = await route.handler(ctx as ActorContext);
      if (result instanceof JsonPieces) {
        res.type('application/json');
        for await (const piece of result.pieces) {
          if (!res.write(piece)) await once(res, 'drain');
        }
        res.end();
      } else if (result === undefined) {
        if (res.statusCode === 200) res.status(204);
        res.end();
      } else {
        res.json(result);
      }
    });
  }
  return router;
}

function requireRole(allowed: readonly Role[]): RequestHandler {
  return (_req, res, next) => {
    const actor = res.locals.actor as Actor | undefined;
    if (!actor || !allowed.includes(actor.role)) throw forbidden();
    next();
  };
}
