import { copyFileSync, existsSync, renameSync, rmSync } from 'node:fs';
import Database from 'better-sqlite3';
import { MIGRATIONS } from './migrations/index.js';

/** What a backup wrote. */
export interface BackupReport {
  file: string;
  bytes: number;
  /** Migrations the copy is at (its level). */
  migrations: number;
}

function integrityOf(db: Database.Database): string {
  const rows = db.pragma('integrity_check') as Array<{ integrity_check: string }>;
  return rows.map((r) => r.integrity_check).join('; ');
}

/**
 * The migration level of a database file: the number of committed migrations it has applied.
 * Throws when it has one this code does not know (a copy from a newer Traceloom) or applied
 * them out of order.
 */
function migrationLevel(db: Database.Database, file: string): number {
  const hasTable = db
    .prepare(`SELECT 1 FROM sqlite_master WHERE type = 'table' AND name = 'migrations'`)
    .get();
  if (!hasTable) throw new Error(`${file}: not a Traceloom database (no migrations table)`);
  const names = (
    db.prepare('SELECT name FROM migrations ORDER BY id').all() as Array<{ name: string }>
  ).map((r) => r.name);
  const known = MIGRATIONS.map((m) => m.name);
  names.forEach((name, i) => {
    if (known[i] !== name) {
      throw new Error(
        known.includes(name)
          ? `${file}: migrations applied out of order at ${name}`
          : `${file}: migration ${name} is unknown to this version of Traceloom (a newer copy?)`,
      );
    }
  });
  return names.length;
}

function checkCopy(file: string): number {
  let db: Database.Database | null = null;
  try {
    db = new Database(file, { readonly: true, fileMustExist: true });
    const verdict = integrityOf(db);
    if (verdict !== 'ok') throw new Error(`${file}: the integrity check failed: ${verdict}`);
    return migrationLevel(db, file);
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    throw new Error(message.startsWith(file) ? message : `${file}: ${message}`);
  } finally {
    db?.close();
  }
}

/**
 * Copies the live database `livePath` to `dest` with SQLite's online backup API (a consistent
 * copy while the server keeps serving: every commit acknowledged before the backup started is
 * in it), through a temporary file renamed into place once the copy passed its integrity check.
 */
export async function backupDatabase(livePath: string, dest: string): Promise<BackupReport> {
  const source = new Database(livePath, { fileMustExist: true, timeout: 5000 });
  const tmp = `${dest}.partial`;
  rmSync(tmp, { force: true });
  try {
    await source.backup(tmp);
  } finally {
    source.close();
  }
  try {
    // A single self-contained file: the copy leaves WAL mode (the restored server sets it again).
    const copy = new Database(tmp);
    copy.pragma('journal_mode = DELETE');
    copy.close();
    const migrations = checkCopy(tmp);
    renameSync(tmp, dest);
    const db = new Database(dest, { readonly: true });
    const bytes =
      (db.pragma('page_count', { simple: true }) as number) *
      (db.pragma('page_size', { simple: true }) as number);
    db.close();
    return { file: dest, bytes, migrations };
  } catch (err) {
    rmSync(tmp, { force: true });
    throw err;
  }
}

/** Throws when another connection (a running server) has the database open. */
function assertNotInUse(livePath: string): void {
  if (!existsSync(livePath)) return;
  const db = new Database(livePath, { timeout: 200 });
  try {
    db.pragma('locking_mode = EXCLUSIVE');
    db.exec('BEGIN EXCLUSIVE');
    db.exec('COMMIT');
    // Fold the journal into the file so nothing of the old database is left beside it.
    db.pragma('wal_checkpoint(TRUNCATE)');
  } catch {
    throw new Error(`${livePath} is in use: stop the Traceloom server before restoring`);
  } finally {
    db.close();
  }
}

/**
 * Restores `backupFile` as the database at `livePath` (the server must be stopped): checks the
 * backup's integrity and migration level first, refuses while the database is open elsewhere,
 * keeps the database it replaces as `<livePath>.before-restore-<time>` and moves the copy in
 * atomically. Returns where the replaced database was kept (null when there was none).
 */
export function restoreDatabase(
  backupFile: string,
  livePath: string,
  now = new Date(),
): string | null {
  if (!existsSync(backupFile)) throw new Error(`${backupFile}: no such file`);
  checkCopy(backupFile);
  assertNotInUse(livePath);
  const tmp = `${livePath}.restoring`;
  copyFileSync(backupFile, tmp);
  let kept: string | null = null;
  if (existsSync(livePath)) {
    kept = `${livePath}.before-restore-${now.toISOString().replace(/[:.]/g, '-')}`;
    renameSync(livePath, kept);
  }
  for (const suffix of ['-wal', '-shm']) rmSync(`${livePath}${suffix}`, { force: true });
  renameSync(tmp, livePath);
  return kept;
}
