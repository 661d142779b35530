import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../app.js';
import { DEFAULT_CONFIG, trustProxyOf } from '../config.js';
import { User } from '../db/entities/index.js';
import { createTestApp, insertUser, TEST_PASSWORD, type TestApp } from '../testing/test-app.js';
import { unusablePasswordHash } from './password.js';
import { DEFAULT_SIGN_IN_LIMITS, HashGate } from './sign-in-guards.js';

// Sign-in (issue finding 7): the throttle was in memory and per account + address only, so
// rotating addresses gave unlimited guesses, spraying e-mails never throttled, and a restart
// forgot everything. Replayed here against the database-backed buckets and the backoff.
let t: TestApp;
const limits = { ...DEFAULT_SIGN_IN_LIMITS, perAddress: 6, globalPerMinute: 40 };

beforeAll(async () => {
  // One proxy hop trusted, so X-Forwarded-For names the client as a proxy would.
  t = await createTestApp({ signIn: limits, trustProxy: 1 });
});
afterAll(() => t.close());

const login = (app: TestApp['app'], email: string, password: string, from: string) =>
  request(app).post('/api/auth/login').set('X-Forwarded-For', from).send({ email, password });
let address = 0;
const freshAddress = () => `198.51.100.${++address}`;

describe('account backoff', () => {
  it('slows guesses at one account from rotating addresses, but never locks its owner out', async () => {
    const user = await insertUser(t, 'author');
    for (let i = 0; i < limits.freeFailures; i++) {
      expect((await login(t.app, user.email, `wrong ${i}`, freshAddress())).status).toBe(401);
    }
    const held = await login(t.app, user.email, TEST_PASSWORD, freshAddress());
    expect(held.status).toBe(429);
    expect(held.body.error.code).toBe('too_many_attempts');
    expect(Number(held.headers['retry-after'])).toBe(1);
    await new Promise((r) => setTimeout(r, 1100));
    // After the 1 s backoff the owner signs in; success clears the count.
    expect((await login(t.app, user.email, TEST_PASSWORD, freshAddress())).status).toBe(200);
    expect((await login(t.app, user.email, 'wrong again', freshAddress())).status).toBe(401);
  });
});

describe('address and global buckets', () => {
  it('stops one address spraying many e-mails, and the count survives a restart', async () => {
    const from = freshAddress();
    for (let i = 0; i < limits.perAddress; i++) {
      const res = await login(t.app, `nobody-${i}@example.test`, 'guess guess', from);
      expect(res.status).toBe(401);
    }
    const sprayed = await login(t.app, 'nobody-else@example.test', 'guess guess', from);
    expect(sprayed.status).toBe(429);
    expect(Number(sprayed.headers['retry-after'])).toBeGreaterThan(14 * 60);
    // A restarted server (a new app on the same database) still refuses that address.
    const restarted = await createApp({ dataSource: t.dataSource, config: t.config });
    try {
      const again = await login(restarted.app, 'nobody-else@example.test', 'guess', from);
      expect(again.status).toBe(429);
    } finally {
      await restarted.close();
    }
    // Another address is not affected.
    const user = await insertUser(t, 'author');
    expect((await login(t.app, user.email, TEST_PASSWORD, freshAddress())).status).toBe(200);
  });

  it('caps all attempts together per minute (spraying from many addresses)', async () => {
    const other = await createTestApp({ signIn: { ...limits, globalPerMinute: 8 }, trustProxy: 1 });
    try {
      const statuses: number[] = [];
      for (let i = 0; i < 10; i++) {
        statuses.push(
          (await login(other.app, `spray-${i}@example.test`, 'x', freshAddress())).status,
        );
      }
      expect(statuses.slice(0, 8).every((s) => s === 401)).toBe(true);
      expect(statuses.slice(8)).toEqual([429, 429]);
    } finally {
      await other.close();
    }
  });

  it('without a trusted proxy, X-Forwarded-For neither hides nor frames an address', async () => {
    const other = await createTestApp({ signIn: limits });
    try {
      for (let i = 0; i < limits.perAddress; i++) {
        await login(other.app, `x-${i}@example.test`, 'guess', `203.0.113.${i}`);
      }
      // Every attempt counted against the real peer, whatever the header claimed.
      expect((await login(other.app, 'y@example.test', 'guess', '203.0.113.200')).status).toBe(429);
    } finally {
      await other.close();
    }
    expect(trustProxyOf(undefined)).toBe(false);
    expect(trustProxyOf('2')).toBe(2);
    expect(trustProxyOf('loopback, 10.0.0.0/8')).toBe('loopback, 10.0.0.0/8');
    expect(() => trustProxyOf('true')).toThrow(/TRACELOOM_TRUST_PROXY=true/);
  });
});

describe('password hashing', () => {
  it('runs at most the cap at once; a full line answers 503', async () => {
    const gate = new HashGate(2, 3);
    let running = 0;
    let most = 0;
    const work = () =>
      gate.run(async () => {
        most = Math.max(most, ++running);
        await new Promise((r) => setTimeout(r, 20));
        running -= 1;
      });
    const results = await Promise.allSettled(Array.from({ length: 7 }, work));
    expect(most).toBe(2);
    expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(5);
    const refused = results.find((r) => r.status === 'rejected') as PromiseRejectedResult;
    expect(refused.reason).toMatchObject({ status: 503, code: 'busy' });
  });

  it('takes the same scrypt time for an account without a password', async () => {
    // A cost where scrypt dominates (about 30-100 ms here), unlike the fast test default.
    const slow = await createTestApp({
      scrypt: { N: 2 ** 14, r: 8, p: 1 },
      signIn: { ...limits, perAddress: 100, freeFailures: 100 },
      trustProxy: 1,
    });
    try {
      const invited = await insertUser(slow, 'author');
      await slow.dataSource
        .getRepository(User)
        .update({ id: invited.id }, { passwordHash: unusablePasswordHash() });
      const active = await insertUser(slow, 'author');
      // Interleaved rounds, so a change in the machine's load hits all three alike.
      const emails = [active.email, invited.email, 'nobody-here@example.test'];
      const times: number[][] = [[], [], []];
      for (let round = 0; round < 7; round++) {
        for (let j = 0; j < emails.length; j++) {
          const k = (j + round) % emails.length;
          const email = emails[k]!;
          const start = performance.now();
          expect((await login(slow.app, email, 'not it at all', freshAddress())).status).toBe(401);
          times[k]!.push(performance.now() - start);
        }
      }
      const [wrong, noPassword, unknown] = times.map((list) => list.sort((a, b) => a - b)[3]!) as [
        number,
        number,
        number,
      ];
      // Without the decoy an account without a password answered in ~1 ms, not ~100+.
      expect(noPassword).toBeGreaterThan(wrong * 0.3);
      expect(unknown).toBeGreaterThan(wrong * 0.3);
      console.info(
        `sign-in medians: wrong password ${wrong.toFixed(1)} ms, no password ${noPassword.toFixed(1)} ms, unknown ${unknown.toFixed(1)} ms`,
      );
    } finally {
      await slow.close();
    }
  });

  it('keeps the defaults documented in the operations guide', () => {
    expect(DEFAULT_CONFIG.signIn).toMatchObject({
      perAddress: 20,
      globalPerMinute: 300,
      freeFailures: 5,
      hashConcurrency: 2,
    });
  });
});
