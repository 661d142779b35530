import type { DataSource } from 'typeorm';

/** Oldest SQLite accepted: 3.51.3 fixes a WAL-reset corruption bug (SQLite release notes). */
export const MIN_SQLITE_VERSION = '3.51.3';

/** Compares dotted version strings numerically; negative when `a` is older than `b`. */
export function compareVersions(a: string, b: string): number {
  const pa = a.split('.').map(Number);
  const pb = b.split('.').map(Number);
  for (let i = 0; i < Math.max(pa.length, pb.length); i++) {
    const diff = (pa[i] ?? 0) - (pb[i] ?? 0);
    if (diff !== 0) return diff;
  }
  return 0;
}

/**
 * Refuses to start on a bundled SQLite older than 3.51.3 or a database whose
 * `PRAGMA integrity_check` is not `ok`. Returns the SQLite version.
 */
export async function assertDatabaseHealthy(dataSource: DataSource): Promise<string> {
  const [{ version }] = (await dataSource.query('SELECT sqlite_version() AS version')) as Array<{
    version: string;
  }>;
  if (compareVersions(version, MIN_SQLITE_VERSION) < 0) {
    throw new Error(
      `SQLite ${version} is too old: Traceloom needs ${MIN_SQLITE_VERSION} or newer.`,
    );
  }
  const rows = (await dataSource.query('PRAGMA integrity_check')) as Array<{
    integrity_check: string;
  }>;
  const verdict = rows.map((row) => row.integrity_check).join('; ');
  if (verdict !== 'ok') throw new Error(`The database failed its integrity check: ${verdict}`);
  return version;
}
