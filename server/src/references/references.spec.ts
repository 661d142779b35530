import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { User } from '../db/entities/index.js';
import { ReferenceTable } from '../db/entities/index.js';
import { bearer, finishedRun } from '../testing/gas-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';

const LIMIT = 4096;
let t: TestApp;
let reviewer: User;
let token: string;
let authorToken: string;
let studyId: string;

beforeAll(async () => {
  t = await createTestApp({ uploadLimitBytes: LIMIT });
  const author = await insertUser(t, 'author');
  reviewer = await insertUser(t, 'reviewer');
  token = await tokenFor(t, reviewer);
  authorToken = await tokenFor(t, author);
  studyId = await insertStudy(t, author, [reviewer]);
});
afterAll(() => t.close());

const upload = (
  bytes: Buffer,
  filename: string,
  fields: Record<string, string> = {},
  query = '',
) => {
  let req = request(t.app)
    .post(`/api/studies/${studyId}/references${query}`)
    .set('Authorization', bearer(token));
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  return req.attach('file', bytes, filename);
};
const stored = () => t.dataSource.getRepository(ReferenceTable).count();

/** The trap's Z(N) times q^(-N^2/2) is 1/(q;q)_N (DLMF 17.2 with the q-binomial theorem; from memory). */
const TRAP_TABLE = [
  'N,value,note',
  '1,"1 + q + q^2 + q^3 + O(q^4)",1/(1-q)',
  '2,"1 + q + 2*q^2 + 2*q^3 + O(q^4)",1/((1-q)(1-q^2))',
  '3,"1 + q + 2*q^2 + 4*q^3 + O(q^4)",one wrong coefficient: 3*q^3 is right',
].join('\n');

