import { spawn } from 'node:child_process';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bearer, createGas, startRun, waitForRun } from '../testing/gas-fixtures.js';
import { freshConnections, p99 } from '../testing/load-helpers.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';
import { LARGE_TABLE, storeLargeClassTable } from '../testing/large-data.js';

/**
 * Replays the large-data finding: a run whose class table is as big as a spec within the
 * documented limits gives (nMax 40, class table 30: ~60 MB of JSON), read in a loop by one client;
 * /api/health must keep p99 < 50 ms meanwhile. Dataset lists with such a snapshot stored must stay
 * fast. (Verify parses and compares in a worker; datasets.spec.ts covers its answers.)
 */

const { rows: ROWS, terms: TERMS } = LARGE_TABLE;

let t: TestApp;
let server: http.Server;
let token: string;
let outsiderToken: string;
let runId: string;
let storedBytes = 0;

/** A client loop: GET the class table of N = 30 and the run, draining bodies; reports on SIGTERM. */
const READER = `
const http = require('node:http');
const [port, token, runId] = process.argv.slice(1);
const counts = { classes: 0, runs: 0, bytes: 0, slowestMs: 0 };
const get = (path) => new Promise((resolve, reject) => {
  http.get({ agent: false, port, path, headers: { Authorization: 'Bearer ' + token } }, (res) => {
    let bytes = 0;
    res.on('data', (c) => (bytes += c.length));
    res.on('end', () => (res.statusCode === 200 ? resolve(bytes) : reject(new Error('status ' + res.statusCode))));
  }).on('error', reject);
});
process.on('SIGTERM', () => { console.log(JSON.stringify(counts)); process.exit(0); });
(async () => {
  for (;;) {
    const t0 = Date.now();
    counts.bytes = await get('/api/runs/' + runId + '?classes=30');
    counts.slowestMs = Math.max(counts.slowestMs, Date.now() - t0);
    counts.classes++;
    console.log(JSON.stringify(counts));
    await get('/api/runs/' + runId);
    counts.runs++;
  }
})().catch((e) => { console.error(e); process.exit(1); });
`;

/** GET that drains the body without parsing it (so the client does not load the event loop). */
function drain(
  path: string,
  auth?: string,
  method = 'GET',
): Promise<{ status: number; bytes: number }> {
  const { port } = server.address() as AddressInfo;
  return new Promise((resolve, reject) => {
    const req = http.request(
      {
        agent: freshConnections,
        port,
        path,
        method,
        headers: auth ? { Authorization: bearer(auth) } : {},
      },
      (res) => {
        let bytes = 0;
        res.on('data', (chunk: Buffer) => (bytes += chunk.length));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, bytes }));
      },
    );
    req.on('error', reject);
    req.end();
  });
}

beforeAll(async () => {
  t = await createTestApp({}, (err) => console.error('server error:', err));
  const author = await insertUser(t, 'author');
  const outsider = await insertUser(t, 'steward');
  token = await tokenFor(t, author);
  outsiderToken = await tokenFor(t, outsider);
  const studyId = await insertStudy(t, author);
  runId = await startRun(t, token, await createGas(t, token, studyId));
  expect((await waitForRun(t, runId)).status).toBe('done');
  const t0 = performance.now();
  storedBytes = await storeLargeClassTable(t, runId, ROWS, TERMS);
  console.log(`large data: class pages stored in ${(performance.now() - t0).toFixed(0)} ms`);
  const t1 = performance.now();
  const created = await request(t.app)
    .post(`/api/runs/${runId}/datasets`)
    .set('Authorization', bearer(token))
    .send({ title: 'large table' });
  expect(created.status).toBe(201);

  console.log(`large data: dataset created in ${(performance.now() - t1).toFixed(0)} ms`);
  server = t.app.listen(0);
}, 300_000);
afterAll(async () => {
  server.close();
  await t.close();
});

describe('large data stays off the main thread', () => {
  it('keeps health p99 < 50 ms while one client reads a ~60 MB class table in a loop', async () => {
    expect(storedBytes).toBeGreaterThan(ROWS * 9800);
    // The reading client runs in its own process, as a real client would: only the server's
    // work is on this event loop.
    const { port } = server.address() as AddressInfo;
    const reader = spawn(process.execPath, ['-e', READER, String(port), token, runId], {
      stdio: ['ignore', 'pipe', 'inherit'],
    });
    let report = '';
    reader.stdout.on('data', (chunk: Buffer) => (report += chunk.toString('utf8')));
    const finished = new Promise<void>((resolve) => reader.on('close', () => resolve()));
    const latencies: number[] = [];
    const until = Date.now() + 5000;
    while (Date.now() < until || !report.includes('"classes":')) {
      const t0 = performance.now();
      expect((await drain('/api/health')).status).toBe(200);
      latencies.push(performance.now() - t0);
      await new Promise((r) => setTimeout(r, 10));
    }
    reader.kill('SIGTERM');
    await finished;
    const counts = JSON.parse(report.trim().split('\n').at(-1)!) as {
      classes: number;
      runs: number;
      bytes: number;
      slowestMs: number;
    };
    console.log(
      `large data: health p99 ${p99(latencies).toFixed(1)} ms, max ${Math.max(...latencies).toFixed(1)} ms over ${latencies.length} calls, ` +
        `while one client read the ${(counts.bytes / 1e6).toFixed(1)} MB class table ${counts.classes} times (slowest ${counts.slowestMs} ms) ` +
        `and the run ${counts.runs} times in a loop`,
    );
    expect(counts.classes).toBeGreaterThan(0);
    expect(counts.bytes).toBeGreaterThan(ROWS * 9800);
    expect(latencies.length).toBeGreaterThan(100);
    expect(p99(latencies)).toBeLessThan(50);
  }, 300_000);

  it('lists datasets without their snapshots: fast for a person who sees none and for the owner', async () => {
    for (const [who, auth, count] of [
      ['outsider', outsiderToken, 0],
      ['owner', token, 1],
    ] as const) {
      const times: number[] = [];
      for (let i = 0; i < 20; i++) {
        const t0 = performance.now();
        const res = await request(t.app).get('/api/datasets').set('Authorization', bearer(auth));
        times.push(performance.now() - t0);
        expect(res.status).toBe(200);
        expect(res.body).toHaveLength(count);
      }
      console.log(
        `large data: GET /api/datasets for the ${who}: p99 ${p99(times).toFixed(1)} ms over 20 calls`,
      );
      // Before: 6-8 s per call. The bound leaves room for a loaded shared machine.
      expect(p99(times)).toBeLessThan(2000);
    }
  });

  it('pages class rows: one page answers at most 500 rows, and the pages add up to the table', async () => {
    const head = await request(t.app).get(`/api/runs/${runId}`).set('Authorization', bearer(token));
    expect(head.body.classCounts['30']).toBe(ROWS);
    const pages = head.body.classPages['30'];
    expect(pages).toBe(Math.ceil(ROWS / 500));
    const last = await request(t.app)
      .get(`/api/runs/${runId}?classes=30&classPage=${pages - 1}`)
      .set('Authorization', bearer(token));
    expect(last.status).toBe(200);
    expect(last.body.result.classes).toHaveLength(ROWS - 500 * (pages - 1));
    expect(last.body.result.classes[0].size).toBe(String(500 * (pages - 1) + 1));
    const bad = await request(t.app)
      .get(`/api/runs/${runId}?classPage=1`)
      .set('Authorization', bearer(token));
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('classPage');
  });
});
