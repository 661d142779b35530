import { readFileSync } from 'node:fs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Run } from '../db/entities/index.js';
import { authorStudy, type AuthorStudy } from '../testing/author-study.js';
import { bearer, createGas, startRun, waitForRun } from '../testing/gas-fixtures.js';
import { redisAvailable, startRedis, startWorker } from './redis-for-tests.js';

/** Lock time of the test workers: a killed worker's task job is taken again within about 2 x this. */
const LOCK_MS = 2000;

/** The two-index sector sum of the benchmarks: 441 sectors in shells (bench/README.md). */
const SECTORS = JSON.parse(
  readFileSync(new URL('../../../scripts/bench-tasks/sectors-12.json', import.meta.url), 'utf8'),
) as object;

const RUNS = {
  threads: 1,
  wallClockMs: 120_000,
  perUserCap: 8,
  maxOldGenerationSizeMb: 512,
  previewMs: 1500,
};

/** A result without its clocks. */
function untimed(r: Record<string, unknown>) {
  const { timings: _t, ...rest } = r;
  return rest;
}

const available = redisAvailable();

describe.skipIf(!available)('a sector run split into task jobs over two workers', () => {
  let redis: Awaited<ReturnType<typeof startRedis>>;
  let workers: Array<Awaited<ReturnType<typeof startWorker>>> = [];
  let queued: AuthorStudy;
  let embedded: AuthorStudy;
  let reference: { result: Record<string, unknown>; classCounts: unknown; rows: unknown };
  const env = { TRACELOOM_QUEUE_LOCK_MS: String(LOCK_MS), TRACELOOM_RUN_HEAP_MB: '512' };

  /** A finished run's result, class counts and the class rows of N = 6, through the API. */
  async function answer(s: AuthorStudy, runId: string) {
    const get = (query = '') =>
      request(s.t.app).get(`/api/runs/${runId}${query}`).set('Authorization', bearer(s.token));
    const whole = await get();
    expect(whole.body.status, whole.body.error ?? '').toBe('done');
    const rows = (await get('?classes=6')).body.result.classes;
    return { result: untimed(whole.body.result), classCounts: whole.body.classCounts, rows };
  }

  /** The run's audit rows that closed it: exactly one for a run stored once. */
  async function finishes(runId: string): Promise<number> {
    const rows = await queued.t.dataSource.query(
      `SELECT count(*) AS n FROM audit_event WHERE target_id = ? AND action = 'run.finish'`,
      [runId],
    );
    return Number(rows[0].n);
  }

  beforeAll(async () => {
    redis = await startRedis();
    workers = await Promise.all([startWorker(redis.url, env), startWorker(redis.url, env)]);
    queued = await authorStudy({ runs: { ...RUNS, queueUrl: redis.url, queueSlots: 4 } });
    // the embedded pool's answer (two threads), the yardstick of both tests
    embedded = await authorStudy({ runs: { ...RUNS, threads: 2 } });
    const runId = await startRun(
      embedded.t,
      embedded.token,
      await createGas(embedded.t, embedded.token, embedded.studyId, SECTORS),
    );
    expect((await waitForRun(embedded.t, runId, undefined, 120_000)).status).toBe('done');
    reference = await answer(embedded, runId);
  }, 240_000);
  afterAll(async () => {
    await queued?.t.close();
    await embedded?.t.close();
    await Promise.all(workers.map((w) => w.stop()));
    await redis?.stop();
  });

  const taskJobs = (w: { taken: string[] }, runId: string) =>
    w.taken.filter((id) => id.startsWith(`${runId}-a0-t`));

  it('both workers take sector jobs; the result is the embedded pool’s; progress counts sectors', async () => {
    const s = queued;
    const runId = await startRun(s.t, s.token, await createGas(s.t, s.token, s.studyId, SECTORS));
    const run = await waitForRun(s.t, runId, undefined, 120_000);
    expect(run.status, run.error ?? '').toBe('done');
    expect(await answer(s, runId)).toEqual(reference);
    const counts = workers.map((w) => taskJobs(w, runId).length);
    expect(
      counts.every((n) => n > 0),
      JSON.stringify(counts),
    ).toBe(true);
    // no whole-run job: the server walked the shells and combined the parts
    expect(workers.some((w) => w.taken.includes(`${runId}-a0`))).toBe(false);
    expect(run.progressPhase).toBe('done');
    expect(await finishes(runId)).toBe(1);
    console.log(
      `› sector run split into task jobs: ${counts.join(' + ')} taken by the two workers`,
    );
  }, 150_000);

  it('gives the same result once when a worker is killed with SIGKILL mid-run', async () => {
    const s = queued;
    const runId = await startRun(s.t, s.token, await createGas(s.t, s.token, s.studyId, SECTORS));
    // wait until both hold work of this run, then kill one with sectors still to compute
    const until = Date.now() + 60_000;
    while (Date.now() < until && !workers.every((w) => taskJobs(w, runId).length >= 2)) {
      await new Promise((r) => setTimeout(r, 20));
    }
    const mid = await s.t.dataSource.getRepository(Run).findOneByOrFail({ id: runId });
    expect(mid.status).toBe('running');
    // kill just after it took a further job, so that it dies holding one (killed between two
    // jobs it would hold none, and there would be nothing to take again)
    const held = taskJobs(workers[0]!, runId).length;
    while (Date.now() < until && taskJobs(workers[0]!, runId).length === held) {
      await new Promise((r) => setTimeout(r, 2));
    }
    await workers[0]!.stop();
    const killedAt = Date.now();
    const run = await waitForRun(s.t, runId, undefined, 150_000);
    expect(run.status, run.error ?? '').toBe('done');
    expect(await answer(s, runId)).toEqual(reference);
    expect(await finishes(runId)).toBe(1);
    // the job the killed worker held was taken again by the other (jobs follow each other closely)
    const [killed, survivor] = workers.map((w) => taskJobs(w, runId));
    const retried = killed!.filter((id) => survivor!.includes(id));
    expect(retried.length, JSON.stringify({ killed, survivor })).toBeGreaterThanOrEqual(1);
    console.log(
      `› sector run with a worker killed after ${killed!.length} task jobs (${retried.join(', ')} taken again): done ${Date.now() - killedAt} ms after the kill, result unchanged`,
    );
    workers[0] = await startWorker(redis.url, env);
  }, 240_000);
});
