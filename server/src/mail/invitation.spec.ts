import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { User } from '../db/entities/index.js';
import type { AppContext } from '../app-context.js';
import { invitationKey as signedKey } from './invitation-keys.js';
import { invitationKey } from '../testing/invitation-fixtures.js';
import { keysFromFile } from '../auth/token-keys.js';
import { createTestApp, insertUser, tokenFor, type TestApp } from '../testing/test-app.js';

let t: TestApp;
let admin: User;

beforeAll(async () => {
  t = await createTestApp();
  admin = await insertUser(t, 'admin', { displayName: 'Ravi Sundqvist' });
});
afterAll(() => t.close());

describe('invitation', () => {
  it('sets the first password once through the key in the mail, then sign-in works', async () => {
    const key = await invitationKey(t, admin, 'lena@example.test');
    const invitedFlag = async () =>
      (
        await request(t.app)
          .get('/api/users')
          .set('Authorization', `Bearer ${await tokenFor(t, admin)}`)
      ).body.find((u: { email: string }) => u.email === 'lena@example.test').invited;
    expect(await invitedFlag()).toBe(true); // shown as "Invited" until the password is set
    const before = await request(t.app)
      .post('/api/auth/login')
      .send({ email: 'lena@example.test', password: 'a good long password' });
    expect(before.status).toBe(401);
    await request(t.app)
      .post('/api/invitations/accept')
      .send({ key, password: 'a good long password' })
      .expect(204);
    const login = await request(t.app)
      .post('/api/auth/login')
      .send({ email: 'lena@example.test', password: 'a good long password' });
    expect(login.status).toBe(200);
    expect(await invitedFlag()).toBe(false);
    const again = await request(t.app)
      .post('/api/invitations/accept')
      .send({ key, password: 'another long password' });
    expect(again.status).toBe(400);
    expect(again.body.error).toMatchObject({ code: 'invalid_invitation', field: 'key' });
    const [row] = await t.dataSource.query(
      `SELECT "accepted_at" FROM "invitation" WHERE "email" = 'lena@example.test'`,
    );
    expect(row.accepted_at).not.toBeNull();
    // A key whose signature is changed in one character is refused.
    const key2 = await invitationKey(t, admin, 'mara@example.test');
    const forged = key2.slice(0, -1) + (key2.endsWith('A') ? 'B' : 'A');
    const bad = await request(t.app)
      .post('/api/invitations/accept')
      .send({ key: forged, password: 'a good long password' });
    expect(bad.body.error).toMatchObject({ code: 'invalid_invitation', field: 'key' });
  });

  it('refuses an unknown key, an expired one and a short password, naming the field', async () => {
    const unknown = await request(t.app)
      .post('/api/invitations/accept')
      .send({ key: 'A'.repeat(43), password: 'a good long password' });
    expect(unknown.body.error).toMatchObject({ code: 'invalid_input', field: 'key' });
    const key = await invitationKey(t, admin, 'late@example.test');
    const short = await request(t.app)
      .post('/api/invitations/accept')
      .send({ key, password: 'short' });
    expect(short.body.error).toMatchObject({ code: 'invalid_input', field: 'password' });
    // The same invitation, signed with an expiry in the past (signed eight days ago).
    const id = key.split('.')[0]!;
    const keys = keysFromFile(t.config.keyFile);
    const ctx = { tokenSecret: keys.current, tokenKeys: keys } as AppContext;
    const old = signedKey(ctx, id, Date.now() - 8 * 24 * 3600 * 1000);
    const expired = await request(t.app)
      .post('/api/invitations/accept')
      .send({ key: old, password: 'a good long password' });
    expect(expired.body.error).toMatchObject({ code: 'invalid_invitation' });
    const fresh = signedKey(ctx, id);
    await request(t.app)
      .post('/api/invitations/accept')
      .send({ key: fresh, password: 'a good long password' })
      .expect(204);
  });
});
