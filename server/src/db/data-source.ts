import 'reflect-metadata';
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { DataSource } from 'typeorm';
import { ENTITIES } from './entities/index.js';
import { MIGRATIONS } from './migrations/index.js';

/**
 * A TypeORM data source over better-sqlite3: schema only through committed migrations
 * (`synchronize: false`), WAL journal with `synchronous = FULL` (every commit, locks and reviews
 * included, is on disk before it is acknowledged; NORMAL can lose the last commits on power loss),
 * foreign keys on (the driver enables them), a 5 s busy timeout. Creates the database file's directory when missing. Not yet initialized.
 */
export function createDataSource(databasePath: string): DataSource {
  if (databasePath !== ':memory:')
    mkdirSync(path.dirname(path.resolve(databasePath)), { recursive: true });
  return new DataSource({
    type: 'better-sqlite3',
    database: databasePath,
    entities: ENTITIES,
    migrations: MIGRATIONS,
    migrationsRun: false,
    migrationsTransactionMode: 'each',
    synchronize: false,
    enableWAL: true,
    prepareDatabase: (db: { pragma(source: string): unknown }) => {
      db.pragma('synchronous = FULL');
    },
    timeout: 5000,
    logging: false,
  });
}
