import { mkdirSync, readdirSync, rmSync } from 'node:fs';
import path from 'node:path';
import { backupDatabase, type BackupReport } from './backup.js';

/** Scheduled backups: where, how often, how many kept. */
export interface BackupSchedule {
  dir: string;
  everyHours: number;
  keep: number;
}

const NAME = /^traceloom-\d{8}T\d{6}Z\.sqlite$/;

/** `traceloom-20261202T183000Z.sqlite` for `now`: names sort by time. */
export function backupName(now: Date): string {
  return `traceloom-${now
    .toISOString()
    .replace(/[-:]/g, '')
    .replace(/\.\d{3}/, '')}.sqlite`;
}

/** Deletes the oldest scheduled backups in `dir` beyond `keep`; returns the names deleted. */
export function pruneBackups(dir: string, keep: number): string[] {
  const names = readdirSync(dir)
    .filter((n) => NAME.test(n))
    .sort();
  const gone = names.slice(0, Math.max(0, names.length - keep));
  for (const name of gone) rmSync(path.join(dir, name), { force: true });
  return gone;
}

/** One scheduled backup of `livePath` into the schedule's folder, then the retention. */
export async function scheduledBackup(
  livePath: string,
  schedule: BackupSchedule,
  now = new Date(),
): Promise<BackupReport> {
  mkdirSync(schedule.dir, { recursive: true });
  const report = await backupDatabase(livePath, path.join(schedule.dir, backupName(now)));
  pruneBackups(schedule.dir, schedule.keep);
  return report;
}

/**
 * Starts the backup timer (unref'd: it never keeps the process alive); failures are logged and
 * the next round tries again. Returns a function that stops it.
 */
export function startBackupSchedule(
  livePath: string,
  schedule: BackupSchedule,
  log: (line: string) => void = console.log,
): () => void {
  const timer = setInterval(
    () => {
      scheduledBackup(livePath, schedule).then(
        (r) => log(`Backup written: ${r.file} (${r.bytes} bytes)`),
        (err: unknown) => log(`Backup failed: ${err instanceof Error ? err.message : String(err)}`),
      );
    },
    schedule.everyHours * 3600 * 1000,
  );
  timer.unref();
  return () => clearInterval(timer);
}
