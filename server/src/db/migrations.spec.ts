import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { afterEach, describe, expect, it } from 'vitest';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';
import { createDataSource } from './data-source.js';
import { MIGRATIONS } from './migrations/index.js';

/** The tables this test fills; later features' tables are counted too, from the entities. */
const FOUNDATION_TABLES = ['user', 'invitation', 'study', 'study_member', 'audit_event', 'setting'];

function entityTables(dataSource: DataSource): string[] {
  return dataSource.entityMetadatas.map((metadata) => metadata.tableName).sort();
}

async function counts(dataSource: DataSource): Promise<Record<string, number>> {
  const result: Record<string, number> = {};
  const present = new Set(await userTables(dataSource));
  for (const table of entityTables(dataSource).filter((name) => present.has(name))) {
    const [{ n }] = await dataSource.query(`SELECT count(*) AS n FROM "${table}"`);
    result[table] = n;
  }
  return result;
}

async function pendingSchemaChanges(dataSource: DataSource): Promise<string[]> {
  const log = await dataSource.driver.createSchemaBuilder().log();
  return log.upQueries.map((query) => query.query);
}

async function userTables(dataSource: DataSource): Promise<string[]> {
  const rows = await dataSource.query(
    "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name <> 'migrations' ORDER BY name",
  );
  return rows.map((row: { name: string }) => row.name);
}

let cleanup: Array<() => Promise<void>> = [];
afterEach(async () => {
  for (const step of cleanup.reverse()) await step();
  cleanup = [];
});

describe('migrations', () => {
  it('produce exactly the schema the entities describe', async () => {
    const t = await createTestApp();
    cleanup.push(() => t.close());
    expect(await pendingSchemaChanges(t.dataSource)).toEqual([]);
    expect(await userTables(t.dataSource)).toEqual(entityTables(t.dataSource));
    expect(entityTables(t.dataSource)).toEqual(expect.arrayContaining(FOUNDATION_TABLES));
  });

  it('undo and redo every migration after the baseline on a populated database, keeping every row', async () => {
    const t: TestApp = await createTestApp();
    cleanup.push(() => t.close());
    const owner = await insertUser(t, 'author');
    const member = await insertUser(t, 'reviewer');
    const admin = await insertUser(t, 'admin');
    await insertStudy(t, owner, [member]);
    await request(t.app)
      .post('/api/users')
      .set('Authorization', `Bearer ${await tokenFor(t, admin)}`)
      .send({ email: 'invited@example.test', displayName: 'Invited', role: 'author' })
      .expect(201);
    // The settings table holds no secret any more; a row of its own shows it keeps rows.
    await t.dataSource.query(`INSERT INTO setting (key, value) VALUES ('test.kept', '1')`);
    const before = await counts(t.dataSource);
    for (const table of FOUNDATION_TABLES) expect(before[table], table).toBeGreaterThan(0);

    const laterMigrations = MIGRATIONS.length - 1;
    for (let i = 0; i < laterMigrations; i++)
      await t.dataSource.undoLastMigration({ transaction: 'each' });
    expect(await t.dataSource.query('SELECT count(*) AS n FROM migrations')).toEqual([{ n: 1 }]);
    // Tables a later migration created are gone; every remaining table keeps its rows.
    const undone = await counts(t.dataSource);
    for (const [table, n] of Object.entries(undone)) expect(n, table).toBe(before[table]);
    for (const table of FOUNDATION_TABLES) expect(undone[table], table).toBe(before[table]);
    const applied = await t.dataSource.runMigrations({ transaction: 'each' });
    expect(applied).toHaveLength(laterMigrations);

    expect(await counts(t.dataSource)).toEqual(before);
    expect(await t.dataSource.query('PRAGMA foreign_key_check')).toEqual([]);
    expect(await t.dataSource.query('PRAGMA integrity_check')).toEqual([{ integrity_check: 'ok' }]);
    expect(await pendingSchemaChanges(t.dataSource)).toEqual([]);
  });

  it('run up, all the way down and up again on a fresh file', async () => {
    const dir = mkdtempSync(path.join(os.tmpdir(), 'traceloom-migrate-'));
    const dataSource = createDataSource(path.join(dir, 'm.sqlite'));
    await dataSource.initialize();
    cleanup.push(async () => {
      await dataSource.destroy();
      rmSync(dir, { recursive: true, force: true });
    });
    expect(await dataSource.runMigrations()).toHaveLength(MIGRATIONS.length);
    for (let i = 0; i < MIGRATIONS.length; i++) await dataSource.undoLastMigration();
    expect(await userTables(dataSource)).toEqual([]);
    expect(await dataSource.runMigrations()).toHaveLength(MIGRATIONS.length);
    expect(await pendingSchemaChanges(dataSource)).toEqual([]);
    expect(await dataSource.query('PRAGMA foreign_key_check')).toEqual([]);
    expect(await dataSource.query('PRAGMA journal_mode')).toEqual([{ journal_mode: 'wal' }]);
    expect(await dataSource.query('PRAGMA foreign_keys')).toEqual([{ foreign_keys: 1 }]);
  });
});
