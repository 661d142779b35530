import { createHash } from 'node:crypto';
import http from 'node:http';
import os from 'node:os';
import type { AddressInfo } from 'node:net';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bearer, finishedRun } from '../testing/gas-fixtures.js';
import { LARGE_TABLE, storeLargeClassTable } from '../testing/large-data.js';
import { freshConnections, p99 } from '../testing/load-helpers.js';
import { renderMatrix } from '@traceloom/shared/format';
import { Dataset, type User } from '../db/entities/index.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';
import { withBytes } from './dataset-access.js';
import { datasetCsv } from './dataset-document.js';
import { readSnapshot } from './snapshot.js';

/**
 * Replays "dataset create / page / export / lock parse the snapshot on the main thread": a run
 * with a ~60 MB class table (see testing/large-data.ts) becomes a dataset, whose page is read,
 * which is exported and locked, while /api/health is asked every 10 ms. Figures are printed
 * (docs/operations.md).
 */

const { rows: ROWS, terms: TERMS } = LARGE_TABLE;

/** Reads of the dataset page in the loop that is timed. */
const PAGE_READS = 250;
/**
 * Bound on health p99 while the page is read in a loop. The target is 50 ms; measured here
 * 22-41 ms at load average 2.5-8 and 76-133 ms at load 7.4-11.6 (four engineers' suites on two
 * cores), when the matrix export, which reads no page, showed 60-73 ms too. The bound leaves that
 * margin for a loaded shared machine; CI runs the suite alone on an idle one. Before (each read
 * walked the snapshot's overflow pages to reach the columns stored after it): 119-383 ms for
 * five reads.
 */
const PAGE_P99_MS = 150;
/**
 * Bound on health p99 while the large dataset is locked. The target is 50 ms; measured here
 * 24-44 ms over about 1,000 calls at load average 6-10 and 87 ms at 11.6; the bound leaves that
 * room for a loaded shared machine as the page's does. The lock's longest stall of the event
 * loop (printed) is not bounded: writing the row back with the canonical text takes seconds on
 * this thread (docs/operations.md).
 */
const LOCK_P99_MS = 150;
let t: TestApp;
let author: User;
let reviewer: User;
let steward: User;
/** Bearer tokens by person (the author's unless a step names another). */
const tokens = new Map<User, string>();
let server: http.Server;
let runId = '';