describe('reference tables', () => {
  it('stores a CSV as uploaded, with its rows, hash and normalization (a reviewer may upload)', async () => {
    const bytes = Buffer.from(TRAP_TABLE);
    const res = await upload(bytes, 'preprint.csv', {
      title: 'Preprint table 2',
      normalization: 'q^(-N^2/2)',
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({
      title: 'Preprint table 2',
      normalization: 'q^(-N^2/2)',
      variable: 'q',
      filename: 'preprint.csv',
    });
    expect(res.body.rows.map((r: { line: number; N: number }) => [r.line, r.N])).toEqual([
      [2, 1],
      [3, 2],
      [4, 3],
    ]);
    // The bytes are never read with the row; asked for, they are the upload's.
    const row = await t.dataSource
      .getRepository(ReferenceTable)
      .createQueryBuilder('r')
      .addSelect('r.fileBytes')
      .where('r.id = :id', { id: res.body.id })
      .getOneOrFail();
    expect(row.fileBytes.equals(bytes)).toBe(true);
    expect(row.sizeBytes).toBe(bytes.length);
    const list = await request(t.app)
      .get(`/api/studies/${studyId}/references`)
      .set('Authorization', bearer(token));
    expect(list.body.find((r: { id: string }) => r.id === res.body.id).rowCount).toBe(3);
  });

  it('answers 413 at the limit + 1 byte and stores nothing; at the limit the size check passes', async () => {
    const before = await stored();
    const head = 'N,value,note\n0,1,';
    const pad = (size: number) => Buffer.from(head + 'x'.repeat(size - head.length - 1) + '\n');
    const over = await upload(pad(LIMIT + 1), 'big.csv');
    expect(over.status).toBe(413);
    expect(over.body.error).toMatchObject({ code: 'file_too_large', field: 'file' });
    expect(over.body.error.message).toContain(`${LIMIT} bytes`);
    expect(await stored()).toBe(before);
    const at = await upload(pad(LIMIT), 'big.csv');
    expect(at.status, JSON.stringify(at.body)).toBe(400); // the note is over 1000 characters
    expect(at.body.error.message).toMatch(/line 2: note is longer than 1000/);
  });

  it.each([
    [
      'a PNG named .csv',
      Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0]),
      'table.csv',
    ],
    ['a ZIP named .csv', Buffer.from('PK\u0003\u0004rest-of-archive'), 'table.csv'],
    ['binary with NUL bytes', Buffer.from([0x4e, 0x2c, 0x00, 0x01, 0x02]), 'table.csv'],
    ['Latin-1 bytes that are not UTF-8', Buffer.from([0x4e, 0x2c, 0x76, 0xe9, 0x0a]), 'table.csv'],
    ['JSON that does not parse', Buffer.from('{"rows": [ {"N": 1, '), 'table.json'],
    ['JSON in a .csv', Buffer.from('{"rows": []}'), 'table.csv'],
    ['a spreadsheet name', Buffer.from('N,value\n1,1\n'), 'table.xlsx'],
  ])('refuses %s with 415 and stores nothing', async (_label, bytes, filename) => {
    const before = await stored();
    const res = await upload(bytes, filename);
    expect(res.status, JSON.stringify(res.body)).toBe(415);
    expect(res.body.error).toMatchObject({ code: 'unsupported_content', field: 'file' });
    expect(await stored()).toBe(before);
  });

  it.each([
    ['N,value,note\n1,1,\n2,"1 + (q",\n', 'line 3: value: cannot read the expression'],
    ['N,value,note\n1,1,\nx,1,\n', 'line 3: N must be a whole number'],
    ['N,value,note\n1,1,\n1,2,\n', 'line 3: N = 1 is already given on line 2'],
    ['N,value,note\n1,1,\n2,1,a,b\n', 'line 3: has 4 columns; the limit is 3'],
    ['N,value,note\n1,"1,\n', 'line 2: a quoted field is never closed'],
    ['Z,value\n1,1\n', 'line 1: the header must be N,value,note'],
    ['N,value,note\n1,1,\n2,,\n', 'line 3: value is empty'],
  ])('refuses a bad row with 400 naming its line: %j', async (csv, message) => {
    const before = await stored();
    const res = await upload(Buffer.from(csv), 'bad.csv');
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'invalid_row', field: 'file' });
    expect(res.body.error.message).toContain(message);
    expect(await stored()).toBe(before);
  });

  it.each([
    ['q^(-N^2/2)*x', 'normalization: unknown symbol x (it may use N and the variable q).'],
    ['t^N', 'normalization: unknown symbol t'],
    ['1/(N-2)', 'at N = 2'],
  ])(
    'refuses the normalization %j before storing, on its field, in a dry run too',
    async (norm, message) => {
      const before = await stored();
      for (const query of ['', '?dryRun=1']) {
        const res = await upload(
          Buffer.from(TRAP_TABLE),
          'preprint.csv',
          { normalization: norm },
          query,
        );
        expect(res.status, JSON.stringify(res.body)).toBe(400);
        expect(res.body.error).toMatchObject({ code: 'invalid_input', field: 'normalization' });
        expect(res.body.error.message).toContain(message);
      }
      expect(await stored()).toBe(before);
    },
  );

  it('accepts a normalization in N and the variable, sums binding their own index', async () => {
    const res = await upload(
      Buffer.from(TRAP_TABLE),
      'p.csv',
      { normalization: 'q^(-N^2/2) * sum(q^k, k, 0, 0)' },
      '?dryRun=1',
    );
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const other = await upload(
      Buffer.from(TRAP_TABLE.replaceAll('q', 't')),
      'p.csv',
      { normalization: 't^(-N^2/2)', variable: 't' },
      '?dryRun=1',
    );
    expect(other.status, JSON.stringify(other.body)).toBe(200);
  });

  it('says "the file is empty" for a 0-byte file and stores nothing', async () => {
    const before = await stored();
    const res = await upload(Buffer.alloc(0), 'empty.csv');
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(res.body.error).toMatchObject({
      code: 'empty_file',
      field: 'file',
      message: 'file: the file is empty.',
    });
    expect(await stored()).toBe(before);
  });

  it('refuses more rows than the cap (5000)', async () => {
    const rows = Array.from({ length: 5001 }, (_, i) => `${i % 200},1,`).join('\n');
    const t2 = await createTestApp();
    try {
      const a = await insertUser(t2, 'author');
      const s = await insertStudy(t2, a);
      const res = await request(t2.app)
        .post(`/api/studies/${s}/references`)
        .set('Authorization', bearer(await tokenFor(t2, a)))
        .attach('file', Buffer.from(`N,value,note\n${rows}`), 'many.csv');
      expect(res.status).toBe(400);
      expect(res.body.error).toMatchObject({ code: 'too_many_rows', field: 'file' });
      expect(res.body.error.message).toContain('the limit is 5000');
    } finally {
      await t2.close();
    }
  });

  it('previews with ?dryRun=1: rows and every error, nothing stored', async () => {
    const before = await stored();
    const res = await upload(
      Buffer.from('N,value,note\n1,1,\nx,1,\n3,"q^",\n'),
      'draft.csv',
      {},
      '?dryRun=1',
    );
    expect(res.status).toBe(200);
    expect(res.body.rows).toHaveLength(1);
    expect(res.body.errors.map((e: { line: number }) => e.line)).toEqual([3, 4]);
    expect(await stored()).toBe(before);
  });

  it('reads the JSON layout, taking title and normalization from the file', async () => {
    const json = {
      title: 'Table from JSON',
      normalization: 'q^(-N^2/2)',
      rows: [{ N: 1, value: '1 + q + O(q^2)' }],
    };
    const res = await upload(Buffer.from(JSON.stringify(json)), 'table.json');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ title: 'Table from JSON', normalization: 'q^(-N^2/2)' });
    const bad = await upload(
      Buffer.from(
        JSON.stringify({
          rows: [
            { N: 1, value: '1' },
            { N: 2, value: 'q +' },
          ],
        }),
      ),
      't.json',
    );
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/^line 2: value/);
  });

  it('compares a finished run row by row and finds the wrong coefficient', async () => {
    const runId = await finishedRun(t, authorToken, studyId);
    const table = await upload(Buffer.from(TRAP_TABLE), 'preprint.csv', {
      normalization: 'q^(-N^2/2)',
    });
    const res = await request(t.app)
      .post(`/api/runs/${runId}/comparisons`)
      .set('Authorization', bearer(token))
      .send({ referenceId: table.body.id });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.kind).toBe('reference');
    // 1/(q;q)_3 = 1 + q + 2q^2 + 3q^3 + ... (partitions into at most 3 parts, OEIS A001399).
    expect(res.body.rows).toEqual([
      { N: 1, agrees: true, agreesBelow: '4', firstMismatch: null },
      { N: 2, agrees: true, agreesBelow: '4', firstMismatch: null },
      expect.objectContaining({
        N: 3,
        agrees: false,
        agreesBelow: '3',
        firstMismatch: { exponent: '3', computed: '3', supplied: '4' },
      }),
    ]);
    // The differing row carries both sides whole; agreeing rows do not.
    expect(res.body.rows[0].series).toBeUndefined();
    const { computed, supplied } = res.body.rows[2].series;
    expect(supplied).toEqual({
      order: '4',
      terms: [
        ['0', '1'],
        ['1', '1'],
        ['2', '2'],
        ['3', '4'],
      ],
    });
    // 1/(q;q)_3 = sum a(n) q^n with a(n) = round((n + 3)^2 / 12): 1, 1, 2, 3, 4, 5, 7, ... (OEIS A001399)
    computed.terms.forEach(([e, c]: [string, string]) =>
      expect(c).toBe(String(Math.round((Number(e) + 3) ** 2 / 12))),
    );
    expect(computed.terms.length).toBeGreaterThanOrEqual(4);
    expect(res.body.summary).toEqual({ agreeing: 2, total: 3 });
    // The Z_L the rows imply (Newton identities, Z(N) = row / q^(-N^2/2)) beside the entered
    // q^(L/2)/(1-q^L), each to the order the rows give it: Z(1) = q^(1/2)(1 + q + q^2 + q^3 +
    // O(q^4)) gives Z_1 to O(q^(9/2)); Z_2 = Z_1^2 - 2 Z(2) to O(q^5); Z_3 = 3 Z(3) - Z_1 Z(2)
    // + Z_2 Z(1) to O(q^(11/2)), below the wrong q^(15/2) of row 3 (hand derivation).
    expect(
      res.body.impliedWeights.map((w: { L: number; agrees: boolean; agreesBelow: string }) => [
        w.L,
        w.agrees,
        w.agreesBelow,
      ]),
    ).toEqual([
      [1, true, '9/2'],
      [2, true, '5'],
      [3, true, '11/2'],
    ]);
    expect(res.body.impliedWeights[0].implied).toEqual({
      order: '9/2',
      terms: [
        ['1/2', '1'],
        ['3/2', '1'],
        ['5/2', '1'],
        ['7/2', '1'],
      ],
    });
    const grand = await request(t.app)
      .post(`/api/runs/${runId}/comparisons`)
      .set('Authorization', bearer(token))
      .send({ grand: true });
    expect(grand.status).toBe(201);
    expect(grand.body.summary.agreeing).toBe(grand.body.summary.total);
    const list = await request(t.app)
      .get(`/api/runs/${runId}/comparisons`)
      .set('Authorization', bearer(token));
    expect(list.body.map((c: { kind: string }) => c.kind)).toEqual(['reference', 'grand']);
    expect(list.body[0].impliedWeights).toHaveLength(3);
    expect(list.body[1].impliedWeights).toBeNull();
  });

  it('reads comparisons stored under the older side names (expected/found) as computed/supplied', async () => {
    const runId = await finishedRun(t, authorToken, studyId);
    const table = await upload(Buffer.from(TRAP_TABLE), 'older.csv', {
      normalization: 'q^(-N^2/2)',
    });
    const made = await request(t.app)
      .post(`/api/runs/${runId}/comparisons`)
      .set('Authorization', bearer(token))
      .send({ referenceId: table.body.id });
    // what a comparison stored before the vocabulary was settled looks like
    const older = made.body.rows.map((r: { firstMismatch: null | Record<string, string> }) =>
      r.firstMismatch
        ? {
            ...r,
            firstMismatch: {
              exponent: r.firstMismatch['exponent'],
              expected: r.firstMismatch['computed'],
              found: r.firstMismatch['supplied'],
            },
          }
        : r,
    );
    await t.dataSource.query(`UPDATE "comparison" SET "verdicts" = ? WHERE "id" = ?`, [
      JSON.stringify(older),
      made.body.id,
    ]);
    const list = await request(t.app)
      .get(`/api/runs/${runId}/comparisons`)
      .set('Authorization', bearer(token));
    const read = list.body.find((c: { id: string }) => c.id === made.body.id);
    expect(read.rows).toEqual(made.body.rows);
    expect(read.rows[2].firstMismatch).toEqual({ exponent: '3', computed: '3', supplied: '4' });
  });
});
