import { readFileSync } from 'node:fs';
import { compute } from '@traceloom/shared/engine';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fermionSectorSum, range } from '../../../shared/src/engine/sectors/brute-force.js';
import { Run } from '../db/entities/index.js';
import { bearer, createGas, startRun, waitForRun } from '../testing/gas-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';

let t: TestApp;
let token: string;
let studyId: string;

beforeAll(async () => {
  t = await createTestApp({
    runs: {
      threads: 2,
      wallClockMs: 60_000,
      perUserCap: 4,
      maxOldGenerationSizeMb: 512,
      previewMs: 1500,
    },
  });
  const author = await insertUser(t, 'author');
  token = await tokenFor(t, author);
  studyId = await insertStudy(t, author);
});
afterAll(async () => {
  await t.close();
});

/** The two-node ring with the traceless condition: one unbounded sector index. */
const RING = {
  format: 'traceloom.gas/1',
  title: 'two-node ring, traceless',
  statistics: 'fermion',
  step: '1/2',
  order: '8',
  nMax: 4,
  classTable: 3,
  weights: { kind: 'spectrum', expression: 'q^((abs(p) + abs(p + n))/2)', from: null, to: null },
  sectors: { index: ['n'], from: [null], to: [null], weight: '1' },
};

/** The result without its clocks. */
function untimed(r: Record<string, unknown>) {
  const { timings: _t, classes: _c, ...rest } = r;
  return rest;
}

describe('sector runs on the worker pool', () => {
  it('gives the same result as the engine computing it in one piece', async () => {
    const runId = await startRun(t, token, await createGas(t, token, studyId, RING));
    const run = await waitForRun(t, runId);
    expect(run.status, run.error ?? '').toBe('done');
    const res = await request(t.app).get(`/api/runs/${runId}`).set('Authorization', bearer(token));
    const direct = compute(RING);
    expect(untimed(res.body.result)).toEqual(untimed(JSON.parse(JSON.stringify(direct))));
    expect(res.body.result.sectors.count).toBe(direct.sectors!.count);
    // class rows of N <= 3: p(1) + p(2) + p(3) = 1 + 2 + 3 (OEIS A000041)
    expect(res.body.classCounts).toEqual({ 1: 1, 2: 2, 3: 3 });
    const rows = await request(t.app)
      .get(`/api/runs/${runId}?classes=2`)
      .set('Authorization', bearer(token));
    expect(rows.body.result.classes).toEqual(direct.classes.filter((c) => c.N === 2));
  });

  it('spreads a numeric sector sum over the pool with the one-thread answer', async () => {
    // sum_n (-1)^n Z_n at q = 1/10 (the engine spec checks the values against mpmath); here the
    // pool path (parts on worker threads, summed in a last task) must give the same result
    const NUMERIC = {
      format: 'traceloom.gas/1',
      title: 'alternating sectors at q = 1/10',
      statistics: 'fermion',
      precision: 20,
      at: { q: '1/10' },
      nMax: 4,
      classTable: 2,
      weights: { kind: 'spectrum', expression: 'q^(abs(p) + abs(n))' },
      sectors: { index: ['n'], from: [null], to: [null], weight: '(-1)^n' },
    };
    const runId = await startRun(t, token, await createGas(t, token, studyId, NUMERIC));
    const run = await waitForRun(t, runId);
    expect(run.status, run.error ?? '').toBe('done');
    const res = await request(t.app).get(`/api/runs/${runId}`).set('Authorization', bearer(token));
    const direct = JSON.parse(JSON.stringify(compute(NUMERIC)));
    expect(untimed(res.body.result)).toEqual(untimed(direct));
    expect(res.body.result.sectors.count).toBeGreaterThan(4);
    expect(res.body.classCounts).toEqual({ 1: 1, 2: 2 });
  });

  it('checks the summed table against an uploaded reference table, row by row', async () => {
    // the reference: a direct count over |n|, |p| <= 20 (every state outside lies beyond q^8), with
    // the coefficient of q^(5/2) in Z(2) deliberately wrong
    const brute = fermionSectorSum({
      nMax: 3,
      size: 16,
      sectors: range(-20, 20).map((n) => [n]),
      lattice: range(-20, 20),
      state: (p, [n]) => ({ e: Math.abs(p) + Math.abs(p + n!), c: 1n }),
      weight: () => 1n,
    });
    const text = (N: number) =>
      brute[N]!.map((c, k) => `${N === 2 && k === 5 ? c + 1n : c}*q^(${k}/2)`).join(' + ') +
      ' + O(q^8)';
    const runId = await startRun(t, token, await createGas(t, token, studyId, RING));
    expect((await waitForRun(t, runId)).status).toBe('done');
    const rows = [1, 2, 3].map((N) => ({ N, value: text(N) }));
    const table = await request(t.app)
      .post(`/api/studies/${studyId}/references`)
      .set('Authorization', bearer(token))
      .attach('file', Buffer.from(JSON.stringify({ title: 'ring, counted', rows })), 'ring.json');
    expect(table.status, JSON.stringify(table.body)).toBe(201);
    const res = await request(t.app)
      .post(`/api/runs/${runId}/comparisons`)
      .set('Authorization', bearer(token))
      .send({ referenceId: table.body.id });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.rows.map((r: { agrees: boolean }) => r.agrees)).toEqual([true, false, true]);
    expect(res.body.rows[1].firstMismatch.exponent).toBe('5/2');
  });

  it('reports progress per sector and can be cancelled while its sectors run', async () => {
    const bench = JSON.parse(
      readFileSync(
        new URL('../../../scripts/bench-tasks/sectors-12.json', import.meta.url),
        'utf8',
      ),
    );
    const runId = await startRun(t, token, await createGas(t, token, studyId, bench));
    let phase: string | null = null;
    const until = Date.now() + 30_000;
    while (Date.now() < until) {
      const run = await t.dataSource.getRepository(Run).findOneByOrFail({ id: runId });
      if (run.progressPhase === 'sectors' && run.progressDone > 0) {
        phase = run.progressPhase;
        break;
      }
      if (run.status !== 'queued' && run.status !== 'running') break;
      await new Promise((r) => setTimeout(r, 20));
    }
    expect(phase).toBe('sectors');
    const res = await request(t.app)
      .post(`/api/runs/${runId}/cancel`)
      .set('Authorization', bearer(token));
    expect(res.body.status).toBe('cancelled');
    // the pool is free again: a small sector run completes
    const next = await waitForRun(
      t,
      await startRun(t, token, await createGas(t, token, studyId, RING)),
    );
    expect(next.status, next.error ?? '').toBe('done');
  });

  it('refuses to store a divergent sector sum, naming sectors', async () => {
    const flat = { ...RING, weights: { kind: 'spectrum', expression: 'q^abs(p)' } };
    const res = await request(t.app)
      .post(`/api/studies/${studyId}/gases`)
      .set('Authorization', bearer(token))
      .send({ spec: flat });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('spec.sectors');
    expect(res.body.error.message).toMatch(/does not converge/);
  });
});
