import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { REFERENCE_CSV } from '../testing/matrix-fixtures.js';
import { bearer, finishedRun } from '../testing/gas-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';
import { MIGRATIONS } from './migrations/index.js';
import { GasesRunsReferences1764705600000 } from './migrations/1764705600000-gases-runs-references.js';

const OWN_TABLES = ['gas', 'gas_version', 'run', 'reference_table', 'comparison'];
const FOUNDATION_TABLES = ['user', 'study', 'study_member', 'audit_event', 'setting'];

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

async function count(table: string): Promise<number> {
  const [{ n }] = await t.dataSource.query(`SELECT count(*) AS n FROM "${table}"`);
  return n;
}

async function tables(): Promise<string[]> {
  const rows = await t.dataSource.query("SELECT name FROM sqlite_master WHERE type = 'table'");
  return rows.map((row: { name: string }) => row.name);
}

describe('gases, runs and references migration', () => {
  it('goes down and up again on a database holding gases, runs, references and comparisons', async () => {
    const author = await insertUser(t, 'author');
    const token = await tokenFor(t, author);
    const studyId = await insertStudy(t, author, [await insertUser(t, 'reviewer')]);
    const runId = await finishedRun(t, token, studyId);
    const upload = await request(t.app)
      .post(`/api/studies/${studyId}/references`)
      .set('Authorization', bearer(token))
      .attach('file', REFERENCE_CSV, 'table.csv');
    expect(upload.status).toBe(201);
    const compared = await request(t.app)
      .post(`/api/runs/${runId}/comparisons`)
      .set('Authorization', bearer(token))
      .send({ referenceId: upload.body.id });
    expect(compared.status).toBe(201);
    for (const table of OWN_TABLES) expect(await count(table), table).toBeGreaterThan(0);
    const before = Object.fromEntries(
      await Promise.all(FOUNDATION_TABLES.map(async (n) => [n, await count(n)])),
    );

    const position = MIGRATIONS.indexOf(GasesRunsReferences1764705600000);
    expect(position).toBeGreaterThan(0);
    for (let i = MIGRATIONS.length - 1; i >= position; i--) {
      await t.dataSource.undoLastMigration({ transaction: 'each' });
    }
    const left = await tables();
    for (const table of OWN_TABLES) expect(left, table).not.toContain(table);
    for (const table of FOUNDATION_TABLES) expect(await count(table), table).toBe(before[table]);

    expect(await t.dataSource.runMigrations({ transaction: 'each' })).toHaveLength(
      MIGRATIONS.length - position,
    );
    for (const table of FOUNDATION_TABLES) expect(await count(table), table).toBe(before[table]);
    expect(await t.dataSource.query('PRAGMA foreign_key_check')).toEqual([]);
    expect(await t.dataSource.query('PRAGMA integrity_check')).toEqual([{ integrity_check: 'ok' }]);
    const log = await t.dataSource.driver.createSchemaBuilder().log();
    expect(log.upQueries.map((q) => q.query)).toEqual([]);
  });
});
