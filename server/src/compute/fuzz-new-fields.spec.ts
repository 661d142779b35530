import type { Server } from 'node:http';
import fc from 'fast-check';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Gas, ReferenceTable } from '../db/entities/index.js';
import { bearer, TRAP_SPEC } from '../testing/gas-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';

// Fuzz of the newer spec fields (precision, at, kernel, recognize, sectors, largeN) and of
// reference uploads (issue finding 12): every malformed input answers 4xx naming its field,
// within 2 s, and nothing is stored.
let t: TestApp;
let server: Server;
let token: string;
let studyId: string;

beforeAll(async () => {
  // One person sends every probe here: the per-person preview limit is tested in preview-limit.spec.ts.
  t = await createTestApp({ previewLimit: { limit: 1_000_000, windowMs: 60_000 } }, () => {});
  await t.services.pools.warm(); // timed answers: the threads load before the clock runs
  const author = await insertUser(t, 'author');
  token = await tokenFor(t, author);
  studyId = await insertStudy(t, author);
  server = t.app.listen(0);
  // Warm the worker pools: the limits are about answers, not about worker start-up.
  for (let i = 0; i < 20; i++) {
    const res = await request(server)
      .post('/api/compute')
      .set('Authorization', bearer(token))
      .send({ spec: TRAP_SPEC });
    if (res.status === 200) break;
  }
});
afterAll(async () => {
  server.close();
  await t.close();
});

/** A valid numeric gas (the trap at q = 1/10) to break one field of. */
const NUMERIC = {
  format: 'traceloom.gas/1',
  statistics: 'fermion',
  precision: 12,
  at: { q: '1/10' },
  nMax: 3,
  weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
};
const KERNEL = {
  ...NUMERIC,
  at: undefined,
  weights: { kind: 'kernel', expression: 'exp(-(x^2+y^2))' },
};

/** An expression that cannot parse: random text with an unclosed call or operator appended. */
// '%' is left out: the grammar reads "x%+" as x/100 (a percent sign eats the trailing "+"),
// so a text ending in it is not surely malformed (see docs/operations.md).
const broken = fc
  .tuple(
    fc.string({ maxLength: 30 }).map((text) => text.replace(/%/g, '')),
    fc.constantFrom('(', '+', '^', '*(', 'sum(', ','),
  )
  .map(([text, tail]) => `${text}${tail}`);
const notAnObject = fc.oneof(
  fc.integer(),
  fc.boolean(),
  fc.string({ maxLength: 6 }),
  fc.array(fc.integer(), { maxLength: 3 }),
);
const notAString = fc.oneof(fc.integer(), fc.boolean(), fc.array(fc.integer(), { maxLength: 2 }));

/** One new field of a valid base spec replaced by a value that cannot be valid. */
const malformed: fc.Arbitrary<unknown> = fc.oneof(
  fc
    .oneof(
      fc.integer({ min: -1000, max: 7 }),
      fc.integer({ min: 101, max: 1e9 }),
      fc.double({ min: 8.01, max: 99.99, noNaN: true }).filter((d) => !Number.isInteger(d)),
      fc.string({ maxLength: 5 }),
      fc.constant(null),
    )
    .map((precision) => ({ ...NUMERIC, precision })),
  fc
    .oneof(
      notAnObject,
      broken.map((e) => ({ q: e })),
    )
    .map((at) => ({ ...NUMERIC, at })),
  fc
    .oneof(
      broken.map((expression) => ({ kind: 'kernel', expression })),
      notAString.map((from) => ({ kind: 'kernel', expression: 'exp(-x^2-y^2)', from })),
      fc.oneof(fc.string({ maxLength: 4 }), fc.integer()).map((periodic) => ({
        kind: 'kernel',
        expression: 'exp(-x^2-y^2)',
        periodic,
      })),
    )
    .map((weights) => ({ ...KERNEL, weights })),
  fc
    .oneof(
      notAnObject,
      fc.constant({ basis: [] }),
      notAString.map((basis) => ({ basis })),
      fc.array(broken, { minLength: 1, maxLength: 3 }).map((basis) => ({ basis })),
      fc.constant({ basis: Array.from({ length: 13 }, () => '1') }),
      fc
        .oneof(
          fc.integer({ max: 0 }),
          fc.double({ min: 1.1, max: 9.9, noNaN: true }),
          fc.constant(1e13),
        )
        .map((maxHeight) => ({ basis: ['1', '1/pi'], maxHeight })),
    )
    .map((recognize) => ({ ...NUMERIC, recognize })),
  fc
    .oneof(
      notAnObject,
      fc.constant({ index: [], from: [], to: [] }),
      fc.constant({ index: ['a', 'b', 'c', 'd'], from: [0, 0, 0, 0], to: [1, 1, 1, 1] }),
      fc.constantFrom('L', 'p', 'N', 'kappa', '1n', 'n-1', '').map((name) => ({
        index: [name],
        from: [0],
        to: [2],
      })),
      fc
        .oneof(fc.double({ min: 0.1, max: 0.9, noNaN: true }), fc.constant('x'), fc.boolean())
        .map((from) => ({ index: ['n'], from: [from], to: [2] })),
      fc.constant({ index: ['n'], from: [0], to: [2], weight: '' }),
    )
    .map((sectors) => ({ ...TRAP_SPEC, sectors })),
  fc
    .oneof(
      notAnObject,
      broken.map((normalization) => ({ normalization })),
      notAString.map((normalization) => ({ normalization })),
    )
    .map((largeN) => ({ ...TRAP_SPEC, largeN })),
);

