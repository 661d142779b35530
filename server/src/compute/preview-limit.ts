import type { Request, Response } from 'express';
import { rateLimit, type RateLimitRequestHandler } from 'express-rate-limit';
import { AppError } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';

/** Previews one person may ask for per window (the editor asks at most a few times a second). */
export const PREVIEWS_PER_WINDOW = 40;
/** The window of the preview limit. */
export const PREVIEW_WINDOW_MS = 10_000;

/**
 * The per-person preview limit (express-rate-limit, in memory, keyed by the signed-in person so
 * one flood cannot starve the others). Beyond it: 429 `too_many_previews` with Retry-After.
 */
export function createPreviewLimit(
  limit = PREVIEWS_PER_WINDOW,
  windowMs = PREVIEW_WINDOW_MS,
): (req: Request, res: Response) => Promise<void> {
  const limiter: RateLimitRequestHandler = rateLimit({
    windowMs,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (_req, res) => (res.locals.actor as Actor).id,
    handler: (_req, _res, next) => {
      const seconds = Math.ceil(windowMs / 1000);
      next(
        new AppError(
          429,
          'too_many_previews',
          `Too many previews: at most ${limit} every ${seconds} s per person. Wait a moment.`,
          undefined,
          { 'Retry-After': String(seconds) },
        ),
      );
    },
  });
  return (req, res) =>
    new Promise<void>((resolve, reject) => {
      void limiter(req, res, (err?: unknown) => (err ? reject(err) : resolve()));
    });
}
