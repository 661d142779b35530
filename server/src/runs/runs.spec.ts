import type { Server } from 'node:http';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { User } from '../db/entities/index.js';
import { bearer, createGas, RUNAWAY_SPEC, startRun, waitForRun } from '../testing/gas-fixtures.js';
import { p99, sseReader } from '../testing/load-helpers.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';

let t: TestApp;
let author: User;
let token: string;
let studyId: string;
let server: Server;

beforeAll(async () => {
  t = await createTestApp({
    runs: {
      threads: 2,
      wallClockMs: 1000,
      perUserCap: 2,
      maxOldGenerationSizeMb: 512,
      previewMs: 1500,
    },
  });
  author = await insertUser(t, 'author');
  token = await tokenFor(t, author);
  studyId = await insertStudy(t, author);
  server = t.app.listen(0);
});
afterAll(async () => {
  server.close();
  await t.close();
});

describe('runs', () => {
  it('runs a gas in the background and answers its result', async () => {
    const gasId = await createGas(t, token, studyId);
    const runId = await startRun(t, token, gasId);
    const run = await waitForRun(t, runId);
    expect(run.status, run.error ?? '').toBe('done');
    const res = await request(t.app).get(`/api/runs/${runId}`).set('Authorization', bearer(token));
    expect(res.status).toBe(200);
    expect(res.body.result.format).toBe('traceloom.result/1');
    expect(res.body.result.classes).toBeUndefined();
    // Class table for N = 1..4: p(1..4) = 1, 2, 3, 5 cycle types (OEIS A000041).
    expect(res.body.classCounts).toEqual({ 1: 1, 2: 2, 3: 3, 4: 5 });
    // Z(2) of the trap = q^2/((1-q)(1-q^2)) = q^2 + q^3 + 2q^4 + ... (q-binomial series, DLMF 17.2.37 — from memory).
    expect(res.body.result.canonical[2].value.terms.slice(0, 3)).toEqual([
      ['2', '1'],
      ['3', '1'],
      ['4', '2'],
    ]);
    expect(res.body.result.grandCheck.every((row: { agrees: boolean }) => row.agrees)).toBe(true);
    const only3 = await request(t.app)
      .get(`/api/runs/${runId}?classes=3`)
      .set('Authorization', bearer(token));
    expect(only3.body.result.classes).toHaveLength(3);
    expect(only3.body.result.classes.every((row: { N: number }) => row.N === 3)).toBe(true);
    const list = await request(t.app)
      .get(`/api/gases/${gasId}/runs`)
      .set('Authorization', bearer(token));
    expect(list.body.map((r: { id: string }) => r.id)).toEqual([runId]);
    expect(list.body[0]).toMatchObject({
      gasVersion: 1,
      status: 'done',
      createdBy: { id: author.id },
    });
    expect(list.body[0].durationMs).toBeGreaterThanOrEqual(0);
  });

  it('kills a runaway run within its limit + 0.5 s while health stays fast, then runs the next one', async () => {
    const gasId = await createGas(t, token, studyId, RUNAWAY_SPEC);
    const runId = await startRun(t, token, gasId);
    const running = await waitForRun(t, runId, ['running', 'done', 'failed']);
    expect(running.status).toBe('running');
    const latencies: number[] = [];
    let finished = false;
    const watch = waitForRun(t, runId, ['done', 'failed', 'cancelled'], 10_000).then((run) => {
      finished = true;
      return run;
    });
    while (!finished) {
      const t0 = performance.now();
      const health = await request(server).get('/api/health');
      latencies.push(performance.now() - t0);
      expect(health.status).toBe(200);
      await new Promise((r) => setTimeout(r, 10));
    }
    const run = await watch;
    expect(run.status).toBe('failed');
    expect(run.error).toMatch(/wall-clock limit of 1 s/);
    const elapsed = Date.parse(run.finishedAt!) - Date.parse(run.startedAt!);
    console.log(
      `runaway: killed after ${elapsed} ms; health p99 ${p99(latencies).toFixed(1)} ms over ${latencies.length} calls`,
    );
    expect(elapsed).toBeGreaterThanOrEqual(1000);
    expect(elapsed).toBeLessThan(1500);
    expect(latencies.length).toBeGreaterThan(10);
    expect(p99(latencies)).toBeLessThan(50);
    const next = await waitForRun(t, await startRun(t, token, await createGas(t, token, studyId)));
    expect(next.status, next.error ?? '').toBe('done');
  });

  it('cancels a running run, and refuses to cancel a finished one', async () => {
    const runId = await startRun(t, token, await createGas(t, token, studyId, RUNAWAY_SPEC));
    await waitForRun(t, runId, ['running']);
    const res = await request(t.app)
      .post(`/api/runs/${runId}/cancel`)
      .set('Authorization', bearer(token));
    expect(res.status).toBe(200);
    expect(res.body.status).toBe('cancelled');
    const again = await request(t.app)
      .post(`/api/runs/${runId}/cancel`)
      .set('Authorization', bearer(token));
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('not_active');
    // The slot is free again: a normal run completes.
    const next = await waitForRun(t, await startRun(t, token, await createGas(t, token, studyId)));
    expect(next.status).toBe('done');
  });

  it('caps concurrent runs per person (429 too_many_runs)', async () => {
    const gasId = await createGas(t, token, studyId, RUNAWAY_SPEC);
    const a = await startRun(t, token, gasId);
    const b = await startRun(t, token, gasId);
    const third = await request(t.app)
      .post(`/api/gases/${gasId}/runs`)
      .set('Authorization', bearer(token))
      .send({});
    expect(third.status).toBe(429);
    expect(third.body.error.code).toBe('too_many_runs');
    for (const id of [a, b]) {
      await request(t.app).post(`/api/runs/${id}/cancel`).set('Authorization', bearer(token));
    }
  });

  it('streams progress events at least every 250 ms, then an end event', async () => {
    const runId = await startRun(t, token, await createGas(t, token, studyId, RUNAWAY_SPEC));
    const events: Array<{ event: string; at: number; data: Record<string, unknown> }> = [];
    const res = await request(t.app)
      .get(`/api/runs/${runId}/events`)
      .set('Authorization', bearer(token))
      .buffer(true)
      .parse((stream, done) => {
        stream.on(
          'data',
          sseReader((e) => events.push({ ...e, at: Date.now() })),
        );
        stream.on('end', () => done(null, ''));
      });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/event-stream/);
    const progress = events.filter((e) => e.event === 'progress');
    expect(progress.length).toBeGreaterThan(3);
    expect(progress.some((e) => e.data.status === 'running')).toBe(true);
    const gaps = progress.slice(1).map((e, i) => e.at - progress[i]!.at);
    expect(Math.max(...gaps)).toBeLessThan(250 + 50);
    const end = events.at(-1)!;
    expect(end.event).toBe('end');
    expect(end.data.status).toBe('failed');
  });
});
