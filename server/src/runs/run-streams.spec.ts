import http from 'node:http';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { signToken } from '../auth/tokens.js';
import { DEFAULT_CONFIG } from '../config.js';
import type { User } from '../db/entities/index.js';
import { bearer, createGas, RUNAWAY_SPEC, startRun, waitForRun } from '../testing/gas-fixtures.js';
import { freshConnections, p99, sseReader, type SseEvent } from '../testing/load-helpers.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  tokenSecretOf,
  type TestApp,
} from '../testing/test-app.js';

/** Replays the event-stream findings: no cap, a poll per stream, streams outliving sign-out. */

const PER_USER = 8;
const TOTAL = 12;

let t: TestApp;
let server: http.Server;
let author: User;
let token: string;
let studyId: string;
let runId: string;
let reviewer: User;
/** Streams a test opened, closed after it whatever its outcome. */
let openedHere: OpenStream[] = [];

interface OpenStream {
  status: number;
  events: SseEvent[];
  ended: Promise<void>;
  close: () => void;
}

/** Opens a stream with a raw request and collects its events until the server closes it. */
function openStream(path: string, headers: Record<string, string>): Promise<OpenStream> {
  const { port } = server.address() as AddressInfo;
  return new Promise((resolve, reject) => {
    const req = http.get({ agent: freshConnections, port, path, headers }, (res) => {
      const events: SseEvent[] = [];
      const ended = new Promise<void>((done) => res.on('close', done));
      res.on(
        'data',
        sseReader((e) => events.push(e)),
      );
      resolve({ status: res.statusCode ?? 0, events, ended, close: () => req.destroy() });
    });
    req.on('error', reject);
  });
}

const streamPath = () => `/api/runs/${runId}/events`;

beforeAll(async () => {
  t = await createTestApp({
    runs: {
      ...DEFAULT_CONFIG.runs,
      wallClockMs: 120_000,
      streamsPerUser: PER_USER,
      streamsTotal: TOTAL,
    },
  });
  author = await insertUser(t, 'author');
  token = await tokenFor(t, author);
  reviewer = await insertUser(t, 'reviewer');
  studyId = await insertStudy(t, author, [reviewer]);
  runId = await startRun(t, token, await createGas(t, token, studyId, RUNAWAY_SPEC));
  await waitForRun(t, runId, ['running']);
  server = t.app.listen(0);
});
afterAll(async () => {
  await request(t.app).post(`/api/runs/${runId}/cancel`).set('Authorization', bearer(token));
  server.close();
  await t.close();
});

afterEach(async () => {
  for (const s of openedHere) s.close();
  await Promise.all(openedHere.map((s) => s.ended));
  openedHere = [];
});

describe('run event streams', () => {
  it('takes no token in the URL', async () => {
    const res = await request(t.app).get(`${streamPath()}?access_token=${token}`);
    expect(res.status).toBe(401);
  });

  it(`caps streams at ${PER_USER} per person and ${TOTAL} in all, with one publisher per run, while health stays fast`, async () => {
    const { events } = t.services;
    const reviewerToken = await tokenFor(t, reviewer);
    // The finding: 1,000 streams from one reviewer. Now 8 open and the rest are refused at once.
    const opened: OpenStream[] = [];
    const statuses: number[] = [];
    openedHere = opened;
    const f0 = performance.now();
    for (let batch = 0; batch < 1000; batch += 50) {
      const got = await Promise.all(
        Array.from({ length: 50 }, () =>
          openStream(streamPath(), { Authorization: bearer(reviewerToken) }),
        ),
      );
      for (const s of got) {
        statuses.push(s.status);
        if (s.status === 200) opened.push(s);
        else s.close();
      }
    }
    const floodMs = performance.now() - f0;
    expect(statuses.filter((s) => s === 200)).toHaveLength(PER_USER);
    expect(statuses.filter((s) => s === 429)).toHaveLength(1000 - PER_USER);
    expect(events.openStreams(reviewer.id)).toBe(PER_USER);
    expect(events.watchedRuns()).toBe(1);
    // The author may still open streams up to the total.
    const more = await Promise.all(
      Array.from({ length: TOTAL - PER_USER + 1 }, () =>
        openStream(streamPath(), { Authorization: bearer(token) }),
      ),
    );
    opened.push(...more);
    expect(more.map((s) => s.status).sort()).toEqual([...Array(TOTAL - PER_USER).fill(200), 429]);
    expect(events.openStreams()).toBe(TOTAL);
    // Health while every allowed stream is open and its run's publisher ticks.
    const latencies: number[] = [];
    const until = Date.now() + 3000;
    while (Date.now() < until) {
      const t0 = performance.now();
      await request(server).get('/api/health');
      latencies.push(performance.now() - t0);
      await new Promise((r) => setTimeout(r, 10));
    }
    console.log(
      `streams: 1000 asked by one person in ${floodMs.toFixed(0)} ms, ${PER_USER} opened, ${1000 - PER_USER} refused with 429; ` +
        `with ${TOTAL} open, health p99 ${p99(latencies).toFixed(1)} ms over ${latencies.length} calls`,
    );
    expect(latencies.length).toBeGreaterThan(100);
    expect(p99(latencies)).toBeLessThan(50);
    for (const s of opened) s.close();
    await Promise.all(opened.map((s) => s.ended));
    await new Promise((r) => setTimeout(r, 100));
    expect(events.openStreams()).toBe(0);
    expect(events.watchedRuns()).toBe(0);
  }, 60_000);

  it('closes a stream within about a second of sign-out', async () => {
    const other = await insertUser(t, 'author');
    const otherToken = await tokenFor(t, other);
    const own = await startRun(
      t,
      otherToken,
      await createGas(t, otherToken, await insertStudy(t, other), RUNAWAY_SPEC),
    );
    const stream = await openStream(`/api/runs/${own}/events`, {
      Authorization: bearer(otherToken),
    });
    expect(stream.status).toBe(200);
    await new Promise((r) => setTimeout(r, 300));
    expect(stream.events.some((e) => e.event === 'progress')).toBe(true);
    const t0 = Date.now();
    expect(
      (await request(t.app).post('/api/auth/logout').set('Authorization', bearer(otherToken)))
        .status,
    ).toBe(204);
    await stream.ended;
    const after = Date.now() - t0;
    console.log(`streams: closed ${after} ms after sign-out`);
    expect(after).toBeLessThan(2000);
    expect(stream.events.at(-1)).toEqual({ event: 'closed', data: { reason: 'token revoked' } });
    await request(t.app)
      .post(`/api/runs/${own}/cancel`)
      .set('Authorization', bearer(await tokenFor(t, other)));
  });

  it('closes a stream when its token expires', async () => {
    // a run of its own that outlives the 2 s token (a finished run would end the stream first)
    const other = await insertUser(t, 'author');
    const otherToken = await tokenFor(t, other);
    const own = await startRun(
      t,
      otherToken,
      await createGas(t, otherToken, await insertStudy(t, other), RUNAWAY_SPEC),
    );
    const short = signToken({ sub: other.id, tv: 0, role: 'author' }, tokenSecretOf(t), 2).token;
    const stream = await openStream(`/api/runs/${own}/events`, { Authorization: bearer(short) });
    expect(stream.status).toBe(200);
    const t0 = Date.now();
    await stream.ended;
    expect(Date.now() - t0).toBeLessThan(3500);
    expect(stream.events.at(-1)).toEqual({ event: 'closed', data: { reason: 'token expired' } });
    await request(t.app).post(`/api/runs/${own}/cancel`).set('Authorization', bearer(otherToken));
  });
});
