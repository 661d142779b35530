import type { ErrorRequestHandler, RequestHandler } from 'express';
import { AppError } from './app-error.js';

/** JSON 404 for any /api path no route answered. */
export const apiNotFound: RequestHandler = (req) => {
  throw new AppError(
    404,
    'not_found',
    `No API route for ${req.method} ${req.originalUrl.split('?')[0]}.`,
  );
};

/** JSON 404 for anything else nothing answered (e.g. a path when the client is not built). */
export const notFound: RequestHandler = (req) => {
  throw new AppError(404, 'not_found', `Nothing is served at ${req.path}.`);
};

/** Body-parser failures carry a `type`; map the ones a client can cause to clear answers. */
function fromBodyParser(err: { type?: unknown; status?: unknown }): AppError | null {
  switch (err.type) {
    case 'entity.parse.failed':
      return new AppError(400, 'invalid_json', 'The request body is not valid JSON.');
    case 'entity.too.large':
      return new AppError(413, 'payload_too_large', 'The request body is too large.');
    case 'encoding.unsupported':
    case 'charset.unsupported':
      return new AppError(
        415,
        'unsupported_encoding',
        'The request body encoding is not supported.',
      );
    default:
      return null;
  }
}

/**
 * Errors Express and Node raise for what a client sent: a path with malformed %-encoding
 * (URIError from the router), a compressed body that does not inflate (zlib `Z_*` codes), and any
 * other http-errors error marked `expose` with a 4xx status. Never a 500.
 */
function fromRequestFault(err: {
  status?: unknown;
  code?: unknown;
  expose?: unknown;
}): AppError | null {
  const status = typeof err.status === 'number' ? err.status : 0;
  if (err instanceof URIError) {
    return new AppError(400, 'invalid_path', 'The request path has malformed %-encoding.');
  }
  if (typeof err.code === 'string' && err.code.startsWith('Z_')) {
    return new AppError(
      400,
      'invalid_body',
      'The request body could not be decompressed as its Content-Encoding says.',
    );
  }
  if (err.expose === true && status >= 400 && status < 500) {
    return new AppError(status, 'invalid_request', 'The request could not be read.');
  }
  return null;
}

/**
 * The one error middleware: renders `{error: {code, message, field?}}`. Unknown errors become a
 * 500 with a generic sentence; their details go to the server log, never to the client.
 */
export function errorMiddleware(log: (err: unknown) => void = console.error): ErrorRequestHandler {
  return (err, _req, res, next) => {
    if (res.headersSent) return next(err);
    const known =
      err instanceof AppError
        ? err
        : typeof err === 'object' && err
          ? (fromBodyParser(err) ?? fromRequestFault(err))
          : null;
    if (!known) log(err);
    const appError = known ?? new AppError(500, 'internal', 'Something went wrong on the server.');
    const body: { code: string; message: string; field?: string } = {
      code: appError.code,
      message: appError.message,
    };
    if (appError.field !== undefined) body.field = appError.field;
    if (appError.headers) res.set(appError.headers);
    res.status(appError.status).json({ error: body });
  };
}
