/**
 * A failure the API reports to its caller: HTTP status, a stable snake_case code, a sentence for
 * people and, for bad input, the path of the offending field (e.g. `title`).
 */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly field?: string,
    /** Extra response headers, e.g. `Retry-After` on a 429. */
    readonly headers?: Readonly<Record<string, string>>,
  ) {
    super(message);
    this.name = 'AppError';
  }
}

/** 404 `not_found`, worded the same whether the thing is missing or hidden from the caller. */
export function notFound(what: string, field?: string): AppError {
  return new AppError(404, 'not_found', `${what} was not found.`, field);
}

/** 403 `forbidden`. */
export function forbidden(message = 'Your role may not do this.'): AppError {
  return new AppError(403, 'forbidden', message);
}
