import type { RequestHandler } from 'express';
import { AppError } from './app-error.js';
import type { RouteSpec } from './route-table.js';

/** Deepest nesting of arrays and objects a JSON request body may have. */
export const MAX_JSON_DEPTH = 64;

/** `Cache-Control: no-store` on every API answer: tokens, studies and results stay out of caches. */
export const noStore: RequestHandler = (_req, res, next) => {
  res.set('Cache-Control', 'no-store');
  next();
};

/** True when `value` nests arrays/objects deeper than `max` (checked without recursion). */
export function nestedDeeperThan(value: unknown, max: number): boolean {
  const stack: Array<[unknown, number]> = [[value, 1]];
  while (stack.length > 0) {
    const [item, depth] = stack.pop()!;
    if (item === null || typeof item !== 'object') continue;
    if (depth > max) return true;
    for (const child of Object.values(item)) {
      if (child !== null && typeof child === 'object') stack.push([child, depth + 1]);
    }
  }
  return false;
}

/** 400 `too_deep` for a parsed JSON body nested deeper than `MAX_JSON_DEPTH`, before any route. */
export const jsonDepthGuard: RequestHandler = (req, _res, next) => {
  if (nestedDeeperThan(req.body, MAX_JSON_DEPTH)) {
    throw new AppError(
      400,
      'too_deep',
      `The request body nests lists and objects more than ${MAX_JSON_DEPTH} levels deep.`,
    );
  }
  next();
};

function pathPattern(path: string): RegExp {
  const escaped = path
    .split('/')
    .map((part) => (part.startsWith(':') ? '[^/]+' : part.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')))
    .join('/');
  return new RegExp(`^${escaped}/?$`);
}

/**
 * For an /api path the table knows under other methods: 405 `method_not_allowed` with `Allow`
 * listing them (HEAD beside GET, as Express answers it); unknown paths fall through to the 404.
 */
export function methodNotAllowed(routes: readonly RouteSpec[]): RequestHandler {
  const patterns = routes.map((r) => ({ method: r.method.toUpperCase(), re: pathPattern(r.path) }));
  return (req, _res, next) => {
    const allowed = new Set(patterns.filter((p) => p.re.test(req.path)).map((p) => p.method));
    if (allowed.size === 0 || allowed.has(req.method)) return next();
    if (allowed.has('GET')) allowed.add('HEAD');
    const allow = [...allowed].sort().join(', ');
    throw new AppError(
      405,
      'method_not_allowed',
      `${req.method} is not allowed on ${req.path}; use ${allow}.`,
      undefined,
      { Allow: allow },
    );
  };
}
