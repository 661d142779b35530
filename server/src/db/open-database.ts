import type { DataSource } from 'typeorm';
import { createDataSource } from './data-source.js';
import { serializeTransactions } from './serialize-transactions.js';
import { assertDatabaseHealthy } from './startup-checks.js';

/**
 * Opens the database at `databasePath`, checks SQLite's version and the file's integrity, and
 * applies pending migrations. The one way the server, the migrate script and tests open a
 * database.
 */
export async function openDatabase(databasePath: string): Promise<DataSource> {
  const dataSource = createDataSource(databasePath);
  await dataSource.initialize();
  serializeTransactions(dataSource);
  try {
    await assertDatabaseHealthy(dataSource);
    await dataSource.runMigrations({ transaction: 'each' });
  } catch (err) {
    await dataSource.destroy();
    throw err;
  }
  return dataSource;
}
