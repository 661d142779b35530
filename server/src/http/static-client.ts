import path from 'node:path';
import express, { Router } from 'express';

/**
 * Serves the built client from `dir`, with the single-page fallback: any GET outside `/api`
 * that names no file gets `index.html`, so deep links work. Looks at the directory per request,
 * so a client built (or rebuilt) while the server runs is picked up; when there is no
 * index.html the request falls through to the JSON 404.
 */
export function staticClient(dir: string): Router {
  const root = path.resolve(dir);
  const index = path.join(root, 'index.html');
  const router = Router();
  router.use(express.static(root, { index: 'index.html', fallthrough: true }));
  router.get('/{*splat}', (req, res, next) => {
    if (req.path === '/api' || req.path.startsWith('/api/')) return next();
    res.sendFile(index, (err?: Error & { status?: number }) => {
      if (err && err.status === 404 && !res.headersSent) next();
      else if (err) next(err);
    });
  });
  return router;
}
