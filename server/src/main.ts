import type { AddressInfo } from 'node:net';
import { createApp } from './app.js';
import { loadConfig } from './config.js';
import { startBackupSchedule } from './db/backup-schedule.js';
import { openDatabase } from './db/open-database.js';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, seedDemo } from './db/seed-demo.js';

/** Starts Traceloom: checks and migrates the database, seeds in demo mode, serves, shuts down cleanly. */
async function main(): Promise<void> {
  const config = loadConfig();
  const dataSource = await openDatabase(config.databasePath);
  if (config.mode === 'demo') await seedDemo(dataSource, config.scrypt);
  const built = await createApp({ dataSource, config });
  const server = built.app.listen(config.port);
  await new Promise<void>((resolve, reject) => {
    server.once('listening', resolve);
    server.once('error', reject);
  });
  const { port } = server.address() as AddressInfo;
  console.log(`Traceloom is serving on http://localhost:${port}`);
  // Threads start now rather than on the first request (in queue mode runs compute elsewhere).
  built.services.pools
    .warm(config.runs.queueUrl ? ['quick', 'probe'] : undefined)
    .catch((err: unknown) => console.error(err));
  if (config.backups) {
    startBackupSchedule(config.databasePath, config.backups);
    const { dir, everyHours, keep } = config.backups;
    console.log(`Backups every ${everyHours} h into ${dir}, the newest ${keep} kept.`);
  }
  if (config.mode === 'demo') {
    const emails = DEMO_ACCOUNTS.map((account) => account.email).join(', ');
    console.log(`Demo sign-in: ${emails} — password ${DEMO_PASSWORD}`);
  }

  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`Traceloom is stopping (${signal}).`);
    const force = setTimeout(() => process.exit(1), 10_000);
    force.unref();
    server.close(() => {
      built
        .close()
        .then(
          () => dataSource.destroy(),
          () => dataSource.destroy(),
        )
        .then(
          () => process.exit(0),
          () => process.exit(1),
        );
    });
    server.closeIdleConnections();
  };
  process.on('SIGINT', () => stop('SIGINT'));
  process.on('SIGTERM', () => stop('SIGTERM'));
}

main().catch((err: unknown) => {
  console.error(`Traceloom could not start: ${err instanceof Error ? err.message : String(err)}`);
  process.exit(1);
});
