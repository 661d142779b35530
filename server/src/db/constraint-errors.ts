import { QueryFailedError } from 'typeorm';

/**
 * True when `err` is SQLite refusing a write for a UNIQUE constraint — how a check-then-insert
 * race shows up when two requests arrive together.
 */
export function isUniqueViolation(err: unknown): boolean {
  if (!(err instanceof QueryFailedError)) return false;
  const code = (err.driverError as { code?: unknown } | undefined)?.code;
  return code === 'SQLITE_CONSTRAINT_UNIQUE' || code === 'SQLITE_CONSTRAINT_PRIMARYKEY';
}
