import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { authorStudy, type AuthorStudy } from '../testing/author-study.js';
import { bearer, finishedRun } from '../testing/gas-fixtures.js';
import { LARGE_TABLE, storeLargeClassTable } from '../testing/large-data.js';
import { p99 } from '../testing/load-helpers.js';

/**
 * Replays "dataset create / page / export / lock parse the snapshot on the main thread": a run
 * with a ~60 MB class table (see testing/large-data.ts) becomes a dataset, whose page is read,
 * while /api/health is asked every 10 ms. Figures are printed (docs/operations.md).
 */

const { rows: ROWS, terms: TERMS } = LARGE_TABLE;
let s: AuthorStudy;
let server: http.Server;
let runId = '';

/** One request whose body is drained, never parsed (the client must not load the event loop). */
function call(
  method: string,
  path: string,
  body?: object,
): Promise<{ status: number; bytes: number; text: string }> {
  const { port } = server.address() as AddressInfo;
  const token = s.token;
  return new Promise((resolve, reject) => {
    const payload = body ? JSON.stringify(body) : undefined;
    const req = http.request(
      {
        port,
        path: `/api${path}`,
        method,
        headers: {
          Authorization: bearer(token),
          ...(payload && { 'Content-Type': 'application/json' }),
        },
      },
      (res) => {
        let bytes = 0;
        let head = '';
        res.on('data', (chunk: Buffer) => {
          bytes += chunk.length;
          if (head.length < 2000) head += chunk.toString('utf8', 0, 2000);
        });
        res.on('end', () => resolve({ status: res.statusCode ?? 0, bytes, text: head }));
      },
    );
    req.on('error', reject);
    req.end(payload);
  });
}

/** Runs `work` while asking /api/health every 10 ms; the health latencies and the work's time. */
async function underLoad<T>(work: () => Promise<T>) {
  const { port } = server.address() as AddressInfo;
  const latencies: number[] = [];
  let done = false;
  const probe = (async () => {
    while (!done || latencies.length < 20) {
      const t0 = performance.now();
      await new Promise<void>((resolve, reject) =>
        http
          .get({ port, path: '/api/health' }, (res) => res.resume().on('end', resolve))
          .on('error', reject),
      );
      latencies.push(performance.now() - t0);
      await new Promise((r) => setTimeout(r, 10));
    }
  })();
  const t0 = performance.now();
  const value = await work();
  const ms = performance.now() - t0;
  done = true;
  await probe;
  return { value, ms, p99: p99(latencies), max: Math.max(...latencies), calls: latencies.length };
}

const figures: string[] = [];
function report(what: string, m: { ms: number; p99: number; max: number; calls: number }) {
  figures.push(
    `${what}: ${m.ms.toFixed(0)} ms, health p99 ${m.p99.toFixed(1)} ms (max ${m.max.toFixed(0)} ms, ${m.calls} calls)`,
  );
}

beforeAll(async () => {
  s = await authorStudy();
  runId = await finishedRun(s.t, s.token, s.studyId);
  const bytes = await storeLargeClassTable(s.t, runId, ROWS, TERMS);
  expect(bytes).toBeGreaterThan(ROWS * 9800);
  server = s.t.app.listen(0);
}, 300_000);
afterAll(async () => {
  console.log(`large dataset (${ROWS} class rows of ${TERMS} terms):\n  ${figures.join('\n  ')}`);
  server.close();
  await s.t.close();
});

describe('a large dataset stays off the main thread', () => {
  let id = '';

  it('is created, its page read and the list answered without parsing the snapshot here', async () => {
    const created = await underLoad(() =>
      call('POST', `/runs/${runId}/datasets`, { title: 'large table' }),
    );
    expect(created.value.status, created.value.text).toBe(201);
    id = /"id":"([^"]+)"/.exec(created.value.text)![1]!;
    report('create', created);
    const page = await underLoad(async () => {
      for (let i = 0; i < 5; i++) {
        expect((await call('GET', `/datasets/${id}`)).status).toBe(200);
      }
    });
    report('dataset page x5', page);
    const list = await underLoad(() => call('GET', '/datasets'));
    report('dataset list', list);
    // Measured 28-92 ms at load 7-10 (the snapshot text still crosses from the worker and into
    // SQLite on this thread); the bound leaves room for a loaded shared machine. Before, the
    // result was parsed, joined and serialized here. Exports and the lock: docs/operations.md.
    expect(created.p99).toBeLessThan(250);
    expect(page.p99).toBeLessThan(1000);
  }, 300_000);
});