async function probe(path: string, send: (r: request.Test) => request.Test) {
  const t0 = performance.now();
  const res = await send(request(server).post(path).set('Authorization', bearer(token)));
  return { res, ms: performance.now() - t0 };
}

describe('fuzz: the newer spec fields', () => {
  it('answers 600 malformed specs with a 4xx naming the field, none over 2 s, nothing stored', async () => {
    const specs = fc.sample(malformed, { numRuns: 600, seed: 20261202 });
    const gasesBefore = await t.dataSource.getRepository(Gas).count();
    const failures: string[] = [];
    let slowest = 0;
    for (const [i, spec] of specs.entries()) {
      const path = i % 2 ? `/api/studies/${studyId}/gases` : '/api/compute';
      const { res, ms } = await probe(path, (r) => r.send({ spec }));
      slowest = Math.max(slowest, ms);
      const ok =
        res.status >= 400 && res.status < 500 && typeof res.body?.error?.field === 'string';
      if (!ok || ms >= 2000)
        failures.push(
          `${path} ${JSON.stringify(spec).slice(0, 120)}: ${res.status} ${ms.toFixed(0)} ms ${JSON.stringify(res.body).slice(0, 120)}`,
        );
    }
    console.info(
      `fuzz new fields: ${specs.length} specs, slowest ${slowest.toFixed(0)} ms, ${failures.length} failures`,
    );
    expect(failures).toEqual([]);
    expect(await t.dataSource.getRepository(Gas).count()).toBe(gasesBefore);
  }, 300_000);
});

/** Malformed upload files: random bytes, broken rows, broken JSON, wrong kinds. */
const badFile: fc.Arbitrary<{ bytes: Buffer; filename: string }> = fc.oneof(
  fc
    .uint8Array({ minLength: 1, maxLength: 2048 })
    .chain((bytes) =>
      fc
        .constantFrom('t.csv', 't.json')
        .map((filename) => ({ bytes: Buffer.from([0, ...bytes]), filename })),
    ),
  broken.map((value) => ({
    bytes: Buffer.from(`N,value\n1,"${value.replace(/"/g, '')}"\n`),
    filename: 'rows.csv',
  })),
  fc
    .oneof(
      fc.integer({ max: -1 }),
      fc.double({ min: 0.1, max: 9.9, noNaN: true }),
      fc.string({ minLength: 1, maxLength: 4 }).map((s) => `n${s}`),
    )
    .map((N) => ({ bytes: Buffer.from(`N,value\n${N},1 + q\n`), filename: 'n.csv' })),
  fc
    .string({ minLength: 1, maxLength: 40 })
    .map((s) => ({ bytes: Buffer.from(`{"rows": [${s}`), filename: 'cut.json' })),
  notAnObject.map((rows) => ({
    bytes: Buffer.from(JSON.stringify({ rows })),
    filename: 'shape.json',
  })),
  fc
    .constantFrom('t.exe', 't', 'table.csv.sh', 't.png') // .txt sent as text/plain is read as CSV, by design
    .map((filename) => ({ bytes: Buffer.from('N,value\n1,1\n'), filename })),
  fc.constant({ bytes: Buffer.from('N,value\n1,"1 + q\n'), filename: 'quote.csv' }),
  fc.constant({ bytes: Buffer.from(`{"rows": ${'['.repeat(3000)}`), filename: 'deep.json' }),
);

describe('fuzz: reference uploads', () => {
  it('answers 220 malformed files with a 4xx, none over 2 s, nothing stored', async () => {
    const files = fc.sample(badFile, { numRuns: 220, seed: 20261202 });
    const before = await t.dataSource.getRepository(ReferenceTable).count();
    const failures: string[] = [];
    let slowest = 0;
    for (const { bytes, filename } of files) {
      const { res, ms } = await probe(`/api/studies/${studyId}/references`, (r) =>
        r.attach('file', bytes, filename),
      );
      slowest = Math.max(slowest, ms);
      if (res.status < 400 || res.status >= 500 || ms >= 2000)
        failures.push(
          `${filename} ${JSON.stringify(bytes.toString('utf8').slice(0, 60))}: ${res.status} ${ms.toFixed(0)} ms ${JSON.stringify(res.body).slice(0, 120)}`,
        );
    }
    console.info(
      `fuzz uploads: ${files.length} files, slowest ${slowest.toFixed(0)} ms, ${failures.length} failures`,
    );
    expect(failures).toEqual([]);
    expect(await t.dataSource.getRepository(ReferenceTable).count()).toBe(before);
    expect((await request(server).get('/api/health')).body.status).toBe('ok');
  }, 300_000);
});
