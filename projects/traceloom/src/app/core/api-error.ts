import { HttpErrorResponse } from '@angular/common/http';

/**
 * A failed API call in the shape of the contract's error body
 * (`{ error: { code, message, field? } }`) plus the HTTP status.
 */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly field?: string,
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

interface ErrorBody {
  error?: { code?: unknown; message?: unknown; field?: unknown };
}

/**
 * Turns an HttpErrorResponse into an ApiError: the server's code, message and field when the body
 * follows the contract, otherwise a plain sentence for the status (never raw response text).
 */
export function toApiError(response: HttpErrorResponse): ApiError {
  const body = parseBody(response.error);
  const inner = body?.error;
  if (inner && typeof inner.code === 'string' && typeof inner.message === 'string') {
    const field = typeof inner.field === 'string' ? inner.field : undefined;
    return new ApiError(response.status, inner.code, inner.message, field);
  }
  if (response.status === 0) {
    return new ApiError(0, 'network_error', 'The Traceloom server could not be reached.');
  }
  return new ApiError(
    response.status,
    `http_${response.status}`,
    `The server answered with status ${response.status}.`,
  );
}

function parseBody(raw: unknown): ErrorBody | undefined {
  if (typeof raw === 'string') {
    try {
      return JSON.parse(raw) as ErrorBody;
    } catch {
      return undefined;
    }
  }
  return raw && typeof raw === 'object' ? (raw as ErrorBody) : undefined;
}

/**
 * The last segment of a contract field path (`body.title` -> `title`), to match it to a form
 * control; undefined when there is no field.
 */
export function fieldName(error: ApiError): string | undefined {
  return error.field?.split('.').pop();
}

/** A message for any thrown value, preferring the ApiError's own sentence. */
export function messageOf(error: unknown): string {
  return error instanceof ApiError ? error.message : 'Something went wrong. Please try again.';
}
