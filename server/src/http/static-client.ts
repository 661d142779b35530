import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { Router } from 'express';

/**
 * Serves the built client from `dir`, with the single-page fallback: any GET outside `/api`
 * that names no file gets `index.html`, so deep links work. Returns null when `dir` has no
 * index.html (e.g. the client is not built).
 */
export function staticClient(dir: string): Router | null {
  const root = path.resolve(dir);
  const index = path.join(root, 'index.html');
  if (!existsSync(index)) return null;
  const router = Router();
  router.use(express.static(root, { index: 'index.html', fallthrough: true }));
  router.get('/{*splat}', (req, res, next) => {
    if (req.path === '/api' || req.path.startsWith('/api/')) return next();
    res.sendFile(index);
  });
  return router;
}
