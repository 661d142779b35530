import { fieldLabel } from '@traceloom/shared/format';
import type { z } from 'zod';
import { AppError, notFound } from './app-error.js';

/**
 * Parses `input` with `schema` or throws 400 `invalid_input` naming the first offending field
 * (its dotted path, e.g. `title`) in `field` and the message; a gas-spec path is named in the
 * message by its label in the gas form (`spec.nMax` -> `N_max`, see `fieldLabel`).
 */
export function parseInput<S extends z.ZodType>(schema: S, input: unknown): z.output<S> {
  const result = schema.safeParse(input);
  if (result.success) return result.data;
  const issue = result.error.issues[0];
  const path = issue.path.map(String).join('.');
  if (issue.code === 'unrecognized_keys') {
    const key = issue.keys[0];
    const field = path ? `${path}.${key}` : key;
    return fail(`${fieldLabel(field)}: is not a known field.`, field);
  }
  if (path === '') {
    const message = input === undefined ? 'expected a JSON object' : issue.message;
    return fail(`Request body: ${message}.`);
  }
  return fail(`${fieldLabel(path)}: ${issue.message}.`, path);
}

function fail(message: string, field?: string): never {
  throw new AppError(400, 'invalid_input', message, field);
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A path id: a UUID, or 404 `not_found` (a malformed id names nothing that exists). */
export function parseId(value: string | undefined, what: string): string {
  if (value === undefined || !UUID.test(value)) throw notFound(what);
  return value.toLowerCase();
}
