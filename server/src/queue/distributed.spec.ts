import { compute } from '@traceloom/shared/engine';
import { Queue } from 'bullmq';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Run } from '../db/entities/index.js';
import { bearer, createGas, RUNAWAY_SPEC, startRun, TRAP_SPEC } from '../testing/gas-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';
import { redisAvailable, startRedis, startWorker } from './redis-for-tests.js';
import { redisConnection } from './remote-runs.js';
import { RUN_QUEUE } from './wire.js';

/** Lock time of the test workers: a killed worker's job is taken again within about 2 x this. */
const LOCK_MS = 2000;

/** A run of a few seconds on one thread (measured 3.4 s for nMax 120 on this machine). */
const MEDIUM = { ...RUNAWAY_SPEC, title: 'medium', nMax: 150 };

/** Specs of the stream: small runs whose results the engine gives in one piece as well. */
const STREAM = [
  TRAP_SPEC,
  { ...TRAP_SPEC, title: 'trap, bosons', statistics: 'boson', grand: undefined },
  { ...RUNAWAY_SPEC, title: 'small ladder', order: '200', nMax: 20 },
  { ...RUNAWAY_SPEC, title: 'ladder', order: '600', nMax: 40 },
  { ...TRAP_SPEC, title: 'trap to order 40', order: '40', nMax: 8 },
  { ...RUNAWAY_SPEC, title: 'ladder, longer', order: '1000', nMax: 60 },
].map((s) => JSON.parse(JSON.stringify(s)) as object);

/** A result without its clocks and class rows. */
function untimed(r: Record<string, unknown>) {
  const { timings: _t, classes: _c, ...rest } = r;
  return rest;
}

const available = redisAvailable();
if (!available) console.log('› redis-server not found: the queue tests are skipped');