/** One request whose body is drained, never parsed (the client must not load the event loop). */
function call(
  method: string,
  path: string,
  body?: object,
  as: User = author,
): Promise<{ status: number; bytes: number; text: string }> {
  const { port } = server.address() as AddressInfo;
  const token = tokens.get(as)!;
  return new Promise((resolve, reject) => {
    const payload = body ? JSON.stringify(body) : undefined;
    const req = http.request(
      {
        agent: freshConnections,
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

/** A GET's whole body, for comparing bytes (not timed). */
function body(path: string): Promise<Buffer> {
  const { port } = server.address() as AddressInfo;
  return new Promise((resolve, reject) => {
    http
      .get(
        {
          agent: freshConnections,
          port,
          path: `/api${path}`,
          headers: { Authorization: bearer(tokens.get(author)!) },
        },
        (res) => {
          const chunks: Buffer[] = [];
          res.on('data', (c: Buffer) => chunks.push(c));
          res.on('end', () => resolve(Buffer.concat(chunks)));
        },
      )
      .on('error', reject);
  });
}

/**
 * Runs `work` while asking /api/health every 10 ms; the health latencies, the work's time, and
 * the longest stall of this thread's event loop (sampled every 5 ms), which also counts a stall
 * that falls between two health calls.
 */
async function underLoad<T>(work: () => Promise<T>) {
  const { port } = server.address() as AddressInfo;
  const latencies: number[] = [];
  const loop = monitorEventLoopDelay({ resolution: 5 });
  loop.enable();
  let done = false;
  const probe = (async () => {
    while (!done || latencies.length < 20) {
      const t0 = performance.now();
      await new Promise<void>((resolve, reject) =>
        http
          .get({ agent: freshConnections, port, path: '/api/health' }, (res) =>
            res.resume().on('end', resolve),
          )
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
  loop.disable();
  return {
    value,
    ms,
    p99: p99(latencies),
    max: Math.max(...latencies),
    calls: latencies.length,
    stall: loop.max / 1e6,
  };
}

const figures: string[] = [];
function report(
  what: string,
  m: { ms: number; p99: number; max: number; calls: number; stall: number },
) {
  figures.push(
    `${what}: ${m.ms.toFixed(0)} ms, health p99 ${m.p99.toFixed(1)} ms (max ${m.max.toFixed(0)} ms, ${m.calls} calls), loop stall max ${m.stall.toFixed(0)} ms`,
  );
}

beforeAll(async () => {
  t = await createTestApp();
  author = await insertUser(t, 'author');
  reviewer = await insertUser(t, 'reviewer');
  steward = await insertUser(t, 'steward');
  for (const person of [author, reviewer, steward]) tokens.set(person, await tokenFor(t, person));
  const studyId = await insertStudy(t, author, [reviewer, steward]);
  runId = await finishedRun(t, tokens.get(author)!, studyId);
  const bytes = await storeLargeClassTable(t, runId, ROWS, TERMS);
  expect(bytes).toBeGreaterThan(ROWS * 9800);
  server = t.app.listen(0);
}, 300_000);
afterAll(async () => {
  const load = os.loadavg().map((l) => l.toFixed(1));
  console.log(
    `large dataset (${ROWS} class rows of ${TERMS} terms, load average ${load.join(' ')}):\n  ${figures.join('\n  ')}`,
  );
  server.close();
  await t.close();
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
    // One client reading the page in a loop: enough reads for over 100 health calls, so that
    // p99 is not simply the largest (one garbage-collection pause of this process).
    const page = await underLoad(async () => {
      for (let i = 0; i < PAGE_READS; i++) {
        const read = await call('GET', `/datasets/${id}`);
        expect(read.status).toBe(200);
        // The page carries the summary and check rows, never the class table.
        expect(read.bytes).toBeLessThan(20_000);
      }
    });
    report(`dataset page x${PAGE_READS}`, page);
    const list = await underLoad(() => call('GET', '/datasets'));
    report('dataset list', list);
    // Measured 28-92 ms at load 7-10 (the snapshot text still crosses from the worker and into
    // SQLite on this thread); the bound leaves room for a loaded shared machine. Before, the
    // result was parsed, joined and serialized here. Exports and the lock: docs/operations.md.
    expect(created.p99).toBeLessThan(250);
    // Bound: see PAGE_P99_MS.
    expect(page.p99).toBeLessThan(PAGE_P99_MS);
  }, 300_000);

  it('is exported on a run thread: health answers while it renders, the bytes are unchanged', async () => {
    expect(id).not.toBe('');
    const csv = await underLoad(() => call('GET', `/datasets/${id}/export?format=csv`));
    expect(csv.value.status, csv.value.text).toBe(200);
    report(`CSV export (${(csv.value.bytes / 1e6).toFixed(1)} MB)`, csv);
    const matrix = await underLoad(() => call('GET', `/datasets/${id}/export?format=matrix`));
    expect(matrix.value.status, matrix.value.text).toBe(200);
    report(`matrix export (${(matrix.value.bytes / 1e6).toFixed(1)} MB)`, matrix);
    // Before, the snapshot was parsed and the text built here, stalling health for the whole
    // render; the bound leaves room for a loaded shared machine.
    expect(csv.max).toBeLessThan(1000);
    expect(matrix.max).toBeLessThan(1000);
    // The bytes are those the main thread rendered before (same functions, called here).
    const manager = t.dataSource.manager;
    const d = await withBytes(
      manager,
      await manager.getRepository(Dataset).findOneByOrFail({ id }),
    );
    const result = readSnapshot(d.snapshot).result;
    const heading = { title: d.title, version: d.version, lockedAt: d.lockedAt, hash: d.hash };
    const here = Buffer.from(datasetCsv(heading, result), 'utf8');
    expect(here.length).toBeGreaterThan(1e6);
    expect((await body(`/datasets/${id}/export?format=csv`)).equals(here)).toBe(true);
    const hereMatrix = Buffer.from(renderMatrix(result), 'utf8');
    expect((await body(`/datasets/${id}/export?format=matrix`)).equals(hereMatrix)).toBe(true);
  }, 300_000);

  it('is locked on a run thread: health answers while it hashes, the hash is that of the JSON export', async () => {
    expect(id).not.toBe('');
    // Putting it in review changes the row's state, which SQLite writes as a whole new row:
    // timed to show what that costs this thread (docs/operations.md), not bounded.
    const asked = await underLoad(() =>
      call('POST', `/datasets/${id}/review-requests`, { reviewerIds: [reviewer.id] }),
    );
    expect(asked.value.status, asked.value.text).toBe(200);
    report('review request', asked);
    const approved = await call(
      'POST',
      `/datasets/${id}/reviews`,
      { verdict: 'approve', comment: 'Reproduced.' },
      reviewer,
    );
    expect(approved.status, approved.text).toBe(201);
    const lock = await underLoad(() => call('POST', `/datasets/${id}/lock`, undefined, steward));
    expect(lock.value.status, lock.value.text).toBe(200);
    report('lock', lock);
    const hash = /"hash":"([0-9a-f]{64})"/.exec(lock.value.text)![1]!;
    // The document is built, canonicalized and hashed on a run thread; this thread reads the
    // snapshot out of SQLite and writes the row back with the canonical text (both tens of
    // megabytes), which is the longest stall printed.
    // Bound: see LOCK_P99_MS.
    expect(lock.p99).toBeLessThan(LOCK_P99_MS);
    const json = await body(`/datasets/${id}/export?format=json`);
    expect(json.length).toBeGreaterThan(ROWS * 9800);
    expect(createHash('sha256').update(json).digest('hex')).toBe(hash);
  }, 300_000);
});
