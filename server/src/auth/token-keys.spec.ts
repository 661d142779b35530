import { randomBytes } from 'node:crypto';
import { chmodSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import jwt from 'jsonwebtoken';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../app.js';
import type { User } from '../db/entities/index.js';
import {
  createTestApp,
  insertUser,
  TEST_PASSWORD,
  tokenSecretOf,
  type TestApp,
} from '../testing/test-app.js';
import { keyId, keysFromEnv, keysFromFile, rotateKeyFile } from './token-keys.js';

// Secrets (issue finding 9): the signing secret lived in the database, so a copy of the database
// could mint tokens, and a token without `exp` was accepted. Replayed here.
let t: TestApp;
let user: User;

beforeAll(async () => {
  t = await createTestApp();
  user = await insertUser(t, 'author');
});
afterAll(() => t.close());

const me = (app: TestApp['app'], token: string) =>
  request(app).get('/api/auth/me').set('Authorization', `Bearer ${token}`);
const signed = (claims: object, key: Buffer, options: jwt.SignOptions = {}) =>
  jwt.sign({ sub: user.id, tv: 0, role: 'author', ...claims }, key, {
    algorithm: 'HS256',
    keyid: keyId(key),
    ...options,
  });

describe('the signing key', () => {
  it('lives in a key file of mode 600 created on first start, never in the database', async () => {
    const mode = statSync(t.config.keyFile).mode & 0o777;
    expect(mode).toBe(0o600);
    const key = tokenSecretOf(t);
    expect(key.length).toBeGreaterThanOrEqual(32);
    const dbBytes = readFileSync(t.config.databasePath);
    expect(dbBytes.includes(key)).toBe(false);
    expect(dbBytes.includes(Buffer.from(key.toString('base64')))).toBe(false);
    const settings = await t.dataSource.query(
      `SELECT key FROM setting WHERE key = 'auth.token_secret'`,
    );
    expect(settings).toEqual([]);
  });

  it('removes the secret an older server kept in the database', async () => {
    const old = randomBytes(32);
    await t.dataSource.query(`INSERT INTO setting (key, value) VALUES ('auth.token_secret', ?)`, [
      old.toString('base64'),
    ]);
    await (await createApp({ dataSource: t.dataSource, config: t.config })).close();
    expect(
      await t.dataSource.query(`SELECT key FROM setting WHERE key = 'auth.token_secret'`),
    ).toEqual([]);
    // A token minted with the old database secret opens nothing.
    expect((await me(t.app, signed({}, old, { expiresIn: 600 }))).status).toBe(401);
  });

  it('refuses a key file others may read, naming the file', () => {
    const file = path.join(t.dir, 'loose.key');
    rotateKeyFile(file);
    chmodSync(file, 0o644);
    expect(() => keysFromFile(file)).toThrow(/loose\.key: the key file is readable by others/);
  });

  it('takes the keys from the environment when given, and names a short one', () => {
    const current = randomBytes(32);
    const previous = randomBytes(48);
    const keys = keysFromEnv({
      TRACELOOM_TOKEN_SECRET: current.toString('base64'),
      TRACELOOM_TOKEN_SECRETS_PREVIOUS: previous.toString('base64'),
    });
    expect(keys?.current).toEqual(current);
    expect(keys?.all).toEqual([current, previous]);
    expect(keysFromEnv({})).toBeNull();
    expect(() => keysFromEnv({ TRACELOOM_TOKEN_SECRET: 'c2hvcnQ=' })).toThrow(
      /^TRACELOOM_TOKEN_SECRET: a signing key must be at least 32 bytes/,
    );
  });
});

describe('token lifetime', () => {
  it('refuses a correctly signed token without exp, one minted for a year, one from the future', async () => {
    const key = tokenSecretOf(t);
    expect((await me(t.app, signed({}, key, { expiresIn: 600 }))).status).toBe(200);
    expect((await me(t.app, signed({}, key))).status).toBe(401);
    expect((await me(t.app, signed({}, key, { expiresIn: 365 * 24 * 3600 }))).status).toBe(401);
    const future = Math.floor(Date.now() / 1000) + 3600;
    expect((await me(t.app, signed({ iat: future, exp: future + 600 }, key))).status).toBe(401);
    // No iat at all.
    expect(
      (
        await me(
          t.app,
          signed({ exp: Math.floor(Date.now() / 1000) + 600 }, key, { noTimestamp: true }),
        )
      ).status,
    ).toBe(401);
  });
});

describe('rotation', () => {
  it('keeps tokens of the previous key working, signs with the new one, forgets the oldest', async () => {
    const other = await createTestApp();
    try {
      const someone = await insertUser(other, 'author');
      const login = () =>
        request(other.app)
          .post('/api/auth/login')
          .send({ email: someone.email, password: TEST_PASSWORD });
      const before = (await login()).body.token as string;
      const firstKid = jwt.decode(before, { complete: true })?.header.kid;
      const newKid = rotateKeyFile(other.config.keyFile);
      expect(newKid).not.toBe(firstKid);
      const rotatedApp = await createApp({ dataSource: other.dataSource, config: other.config });
      await rotatedApp.close(); // the app still answers; nothing of it computes or mails
      const rotated = rotatedApp.app;
      expect((await me(rotated, before)).status).toBe(200);
      const after = await request(rotated)
        .post('/api/auth/login')
        .send({ email: someone.email, password: TEST_PASSWORD });
      expect(jwt.decode(after.body.token, { complete: true })?.header.kid).toBe(newKid);
      // Two more rotations: the first key is no longer kept, its token stops.
      rotateKeyFile(other.config.keyFile);
      rotateKeyFile(other.config.keyFile);
      const laterApp = await createApp({ dataSource: other.dataSource, config: other.config });
      await laterApp.close();
      const later = laterApp.app;
      expect((await me(later, before)).status).toBe(401);
      expect((await me(later, after.body.token)).status).toBe(200);
    } finally {
      await other.close();
    }
  });
});
