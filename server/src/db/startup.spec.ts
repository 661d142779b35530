import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../config.js';
import { createTestApp, TEST_SCRYPT, type TestApp } from '../testing/test-app.js';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, seedDemo } from './seed-demo.js';
import { assertDatabaseHealthy, compareVersions, MIN_SQLITE_VERSION } from './startup-checks.js';
import { openDatabase } from './open-database.js';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('start-up checks', () => {
  it('compares SQLite versions numerically', () => {
    expect(compareVersions('3.51.3', MIN_SQLITE_VERSION)).toBe(0);
    expect(compareVersions('3.51.2', MIN_SQLITE_VERSION)).toBeLessThan(0);
    expect(compareVersions('3.9.0', '3.10.0')).toBeLessThan(0);
    expect(compareVersions('3.53.0', MIN_SQLITE_VERSION)).toBeGreaterThan(0);
  });

  it('accepts the bundled SQLite and a sound database', async () => {
    const version = await assertDatabaseHealthy(t.dataSource);
    expect(compareVersions(version, MIN_SQLITE_VERSION)).toBeGreaterThanOrEqual(0);
  });

  it('refuses a file that is not a database, with a message and no crash', async () => {
    const dir = mkdtempSync(path.join(os.tmpdir(), 'traceloom-bad-'));
    const file = path.join(dir, 'bad.sqlite');
    (await import('node:fs')).writeFileSync(
      file,
      'this is not a database file at all, not even close'.repeat(100),
    );
    await expect(openDatabase(file)).rejects.toThrow();
    rmSync(dir, { recursive: true, force: true });
  });

  it('reads PORT, TRACELOOM_DB, TRACELOOM_MODE and TRACELOOM_STATIC, and names a bad variable', () => {
    expect(loadConfig({})).toMatchObject({
      port: 4300,
      mode: 'production',
      databasePath: 'data/traceloom.sqlite',
    });
    expect(
      loadConfig({
        PORT: '0',
        TRACELOOM_MODE: 'demo',
        TRACELOOM_DB: '/tmp/x.db',
        TRACELOOM_STATIC: 'web',
      }),
    ).toMatchObject({ port: 0, mode: 'demo', databasePath: '/tmp/x.db', staticDir: 'web' });
    expect(() => loadConfig({ PORT: 'eighty' })).toThrow(/PORT/);
    expect(() => loadConfig({ TRACELOOM_MODE: 'party' })).toThrow(/TRACELOOM_MODE/);
  });
});

describe('demo seed', () => {
  it('creates the four accounts and the demo study once, however often it runs', async () => {
    await seedDemo(t.dataSource, TEST_SCRYPT);
    await seedDemo(t.dataSource, TEST_SCRYPT);
    const users = await t.dataSource.query('SELECT email, role FROM user ORDER BY email');
    expect(users).toEqual(
      [...DEMO_ACCOUNTS]
        .sort((a, b) => a.email.localeCompare(b.email))
        .map(({ email, role }) => ({ email, role })),
    );
    const hashes = await t.dataSource.query('SELECT password_hash AS h FROM user');
    expect(new Set(hashes.map((row: { h: string }) => row.h)).size).toBe(DEMO_ACCOUNTS.length);
    const studies = await t.dataSource.query('SELECT id, title FROM study');
    expect(studies).toHaveLength(1);
    expect(studies[0].title).toBe('Fermions on a ring');

    const login = await request(t.app)
      .post('/api/auth/login')
      .send({ email: 'author@demo.test', password: DEMO_PASSWORD });
    expect(login.status).toBe(200);
    const study = await request(t.app)
      .get(`/api/studies/${studies[0].id}`)
      .set('Authorization', `Bearer ${login.body.token}`);
    expect(study.body.owner.email).toBe('author@demo.test');
    expect(study.body.members.map((m: { email: string }) => m.email).sort()).toEqual([
      'reviewer@demo.test',
      'steward@demo.test',
    ]);
  });
});
