import { loadConfig } from '../config.js';
import { openDatabase } from './open-database.js';

// `npm run migrate`: apply pending migrations to TRACELOOM_DB and exit.
try {
  const config = loadConfig();
  const dataSource = await openDatabase(config.databasePath);
  await dataSource.destroy();
  console.log(`Migrations applied to ${config.databasePath}`);
} catch (err) {
  console.error(`Migration failed: ${err instanceof Error ? err.message : String(err)}`);
  process.exitCode = 1;
}