describe.skipIf(!available)('runs on the job queue with two worker processes', () => {
  let redis: Awaited<ReturnType<typeof startRedis>>;
  let workers: Array<Awaited<ReturnType<typeof startWorker>>> = [];
  let t: TestApp;
  let token: string;
  let studyId: string;
  let queue: Queue;

  beforeAll(async () => {
    redis = await startRedis();
    const env = { TRACELOOM_QUEUE_LOCK_MS: String(LOCK_MS), TRACELOOM_RUN_HEAP_MB: '512' };
    workers = await Promise.all([startWorker(redis.url, env), startWorker(redis.url, env)]);
    t = await createTestApp({
      runs: {
        threads: 1,
        wallClockMs: 60_000,
        perUserCap: 8,
        maxOldGenerationSizeMb: 512,
        previewMs: 1500,
        queueUrl: redis.url,
        queueSlots: 4,
      },
    });
    const author = await insertUser(t, 'author');
    token = await tokenFor(t, author);
    studyId = await insertStudy(t, author);
    queue = new Queue(RUN_QUEUE, { connection: redisConnection(redis.url) });
  });
  afterAll(async () => {
    await queue?.close();
    await t?.close();
    await Promise.all(workers.map((w) => w.stop()));
    await redis?.stop();
  });

  /** Waits until the run has left the queue (or throws after `ms`). */
  async function settled(runId: string, ms = 60_000): Promise<Run> {
    const until = Date.now() + ms;
    for (;;) {
      const run = await t.dataSource.getRepository(Run).findOneByOrFail({ id: runId });
      if (!['queued', 'running'].includes(run.status)) return run;
      if (Date.now() > until) throw new Error(`run ${runId} still ${run.status} after ${ms} ms`);
      await new Promise((r) => setTimeout(r, 50));
    }
  }

  /** Checks a finished run against the engine computing its spec in one piece, here. */
  async function sameAsEngine(runId: string, spec: object): Promise<void> {
    const res = await request(t.app).get(`/api/runs/${runId}`).set('Authorization', bearer(token));
    expect(res.body.status, res.body.error ?? '').toBe('done');
    const direct = JSON.parse(JSON.stringify(compute(spec, { collectClasses: true })));
    expect(untimed(res.body.result)).toEqual(untimed(direct));
    const counts: Record<string, number> = {};
    for (const row of direct.classes as Array<{ N: number }>)
      counts[row.N] = (counts[row.N] ?? 0) + 1;
    expect(res.body.classCounts).toEqual(counts);
  }

  /** The audit rows that closed a run: exactly one for a run stored once. */
  async function finishes(runId: string): Promise<number> {
    const rows = await t.dataSource.query(
      `SELECT count(*) AS n FROM audit_event WHERE target_id = ? AND action = 'run.finish'`,
      [runId],
    );
    return Number(rows[0].n);
  }

  it('shares a stream of runs between both workers, each stored once with the engine result', async () => {
    const ids: Array<[string, object]> = [];
    for (const spec of STREAM) {
      ids.push([await startRun(t, token, await createGas(t, token, studyId, spec)), spec]);
    }
    for (const [id, spec] of ids) {
      await settled(id);
      await sameAsEngine(id, spec);
      expect(await finishes(id)).toBe(1);
    }
    // both processes took jobs
    expect(
      workers.every((w) => w.taken.length > 0),
      JSON.stringify(workers.map((w) => w.taken)),
    ).toBe(true);
  }, 120_000);

  it('takes the job of a worker killed with SIGKILL to the other worker, and stores it once', async () => {
    const runId = await startRun(t, token, await createGas(t, token, studyId, MEDIUM));
    const jobId = `${runId}-a0`;
    const until = Date.now() + 30_000;
    let holder = -1;
    while (holder < 0 && Date.now() < until) {
      holder = workers.findIndex((w) => w.taken.includes(jobId));
      await new Promise((r) => setTimeout(r, 20));
    }
    expect(holder).toBeGreaterThanOrEqual(0);
    await workers[holder]!.stop(); // kill -9 mid-run
    const survivor = workers[1 - holder]!;
    const killedAt = Date.now();
    const run = await settled(runId, 90_000);
    expect(run.status, run.error ?? '').toBe('done');
    expect(survivor.taken).toContain(jobId);
    console.log(`› killed worker's job finished on the other ${Date.now() - killedAt} ms later`);
    await sameAsEngine(runId, MEDIUM);
    expect(await finishes(runId)).toBe(1);
    // a fresh worker replaces the killed one for the tests that follow
    workers[holder] = await startWorker(redis.url, { TRACELOOM_QUEUE_LOCK_MS: String(LOCK_MS) });
  }, 150_000);

  it('stops a cancelled run on the worker that holds it', async () => {
    const runId = await startRun(t, token, await createGas(t, token, studyId, RUNAWAY_SPEC));
    const jobId = `${runId}-a0`;
    const until = Date.now() + 30_000;
    while (!workers.some((w) => w.taken.includes(jobId)) && Date.now() < until) {
      await new Promise((r) => setTimeout(r, 20));
    }
    const res = await request(t.app)
      .post(`/api/runs/${runId}/cancel`)
      .set('Authorization', bearer(token));
    expect(res.body.status).toBe('cancelled');
    // the worker aborted the job: it leaves 'active' for 'failed' (the engine needs minutes)
    let state = '';
    let reason: string | undefined;
    const by = Date.now() + 20_000;
    while (Date.now() < by) {
      state = await queue.getJobState(jobId);
      reason = (await queue.getJob(jobId))?.failedReason;
      if (state !== 'active') break;
      await new Promise((r) => setTimeout(r, 50));
    }
    expect(state).toBe('failed');
    expect(reason).toMatch(/aborted by a cancel/);
  }, 60_000);

  it('keeps queued work through a Redis restart (append-only file)', async () => {
    const specs = [MEDIUM, MEDIUM, STREAM[3]!];
    const ids: string[] = [];
    for (const spec of specs)
      ids.push(await startRun(t, token, await createGas(t, token, studyId, spec)));
    // two workers of one thread: the third run waits in Redis while it restarts
    const until = Date.now() + 30_000;
    while ((await queue.getWaitingCount()) < 1 && Date.now() < until) {
      await new Promise((r) => setTimeout(r, 20));
    }
    expect(await queue.getWaitingCount()).toBeGreaterThanOrEqual(1);
    await redis.restart();
    for (const [i, id] of ids.entries()) {
      const run = await settled(id, 120_000);
      expect(run.status, run.error ?? '').toBe('done');
      await sameAsEngine(id, specs[i]!);
      expect(await finishes(id)).toBe(1);
    }
  }, 180_000);

  it('keeps the per-person cap and the wall-clock limit on the server, whatever worker computes', async () => {
    const strict = await createTestApp({
      runs: {
        threads: 1,
        wallClockMs: 1500,
        perUserCap: 1,
        maxOldGenerationSizeMb: 512,
        previewMs: 1500,
        queueUrl: redis.url,
        queueSlots: 4,
      },
    });
    try {
      const person = await insertUser(strict, 'author');
      const key = await tokenFor(strict, person);
      const gasId = await createGas(strict, key, await insertStudy(strict, person), RUNAWAY_SPEC);
      const runId = await startRun(strict, key, gasId);
      const second = await request(strict.app)
        .post(`/api/gases/${gasId}/runs`)
        .set('Authorization', bearer(key))
        .send({});
      expect(second.status).toBe(429);
      expect(second.body.error.code).toBe('too_many_runs');
      const until = Date.now() + 60_000;
      let run = await strict.dataSource.getRepository(Run).findOneByOrFail({ id: runId });
      while (['queued', 'running'].includes(run.status) && Date.now() < until) {
        await new Promise((r) => setTimeout(r, 50));
        run = await strict.dataSource.getRepository(Run).findOneByOrFail({ id: runId });
      }
      expect(run.status).toBe('failed');
      expect(run.error).toBe('stopped after the wall-clock limit of 1.5 s for one run');
      // and the worker let go of it
      let state = '';
      const by = Date.now() + 20_000;
      while (Date.now() < by) {
        state = await queue.getJobState(`${runId}-a0`);
        if (state !== 'active') break;
        await new Promise((r) => setTimeout(r, 50));
      }
      expect(state).toBe('failed');
    } finally {
      await strict.close();
    }
  }, 90_000);
});
