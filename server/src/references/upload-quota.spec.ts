import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ReferenceTable } from '../db/entities/index.js';
import { bearer } from '../testing/gas-fixtures.js';
import { authorStudy, type AuthorStudy } from '../testing/author-study.js';
import { insertStudy } from '../testing/test-app.js';
import { DEFAULT_REFERENCE_QUOTA } from './reference-quota.js';

/** Replays "uploads can fill the disk": sparse files, no quota, lists reading every file's bytes. */

const QUOTA = { ...DEFAULT_REFERENCE_QUOTA, studyTables: 3, studyBytes: 6000, userTables: 3 };
/** One app with the default quotas and 11 MB uploads, one with small quotas. */
let big: AuthorStudy;
let s: AuthorStudy;
let otherStudy: string;

beforeAll(async () => {
  big = await authorStudy({ uploadLimitBytes: 11 * 1024 * 1024 });
  s = await authorStudy({ referenceQuota: QUOTA });
  otherStudy = await insertStudy(s.t, s.author);
});
afterAll(async () => {
  await big.t.close();
  await s.t.close();
});

const upload = (bytes: Buffer | string, studyId = s.studyId, query = '', on = s) =>
  request(on.t.app)
    .post(`/api/studies/${studyId}/references${query}`)
    .set('Authorization', bearer(on.token))
    .attach('file', Buffer.from(bytes), 'table.csv');
const remove = (id: string) =>
  request(s.t.app).delete(`/api/references/${id}`).set('Authorization', bearer(s.token));
const stored = () => s.t.dataSource.getRepository(ReferenceTable).count();
/** A CSV of `rows` rows whose values are sums of `terms` ones; `pad` spaces at the end. */
const table = (rows: number, { pad = 0, terms = 1 } = {}) =>
  ['N,value', ...Array.from({ length: rows }, (_, i) => `${i},"${'1+'.repeat(terms - 1)}1"`)].join(
    '\n',
  ) + ' '.repeat(pad);

describe('upload size relative to content', () => {
  it('takes a table whose size its rows explain (a little padding included; warms the reader)', async () => {
    const res = await upload(table(2, { pad: 1000 }), big.studyId, '', big);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
  });

  it('refuses one row and 10 MB of blank lines (413 naming file and the limit), also as a dry run', async () => {
    const sparse = 'N,value\n0,1\n' + '\n'.repeat(10 * 1024 * 1024);
    const before = await big.t.dataSource.getRepository(ReferenceTable).count();
    for (const query of ['', '?dryRun=1']) {
      const res = await upload(sparse, big.studyId, query, big);
      expect(res.status, JSON.stringify(res.body)).toBe(413);
      expect(res.body.error).toMatchObject({ code: 'file_too_sparse', field: 'file' });
      expect(res.body.error.message).toMatch(
        /^file: 10\.0 MB for 1 row .* 64 KB plus 16 KB per row/,
      );
    }
    expect(await big.t.dataSource.getRepository(ReferenceTable).count()).toBe(before);
  });
});

describe('quotas per study and per person', () => {
  let ids: string[] = [];

  it('refuses the study table past its count (429) and takes one again after a deletion', async () => {
    for (let i = 0; i < 3; i++) {
      const res = await upload(table(3));
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      ids.push(res.body.id);
    }
    const over = await upload(table(3));
    expect(over.status).toBe(429);
    expect(over.body.error).toMatchObject({ code: 'too_many_references', field: 'file' });
    expect(over.body.error.message).toMatch(/This study holds 3 reference tables, the limit is 3/);
    expect(await stored()).toBe(3);
    expect((await remove(ids.pop()!)).status).toBe(204);
    const again = await upload(table(3));
    expect(again.status, JSON.stringify(again.body)).toBe(201);
    ids.push(again.body.id);
  });

  it('refuses a file that takes the study past its bytes (413)', async () => {
    await Promise.all(ids.map(remove));
    ids = [];
    const first = await upload(table(100, { terms: 15 })); // 3.3 KB
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    ids.push(first.body.id);
    const res = await upload(table(100, { terms: 15 }));
    expect(res.status).toBe(413);
    expect(res.body.error).toMatchObject({ code: 'reference_quota', field: 'file' });
    expect(res.body.error.message).toMatch(
      /This study holds 3\.\d KB .*\(3\.\d KB\) .* the limit of 5\.9 KB/,
    );
  });

  it('counts a person across studies (429 once their tables reach the limit)', async () => {
    for (let i = 0; i < 2; i++) {
      const res = await upload(table(2), otherStudy);
      expect(res.status, JSON.stringify(res.body)).toBe(201);
    }
    const res = await upload(table(2), otherStudy);
    expect(res.status).toBe(429);
    expect(res.body.error.message).toMatch(/You have uploaded 3 reference tables, the limit is 3/);
  });

  it('lists tables without reading their bytes or rows', async () => {
    const queries: string[] = [];
    const logger = s.t.dataSource.logger;
    const spy = Object.create(logger) as typeof logger;
    spy.logQuery = (query, parameters, runner) => {
      queries.push(query);
      return logger.logQuery(query, parameters, runner);
    };
    Object.assign(s.t.dataSource, { logger: spy });
    const list = await request(s.t.app)
      .get(`/api/studies/${otherStudy}/references`)
      .set('Authorization', bearer(s.token));
    Object.assign(s.t.dataSource, { logger });
    expect(list.status).toBe(200);
    expect(list.body).toHaveLength(2);
    expect(list.body[0]).toMatchObject({ rowCount: 2, numeric: false });
    const listQuery = queries.find((q) => q.includes('"reference_table"'));
    expect(listQuery).toBeDefined();
    expect(listQuery).not.toMatch(/file_bytes|"r"\."rows"/);
  });
});

describe('a list beside large stored tables', () => {
  it('answers without reading 50 MB of files and 10 MB of rows', async () => {
    const repo = big.t.dataSource.getRepository(ReferenceTable);
    const rows = JSON.stringify(
      Array.from({ length: 2500 }, (_, N) => ({ line: N + 2, N, value: '1+'.repeat(400) + '1' })),
    );
    for (let i = 0; i < 5; i++) {
      await repo.save({
        study: { id: big.studyId },
        title: `stored ${i}`,
        fileBytes: Buffer.alloc(10 * 1024 * 1024, 0x31),
        filename: 'big.csv',
        contentType: 'text/csv',
        sha256: '0'.repeat(64),
        rows,
        sizeBytes: 10 * 1024 * 1024,
        rowCount: 2500,
        numeric: false,
        createdBy: { id: big.author.id },
        createdAt: new Date().toISOString(),
      });
    }
    const times: number[] = [];
    for (let i = 0; i < 5; i++) {
      const start = performance.now();
      const list = await request(big.t.app)
        .get(`/api/studies/${big.studyId}/references`)
        .set('Authorization', bearer(big.token));
      times.push(performance.now() - start);
      expect(list.status).toBe(200);
      expect(list.body.filter((r: { rowCount: number }) => r.rowCount === 2500)).toHaveLength(5);
    }
    const median = times.sort((a, b) => a - b)[2]!;
    console.log(`reference list beside 5 stored 10 MB tables: median ${median.toFixed(0)} ms`);
  }, 60_000);
});
