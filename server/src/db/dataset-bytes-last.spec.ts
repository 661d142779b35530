import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { User } from '../db/entities/index.js';
import { api, draftOf, lockedDataset, warmWorkers } from '../testing/dataset-fixtures.js';
import { finishedRun } from '../testing/gas-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';

/**
 * The migration that moves the dataset's byte columns last, replayed on a database laid out as
 * before it (snapshot after state, canonical after hash) holding a locked dataset and a draft
 * with a comment.
 */

let t: TestApp;
let people: { author: User; reviewer: User; steward: User };
let studyId: string;

const columnsOf = async (): Promise<string[]> =>
  ((await t.dataSource.query(`PRAGMA table_info("dataset")`)) as Array<{ name: string }>).map(
    (c) => c.name,
  );

const rowCounts = async (): Promise<Record<string, number>> => {
  const out: Record<string, number> = {};
  for (const table of [
    'dataset',
    'dataset_view',
    'dataset_review_request',
    'dataset_review',
    'dataset_comment',
  ]) {
    out[table] = (await t.dataSource.query(`SELECT count(*) AS n FROM "${table}"`))[0].n;
  }
  return out;
};

/** Rebuilds "dataset" in the layout before the migration (as the tests' own SQL, FKs off). */
async function earlierLayout(): Promise<void> {
  const q = (sql: string) => t.dataSource.query(sql);
  const [{ sql }] = await q(
    `SELECT sql FROM sqlite_master WHERE type = 'table' AND name = 'dataset'`,
  );
  const attached: Array<{ sql: string }> = await q(
    `SELECT sql FROM sqlite_master WHERE tbl_name = 'dataset' AND type IN ('index', 'trigger') AND sql IS NOT NULL`,
  );
  const earlier = (sql as string)
    .replace(', "snapshot" text NOT NULL', '')
    .replace(', "canonical" text', '')
    .replace(
      '"state" varchar(16) NOT NULL, ',
      '"state" varchar(16) NOT NULL, "snapshot" text NOT NULL, ',
    )
    .replace('"hash" varchar(64), ', '"hash" varchar(64), "canonical" text, ')
    .replace('CREATE TABLE "dataset"', 'CREATE TABLE "dataset_earlier"');
  const columns = (await columnsOf()).map((c) => `"${c}"`).join(', ');
  await q('PRAGMA foreign_keys = OFF');
  await q('PRAGMA legacy_alter_table = ON');
  await q(earlier);
  await q(`INSERT INTO "dataset_earlier" (${columns}) SELECT ${columns} FROM "dataset"`);
  await q('DROP TABLE "dataset"');
  await q('ALTER TABLE "dataset_earlier" RENAME TO "dataset"');
  for (const a of attached) await q(a.sql);
  await q('PRAGMA legacy_alter_table = OFF');
  await q('PRAGMA foreign_keys = ON');
  await q(`DELETE FROM "migrations" WHERE "name" = 'DatasetBytesLast1796360000000'`);
}

beforeAll(async () => {
  t = await createTestApp();
  people = {
    author: await insertUser(t, 'author'),
    reviewer: await insertUser(t, 'reviewer'),
    steward: await insertUser(t, 'steward'),
  };
  studyId = await insertStudy(t, people.author, [people.reviewer, people.steward]);
  await warmWorkers(t, people.author);
}, 120_000);
afterAll(() => t.close());

describe('dataset byte columns last', () => {
  it('moves snapshot and canonical to the end of the row, every row and lock kept', async () => {
    const locked = await lockedDataset(t, people, studyId);
    const runId = await finishedRun(t, await tokenFor(t, people.author), studyId);
    const draft = await draftOf(t, people.author, runId);
    await api(t, people.author, 'post', `/datasets/${draft}/comments`, { body: 'Row 2?' }, 201);
    const pageBefore = await api(
      t,
      people.steward,
      'get',
      `/datasets/${locked.id}`,
      undefined,
      200,
    );

    await earlierLayout();
    const earlier = await columnsOf();
    expect(earlier.indexOf('snapshot')).toBe(earlier.indexOf('state') + 1);
    const before = await rowCounts();
    const bytesBefore = await t.dataSource.query(
      'SELECT id, snapshot, canonical FROM dataset ORDER BY id',
    );

    expect(await t.dataSource.runMigrations({ transaction: 'each' })).toHaveLength(1);

    const after = await columnsOf();
    expect(after.slice(-2)).toEqual(['snapshot', 'canonical']);
    expect([...after].sort()).toEqual([...earlier].sort());
    expect(await rowCounts()).toEqual(before);
    expect(
      await t.dataSource.query('SELECT id, snapshot, canonical FROM dataset ORDER BY id'),
    ).toEqual(bytesBefore);
    const [row] = await t.dataSource.query('SELECT hash, canonical FROM dataset WHERE id = ?', [
      locked.id,
    ]);
    expect(createHash('sha256').update(row.canonical).digest('hex')).toBe(locked.hash);
    expect(await api(t, people.steward, 'get', `/datasets/${locked.id}`, undefined, 200)).toEqual(
      pageBefore,
    );
    // The triggers came back: the locked row and its children refuse writes.
    await expect(
      t.dataSource.query(`UPDATE dataset SET title = 'changed' WHERE id = ?`, [locked.id]),
    ).rejects.toThrow(/dataset_locked/);
    await expect(
      t.dataSource.query(`DELETE FROM dataset_review WHERE dataset_id = ?`, [locked.id]),
    ).rejects.toThrow(/dataset_locked/);
    expect(
      (await api(t, people.steward, 'post', `/datasets/${locked.id}/verify`, {}, 200)).ok,
    ).toBe(true);
  }, 120_000);
});
