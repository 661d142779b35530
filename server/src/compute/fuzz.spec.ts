import type { Server } from 'node:http';
import fc from 'fast-check';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Gas } from '../db/entities/index.js';
import { bearer, TRAP_SPEC } from '../testing/gas-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';

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
  // Warm the worker pools first: the limits are about answers, not about worker start-up.
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

const formula = (expression: string) => ({
  ...TRAP_SPEC,
  weights: { kind: 'formula', expression },
});

/** Adversarial expressions written by hand; each must be refused, quickly. */
const HAND_EXPRESSIONS = [
  '('.repeat(2000) + 'q' + ')'.repeat(2000),
  '('.repeat(3000),
  '-'.repeat(4000) + 'zz',
  '1' + '^1'.repeat(2000) + '^',
  'q^(10^9)',
  'q^(-10^9)',
  '(1+q)^(10^9)',
  '(1+q)^100000000000000000000',
  'q^(1/0)',
  '1/0',
  '1/(q-q)',
  'factorial(10^6)',
  'factorial(1000000)',
  'sum(1, k, 0, inf)',
  'sum(q^0, k, 1, inf)',
  'sum(q^(-k), k, 1, inf)',
  'prod(1+q^0, k, 1, inf)',
  'prod(2, k, 1, inf)',
  'sum(sum(1, j, 0, inf), k, 0, inf)',
  'qpoch(q^0, q, inf) / 0',
  '10^10^10^10',
  '9'.repeat(4000),
  'q'.repeat(4096),
  'L'.repeat(4096),
  'x'.repeat(4097),
  'q²',
  'κ + q',
  '∑(q)',
  '😀',
  'q\u0000',
  '\u202eq',
  'constructor',
  '__proto__',
  'toString()',
  'q.constructor',
  'import("fs")',
  'evaluate("1")',
  'parse("1")',
  'simplify("q")',
  'derivative("q", "q")',
  'createUnit("foo")',
  'f(x) = x',
  'L = 1',
  '[1, 2, 3]',
  '{a: 1}',
  'q ? 1 : 2',
  '1:10',
  "q'",
  'q!',
  '2 mm',
  'kappa',
  'inf',
  'e^q',
  'i*q',
  'O(q^(1/0))',
  'O(O(q))',
  'sum(1, k, inf, 0)',
  'sum(q^k, k, 1, 10^9)',
  'prod(1 - q^k, k, 1, 10^8)',
  'qpoch(q, q, 10^9)',
];

/** Adversarial specs: wrong shapes, prototype-pollution keys, huge values. */
const HAND_SPECS: unknown[] = [
  null,
  42,
  'spec',
  [],
  {},
  JSON.parse('{"__proto__": {"polluted": true}}'),
  JSON.parse(`{"__proto__": ${JSON.stringify(TRAP_SPEC)}}`),
  { ...TRAP_SPEC, constructor: { prototype: { polluted: true } } },
  { ...TRAP_SPEC, weights: { kind: '__proto__' } },
  {
    ...TRAP_SPEC,
    weights: JSON.parse('{"kind": "formula", "expression": "q", "__proto__": {"x": 1}}'),
  },
  { ...TRAP_SPEC, nMax: 1e300 },
  { ...TRAP_SPEC, nMax: -1 },
  { ...TRAP_SPEC, nMax: 2.5 },
  { ...TRAP_SPEC, nMax: '8' },
  { ...TRAP_SPEC, order: '1e400' },
  { ...TRAP_SPEC, order: '9'.repeat(500) },
  { ...TRAP_SPEC, step: '0' },
  { ...TRAP_SPEC, step: '-1/2' },
  { ...TRAP_SPEC, step: '1/0' },
  { ...TRAP_SPEC, variable: 'kappa' },
  { ...TRAP_SPEC, variable: 'L' },
  { ...TRAP_SPEC, statistics: 'anyon' },
  { ...TRAP_SPEC, weights: { kind: 'values', values: [] } },
  { ...TRAP_SPEC, weights: { kind: 'values', values: ['1'] } },
  {
    ...TRAP_SPEC,
    weights: { kind: 'spectrum', expression: 'q^abs(p)', offset: 'half', from: null, to: null },
  },
  {
    ...TRAP_SPEC,
    weights: { kind: 'spectrum', expression: '1', offset: '0', from: null, to: null },
  },
  { ...TRAP_SPEC, grand: { kind: 'expression', expression: 'kappa^' } },
  { ...TRAP_SPEC, grand: { kind: 'coefficients', values: [] } },
  { ...TRAP_SPEC, reference: { normalization: '1', rows: [{ N: 99, value: '1' }] } },
  { ...TRAP_SPEC, reference: { normalization: 'q^(', rows: [] } },
];

