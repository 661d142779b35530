import { randomBytes } from 'node:crypto';
import jwt from 'jsonwebtoken';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { User } from '../db/entities/index.js';
import {
  createTestApp,
  insertUser,
  TEST_PASSWORD,
  tokenFor,
  tokenSecretOf,
  type TestApp,
} from '../testing/test-app.js';
import { keyId } from './token-keys.js';

let t: TestApp;
let admin: User;
let secret: Buffer;

const b64url = (value: object) => Buffer.from(JSON.stringify(value)).toString('base64url');
const me = (token: string) =>
  request(t.app).get('/api/auth/me').set('Authorization', `Bearer ${token}`);
const login = (email: string, password: string) =>
  request(t.app).post('/api/auth/login').send({ email, password });

beforeAll(async () => {
  t = await createTestApp();
  admin = await insertUser(t, 'admin');
  secret = tokenSecretOf(t);
});
afterAll(() => t.close());

describe('sign-in', () => {
  it('signs in with the right password, case-insensitive e-mail, and returns a 30-minute token', async () => {
    const user = await insertUser(t, 'author');
    const res = await login(user.email.toUpperCase(), TEST_PASSWORD);
    expect(res.status).toBe(200);
    expect(res.body.user).toEqual({
      id: user.id,
      email: user.email,
      displayName: user.displayName,
      role: 'author',
      disabled: false,
      invited: false,
      createdAt: user.createdAt,
    });
    const claims = jwt.verify(res.body.token, secret, { algorithms: ['HS256'] }) as jwt.JwtPayload;
    expect(claims.sub).toBe(user.id);
    expect(claims.tv).toBe(0);
    expect(claims.exp! - claims.iat!).toBe(30 * 60);
    expect(new Date(res.body.expiresAt).getTime()).toBe(claims.exp! * 1000);
    expect((await me(res.body.token)).body.id).toBe(user.id);
  });

  it('answers the same 401 for an unknown e-mail, a wrong password and a disabled account', async () => {
    const user = await insertUser(t, 'author');
    const disabled = await insertUser(t, 'author', { disabled: true });
    const answers = await Promise.all([
      login('nobody@example.test', TEST_PASSWORD),
      login(user.email, 'wrong password'),
      login(disabled.email, TEST_PASSWORD),
    ]);
    for (const res of answers) {
      expect(res.status).toBe(401);
      expect(res.body).toEqual({
        error: { code: 'invalid_credentials', message: 'The e-mail or password is not right.' },
      });
    }
  });

  it('writes an audit event for login and logout', async () => {
    const user = await insertUser(t, 'steward');
    const { token } = (await login(user.email, TEST_PASSWORD)).body;
    await request(t.app)
      .post('/api/auth/logout')
      .set('Authorization', `Bearer ${token}`)
      .expect(204);
    const rows = await t.dataSource.query(
      'SELECT action FROM audit_event WHERE actor_id = ? ORDER BY rowid',
      [user.id],
    );
    expect(rows.map((row: { action: string }) => row.action)).toEqual([
      'auth.login',
      'auth.logout',
    ]);
  });
});

describe('token attacks', () => {
  let user: User;
  let good: string;
  beforeAll(async () => {
    user = await insertUser(t, 'reviewer');
    good = await tokenFor(t, user);
  });

  it('accepts the genuine token (so the refusals below mean something)', async () => {
    expect((await me(good)).status).toBe(200);
  });

  it('refuses alg "none"', async () => {
    const payload = jwt.decode(good) as object;
    const forged = `${b64url({ alg: 'none', typ: 'JWT' })}.${b64url(payload)}.`;
    expect((await me(forged)).status).toBe(401);
  });

  it('refuses an edited payload with the original signature', async () => {
    const [header, , signature] = good.split('.');
    const payload = { ...(jwt.decode(good) as object), role: 'admin', sub: admin.id };
    const forged = `${header}.${b64url(payload)}.${signature}`;
    const res = await request(t.app).get('/api/users').set('Authorization', `Bearer ${forged}`);
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('refuses an expired token', async () => {
    const past = Math.floor(Date.now() / 1000) - 3600;
    const expired = jwt.sign(
      { sub: user.id, tv: 0, role: 'reviewer', iat: past, exp: past + 60 },
      secret,
      { algorithm: 'HS256', keyid: keyId(secret) },
    );
    expect((await me(expired)).status).toBe(401);
  });

  it('refuses a token signed with another secret', async () => {
    // It even names our key's id, so only the signature can refuse it.
    const wrong = jwt.sign({ sub: user.id, tv: 0, role: 'reviewer' }, randomBytes(32), {
      algorithm: 'HS256',
      expiresIn: 600,
      keyid: keyId(secret),
    });
    expect((await me(wrong)).status).toBe(401);
  });

  it('refuses another algorithm even with the right secret (HS256 is pinned)', async () => {
    const other = jwt.sign({ sub: user.id, tv: 0, role: 'reviewer' }, secret, {
      algorithm: 'HS512',
      expiresIn: 600,
      keyid: keyId(secret),
    });
    expect((await me(other)).status).toBe(401);
  });

  it('refuses a malformed header and a token without a token version', async () => {
    const res = await request(t.app).get('/api/auth/me').set('Authorization', 'Basic abc');
    expect(res.status).toBe(401);
    const noVersion = jwt.sign({ sub: user.id }, secret, {
      algorithm: 'HS256',
      expiresIn: 600,
      keyid: keyId(secret),
    });
    expect((await me(noVersion)).status).toBe(401);
  });
});

describe('revocation', () => {
  it('logout revokes every token of that user', async () => {
    const user = await insertUser(t, 'author');
    const first = (await login(user.email, TEST_PASSWORD)).body.token;
    const second = (await login(user.email, TEST_PASSWORD)).body.token;
    await request(t.app)
      .post('/api/auth/logout')
      .set('Authorization', `Bearer ${first}`)
      .expect(204);
    expect((await me(first)).status).toBe(401);
    expect((await me(second)).status).toBe(401);
    expect((await login(user.email, TEST_PASSWORD)).status).toBe(200);
  });

  it('a role change revokes the old token; a display-name change does not', async () => {
    const user = await insertUser(t, 'author');
    const adminToken = await tokenFor(t, admin);
    const token = await tokenFor(t, user);
    const patch = (body: object) =>
      request(t.app)
        .patch(`/api/users/${user.id}`)
        .set('Authorization', `Bearer ${adminToken}`)
        .send(body);
    expect((await patch({ displayName: 'Still Signed In' })).status).toBe(200);
    expect((await me(token)).status).toBe(200);
    expect((await patch({ role: 'reviewer' })).status).toBe(200);
    expect((await me(token)).status).toBe(401);
    const fresh = (await login(user.email, TEST_PASSWORD)).body;
    expect(fresh.user.role).toBe('reviewer');
  });

  it('disabling revokes the token and blocks sign-in', async () => {
    const user = await insertUser(t, 'steward');
    const token = await tokenFor(t, user);
    const adminToken = await tokenFor(t, admin);
    await request(t.app)
      .patch(`/api/users/${user.id}`)
      .set('Authorization', `Bearer ${adminToken}`)
      .send({ disabled: true })
      .expect(200);
    expect((await me(token)).status).toBe(401);
    expect((await login(user.email, TEST_PASSWORD)).status).toBe(401);
  });
});
