import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_CONFIG } from '../config.js';
import { Run } from '../db/entities/index.js';
import { bearer, createGas, RUNAWAY_SPEC, startRun, waitForRun } from '../testing/gas-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';

/** Replays the thread hog: one author's two long runs held both threads for up to 10 minutes. */

let t: TestApp;

beforeAll(async () => {
  t = await createTestApp({
    runs: { ...DEFAULT_CONFIG.runs, threads: 2, perUserCap: 2, wallClockMs: 120_000 },
  });
});
afterAll(async () => {
  await t.close();
});

describe('fair share of the run threads', () => {
  it("keeps one thread free of one person's runs, so another person's run starts at once", async () => {
    const hog = await insertUser(t, 'author');
    const other = await insertUser(t, 'author');
    const hogToken = await tokenFor(t, hog);
    const otherToken = await tokenFor(t, other);
    const hogGas = await createGas(t, hogToken, await insertStudy(t, hog), RUNAWAY_SPEC);
    const first = await startRun(t, hogToken, hogGas);
    const second = await startRun(t, hogToken, hogGas);
    await waitForRun(t, first, ['running']);
    await new Promise((r) => setTimeout(r, 500));
    const runs = t.dataSource.getRepository(Run);
    expect((await runs.findOneByOrFail({ id: second })).status).toBe('queued');
    const t0 = Date.now();
    const quick = await startRun(
      t,
      otherToken,
      await createGas(t, otherToken, await insertStudy(t, other)),
    );
    const done = await waitForRun(t, quick, ['done', 'failed'], 60_000);
    const waited = Date.now() - t0;
    expect(done.status, done.error ?? '').toBe('done');
    expect((await runs.findOneByOrFail({ id: second })).status).toBe('queued');
    console.log(
      `fair share: another person's run finished ${waited} ms after it was queued, beside the hog's running run`,
    );
    for (const id of [first, second]) {
      await request(t.app).post(`/api/runs/${id}/cancel`).set('Authorization', bearer(hogToken));
    }
  }, 120_000);
});
