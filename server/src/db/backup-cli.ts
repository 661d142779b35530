import { loadConfig } from '../config.js';
import { backupDatabase, restoreDatabase } from './backup.js';

/**
 * `npm run backup -- FILE` (while the server runs) and `npm run restore -- FILE` (server
 * stopped) for the database at TRACELOOM_DB. Exit 2 on a usage error, 1 when refused.
 */
async function main(): Promise<void> {
  const [command, file] = process.argv.slice(2);
  if ((command !== 'backup' && command !== 'restore') || !file) {
    console.error('usage: npm run backup -- FILE   |   npm run restore -- FILE');
    process.exit(2);
  }
  const config = loadConfig();
  if (command === 'backup') {
    const report = await backupDatabase(config.databasePath, file);
    console.log(
      `Backed up ${config.databasePath} to ${report.file}: ${report.bytes} bytes, integrity ok, ${report.migrations} migrations.`,
    );
  } else {
    const kept = restoreDatabase(file, config.databasePath);
    console.log(
      `Restored ${config.databasePath} from ${file}.${kept ? ` The database it replaced is kept as ${kept}.` : ''}`,
    );
  }
}

main().catch((err: unknown) => {
  console.error(`Traceloom: ${err instanceof Error ? err.message : String(err)}`);
  process.exit(1);
});
