import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { DEFAULT_CONFIG } from './config.js';
import { RunExecutor } from './runs/run-executor.js';
import { createWorkerPools } from './compute/pools.js';
import { TRAP_SPEC, bearer } from './testing/gas-fixtures.js';
import { createTestApp, insertUser, tokenFor } from './testing/test-app.js';

describe('the app services', () => {
  it('an app built and closed without computing starts no thread and no mail server', async () => {
    const t = await createTestApp();
    try {
      const user = await insertUser(t, 'admin');
      const token = await tokenFor(t, user);
      // Requests that read and write the database but compute nothing and mail nobody.
      await request(t.app).get('/api/health').expect(200);
      await request(t.app).get('/api/auth/me').set('Authorization', bearer(token)).expect(200);
      await request(t.app)
        .post('/api/studies')
        .set('Authorization', bearer(token))
        .send({ title: 'Nothing computed here' })
        .expect(201);
      await t.services.executor.ready;
      expect(t.services.pools.started()).toEqual([]);
      expect(t.services.executor.jobCounts()).toEqual({ queued: 0, running: 0 });
      expect(t.services.mail.started).toBe(false);
    } finally {
      await t.close();
    }
    expect(t.services.pools.started()).toEqual([]);
  });

  it('starts the quick pool on the first preview and terminates its threads on close', async () => {
    const t = await createTestApp();
    let quickThreads = -1;
    try {
      const token = await tokenFor(t, await insertUser(t, 'author'));
      const res = await request(t.app)
        .post('/api/compute')
        .set('Authorization', bearer(token))
        .send({ spec: TRAP_SPEC });
      expect([200, 422]).toContain(res.status); // a cold worker may miss the preview's budget
      expect(t.services.pools.started()).toEqual(['quick']);
      quickThreads = t.services.pools.quick.threads.length;
    } finally {
      await t.close();
    }
    expect(quickThreads).toBeGreaterThan(0);
    expect(t.services.pools.started()).toEqual([]);
    expect(() => t.services.pools.quick).toThrow(/closed/);
  }, 60_000);

  it('a job aborted while it holds a thread sees its signal abort; one aborted in line never starts', async () => {
    const t = await createTestApp();
    const pools = createWorkerPools({ ...DEFAULT_CONFIG.runs, threads: 1 });
    const executor = new RunExecutor(t.dataSource, pools, { ...DEFAULT_CONFIG.runs, threads: 1 });
    try {
      await executor.ready;
      const holding = new AbortController();
      let seen: AbortSignal | null = null;
      const first = executor.submit(
        'someone',
        (signal) =>
          new Promise<string>((_, reject) => {
            seen = signal;
            signal.addEventListener('abort', () => reject(new Error('stopped')));
          }),
        holding.signal,
      );
      const waiting = new AbortController();
      let secondStarted = false;
      const second = executor.submit(
        'someone',
        async () => {
          secondStarted = true;
          return 'ran';
        },
        waiting.signal,
      );
      expect(executor.jobCounts()).toEqual({ queued: 1, running: 1 });
      waiting.abort(new Error('the client went away'));
      await expect(second).rejects.toThrow('the client went away');
      expect(executor.jobCounts()).toEqual({ queued: 0, running: 1 });
      holding.abort(new Error('the client went away'));
      await expect(first).rejects.toThrow('stopped');
      expect(seen!.aborted).toBe(true);
      expect(secondStarted).toBe(false);
      await new Promise((r) => setTimeout(r, 0));
      expect(executor.jobCounts()).toEqual({ queued: 0, running: 0 });
      expect(pools.started()).toEqual([]); // the jobs here never asked for a worker
    } finally {
      await executor.stop();
      await t.close();
    }
  });
});
