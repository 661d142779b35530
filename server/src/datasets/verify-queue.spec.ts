import http from 'node:http';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_CONFIG } from '../config.js';
import { AuditEvent, type User } from '../db/entities/index.js';
import { lockedDataset, warmWorkers } from '../testing/dataset-fixtures.js';
import { bearer, createGas, RUNAWAY_SPEC, startRun, waitForRun } from '../testing/gas-fixtures.js';
import { freshConnections } from '../testing/load-helpers.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';

// Verify shares the run threads (issue finding: six verifies delayed another user's 1 s run to
// 36 s and kept computing after their clients left). One run thread here: while another
// person's run holds it, a verify waits in the runs' line.
let t: TestApp;
let server: http.Server;
let author: User;
let reviewer: User;
let steward: User;
let studyId: string;

beforeAll(async () => {
  t = await createTestApp({
    runs: { ...DEFAULT_CONFIG.runs, threads: 1, perUserCap: 1, wallClockMs: 120_000 },
  });
  author = await insertUser(t, 'author');
  reviewer = await insertUser(t, 'reviewer');
  steward = await insertUser(t, 'steward');
  studyId = await insertStudy(t, author, [reviewer, steward]);
  await warmWorkers(t, author);
  server = t.app.listen(0);
});
afterAll(async () => {
  server.close();
  await t.close();
});

/** Posts a verify on a raw connection, so the test can leave before the answer. */
function verifyRequest(datasetId: string, token: string) {
  const { port } = server.address() as AddressInfo;
  const req = http.request({
    agent: freshConnections,
    port,
    method: 'POST',
    path: `/api/datasets/${datasetId}/verify`,
    headers: { Authorization: bearer(token), 'Content-Type': 'application/json' },
  });
  const answered = new Promise<number>((resolve) => {
    req.on('response', (res) => {
      res.resume();
      resolve(res.statusCode ?? 0);
    });
    req.on('error', () => resolve(0));
  });
  req.end('{}');
  return { answered, leave: () => req.destroy() };
}

async function until(check: () => boolean, ms = 10_000): Promise<void> {
  const end = Date.now() + ms;
  while (!check()) {
    if (Date.now() > end) throw new Error('timed out waiting');
    await new Promise((r) => setTimeout(r, 20));
  }
}

describe('verify through the run executor', () => {
  it('waits in the runs line, counts against the per-user cap, leaves the line on disconnect, and is kept per locked dataset', async () => {
    const locked = await lockedDataset(t, { author, reviewer, steward }, studyId);
    const stewardToken = await tokenFor(t, steward);
    const { executor } = t.services;

    // Another person's long run holds the only run thread.
    const authorToken = await tokenFor(t, author);
    const hog = await startRun(
      t,
      authorToken,
      await createGas(t, authorToken, studyId, RUNAWAY_SPEC),
    );
    await waitForRun(t, hog, ['running']);

    const first = verifyRequest(locked.id, stewardToken);
    await until(() => executor.jobCounts().queued === 1);
    expect(executor.jobsOf(steward.id)).toBe(1);

    // The cap (1 here) counts the waiting verify: a second one is refused at once.
    const second = await request(t.app)
      .post(`/api/datasets/${locked.id}/verify`)
      .set('Authorization', bearer(stewardToken))
      .send({});
    expect(second.status).toBe(429);
    expect(second.body.error.code).toBe('too_many_runs');

    // The client leaves: its verify leaves the line without having computed.
    first.leave();
    await until(() => executor.jobCounts().queued === 0);
    expect(executor.jobsOf(steward.id)).toBe(0);

    // The thread is free again: the verify runs and passes; the second answer is the kept one.
    await request(t.app).post(`/api/runs/${hog}/cancel`).set('Authorization', bearer(authorToken));
    await waitForRun(t, hog, ['cancelled']);
    const ran = await request(t.app)
      .post(`/api/datasets/${locked.id}/verify`)
      .set('Authorization', bearer(stewardToken))
      .send({})
      .expect(200);
    expect(ran.body).toMatchObject({ ok: true, hashOk: true, mismatches: [] });
    const kept = await request(t.app)
      .post(`/api/datasets/${locked.id}/verify`)
      .set('Authorization', bearer(stewardToken))
      .send({})
      .expect(200);
    expect(kept.body).toMatchObject({ ok: true, hashOk: true, mismatches: [] });
    const events = await t.dataSource.getRepository(AuditEvent).find({
      where: { action: 'dataset.verify', targetId: locked.id },
      order: { createdAt: 'ASC' },
    });
    expect(events.map((e) => JSON.parse(e.detail).cached)).toEqual([false, true]);
  }, 180_000);
});
