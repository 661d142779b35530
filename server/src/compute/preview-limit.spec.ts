import type { Server } from 'node:http';
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
import { PREVIEWS_PER_WINDOW } from './preview-limit.js';

/** Replays the preview flood: unlimited previews, and a gas with an unknown function stored under load. */

let t: TestApp;
let server: Server;
let token: string;
let otherToken: string;
let studyId: string;

beforeAll(async () => {
  t = await createTestApp();
  const author = await insertUser(t, 'author');
  const other = await insertUser(t, 'author');
  token = await tokenFor(t, author);
  otherToken = await tokenFor(t, other);
  studyId = await insertStudy(t, author);
  server = t.app.listen(0);
});
afterAll(async () => {
  server.close();
  await t.close();
});

const preview = (auth: string, spec: object = TRAP_SPEC) =>
  request(server).post('/api/compute').set('Authorization', bearer(auth)).send({ spec });

describe('preview flood', () => {
  it(`answers ${PREVIEWS_PER_WINDOW} previews per person per window, then 429 with Retry-After; others unaffected`, async () => {
    // Warm the workers first (under load a fresh worker's start-up can exceed the preview's clock).
    for (let i = 0; i < 10 && (await preview(otherToken)).status !== 200; i++);
    const answers = await Promise.all(
      Array.from({ length: PREVIEWS_PER_WINDOW + 20 }, () => preview(token)),
    );
    const statuses = answers.map((r) => r.status);
    // Let through: computed (200) or, queued behind each other on a busy machine, out of the
    // preview's time (422 too_heavy); either way the limit let exactly this many reach a worker.
    expect(statuses.filter((s) => s !== 429)).toHaveLength(PREVIEWS_PER_WINDOW);
    expect(statuses.filter((s) => s !== 429 && s !== 200 && s !== 422)).toEqual([]);
    const refused = answers.filter((r) => r.status === 429);
    expect(refused).toHaveLength(20);
    expect(refused[0]!.body.error.code).toBe('too_many_previews');
    expect(Number(refused[0]!.headers['retry-after'])).toBeGreaterThan(0);
    expect((await preview(otherToken)).status).not.toBe(429);
    // Bad input is refused on the main path and does not use up the limit of the person who sent it.
    const bad = await preview(otherToken, { ...TRAP_SPEC, nMax: 999 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('spec.nMax');
    const computed = statuses.filter((s) => s === 200).length;
    console.log(
      `preview flood: ${PREVIEWS_PER_WINDOW + 20} at once from one person, ${PREVIEWS_PER_WINDOW} let through (${computed} computed), 20 refused with 429`,
    );
  }, 120_000);

  it('refuses every gas with an unknown function while previews flood the workers (0 of 5 stored)', async () => {
    const heavy = { ...TRAP_SPEC, nMax: 12, classTable: 8, order: '100' };
    const flood = Promise.all(Array.from({ length: 30 }, () => preview(otherToken, heavy)));
    const spec = { ...TRAP_SPEC, weights: { kind: 'formula', expression: 'q^L * frobnicate(L)' } };
    const before = await t.dataSource.getRepository(Gas).count();
    const answers = await Promise.all(
      Array.from({ length: 5 }, () =>
        request(server)
          .post(`/api/studies/${studyId}/gases`)
          .set('Authorization', bearer(token))
          .send({ spec }),
      ),
    );
    await flood;
    for (const res of answers) {
      expect([400, 503]).toContain(res.status);
      expect(res.body.error.field).toMatch(/^spec/);
    }
    const refusedAsUnknown = answers.filter(
      (r) => r.status === 400 && /frobnicate/.test(r.body.error.message),
    );
    console.log(
      `preview flood: gas with an unknown function refused ${answers.length} of 5 (${refusedAsUnknown.length} named the function)`,
    );
    expect(await t.dataSource.getRepository(Gas).count()).toBe(before);
  }, 120_000);
});

describe('a preview body without its spec', () => {
  it('is refused naming spec, saying the body is {"spec": ...}', async () => {
    const r = await request(server)
      .post('/api/compute')
      .set('Authorization', bearer(token))
      .send(TRAP_SPEC);
    expect(r.status).toBe(400);
    expect(r.body.error.field).toBe('spec');
    expect(r.body.error.message).toBe(
      'Gas: is required (the request body is {"spec": <the gas>}).',
    );
  });
});