/** Malformed expressions that cannot be valid: a random text with an unclosed call appended. */
const brokenExpression = fc
  .tuple(
    fc.string({ maxLength: 60, unit: 'grapheme' }),
    fc.constantFrom('(', '+', '^', '*(', 'sum(', ',', '['),
  )
  .map(([text, tail]) => `${text}${tail}`);

/** Specs with one field replaced by a value of the wrong kind. */
const wrongField = fc
  .tuple(
    fc.constantFrom(
      'format',
      'statistics',
      'variable',
      'step',
      'order',
      'nMax',
      'classTable',
      'weights',
      'grand',
    ),
    fc.oneof(
      fc.integer(),
      fc.double(),
      fc.boolean(),
      fc.constant(null),
      fc.array(fc.integer(), { maxLength: 3 }),
      fc.string({ maxLength: 8 }).map((s) => `~${s}`),
      fc.object({ maxDepth: 2 }),
    ),
  )
  .map(([key, value]) => ({ ...TRAP_SPEC, [key]: value }));

/** Random JSON values as a whole spec. */
const randomSpec = fc
  .jsonValue({ maxDepth: 3 })
  .filter((v) => !(v && typeof v === 'object' && !Array.isArray(v) && 'format' in v));

interface Probe {
  label: string;
  method: 'compute' | 'gas';
  spec: unknown;
}

function cases(): Probe[] {
  const out: Probe[] = [];
  for (const e of HAND_EXPRESSIONS) {
    out.push({ label: `hand expression ${e.slice(0, 40)}`, method: 'compute', spec: formula(e) });
    out.push({ label: `hand expression ${e.slice(0, 40)}`, method: 'gas', spec: formula(e) });
  }
  for (const s of HAND_SPECS) {
    out.push({ label: `hand spec ${JSON.stringify(s)?.slice(0, 60)}`, method: 'compute', spec: s });
    out.push({ label: `hand spec ${JSON.stringify(s)?.slice(0, 60)}`, method: 'gas', spec: s });
  }
  const seed = 20261201;
  for (const [i, e] of fc.sample(brokenExpression, { numRuns: 400, seed }).entries()) {
    out.push({
      label: `broken expression ${JSON.stringify(e)}`,
      method: i % 2 ? 'gas' : 'compute',
      spec: formula(e),
    });
  }
  for (const [i, s] of fc.sample(wrongField, { numRuns: 300, seed }).entries()) {
    out.push({
      label: `wrong field ${JSON.stringify(s).slice(0, 80)}`,
      method: i % 2 ? 'gas' : 'compute',
      spec: s,
    });
  }
  for (const [i, s] of fc.sample(randomSpec, { numRuns: 200, seed }).entries()) {
    out.push({
      label: `random spec ${JSON.stringify(s).slice(0, 60)}`,
      method: i % 2 ? 'gas' : 'compute',
      spec: s,
    });
  }
  return out;
}

describe('fuzz: malformed and adversarial specs', () => {
  it('answers every one with a 4xx naming the field, none slower than 2 s, the server unharmed', async () => {
    const all = cases();
    expect(all.length).toBeGreaterThanOrEqual(1000);
    const gasesBefore = await t.dataSource.getRepository(Gas).count();
    const failures: string[] = [];
    let slowest = 0;
    for (const probe of all) {
      const path = probe.method === 'compute' ? '/api/compute' : `/api/studies/${studyId}/gases`;
      const t0 = performance.now();
      const res = await request(server)
        .post(path)
        .set('Authorization', bearer(token))
        .send({ spec: probe.spec });
      const ms = performance.now() - t0;
      slowest = Math.max(slowest, ms);
      const ok =
        res.status >= 400 && res.status < 500 && typeof res.body?.error?.field === 'string';
      if (!ok || ms >= 2000)
        failures.push(
          `${probe.method} ${probe.label}: ${res.status} ${ms.toFixed(0)} ms ${JSON.stringify(res.body).slice(0, 160)}`,
        );
    }
    console.log(
      `fuzz: ${all.length} inputs, slowest answer ${slowest.toFixed(0)} ms, ${failures.length} failures`,
    );
    expect(failures).toEqual([]);
    expect(await t.dataSource.getRepository(Gas).count()).toBe(gasesBefore);
    const health = await request(server).get('/api/health');
    expect(health.body.status).toBe('ok');
  }, 300_000);
});
