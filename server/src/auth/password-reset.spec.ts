import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { User } from '../db/entities/index.js';
import { api } from '../testing/dataset-fixtures.js';
import { createTestApp, insertUser, TEST_PASSWORD, type TestApp } from '../testing/test-app.js';
import { unusablePasswordHash } from './password.js';

// Password reset by mail, the admin's invitation resend, and refusing easy passwords.
let t: TestApp;
let admin: User;

beforeAll(async () => {
  t = await createTestApp();
  admin = await insertUser(t, 'admin');
});
afterAll(() => t.close());

interface Mail {
  subject: string;
  text: string;
  envelope: { to: string[] };
}
const mailsTo = async (email: string): Promise<Mail[]> =>
  ((await api(t, admin, 'get', '/dev/mailbox', undefined, 200)) as Mail[]).filter((m) =>
    m.envelope.to.includes(email),
  );
async function waitForMail(email: string, subject: string): Promise<Mail> {
  for (let i = 0; i < 100; i++) {
    const found = (await mailsTo(email)).find((m) => m.subject === subject);
    if (found) return found;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`no mail "${subject}" to ${email}`);
}
const keyOf = (mail: Mail) => mail.text.match(/\/welcome\/(\S+)/)![1]!;
const accept = (key: string, password: string) =>
  request(t.app).post('/api/invitations/accept').send({ key, password });
const login = (email: string, password: string) =>
  request(t.app).post('/api/auth/login').send({ email, password });

describe('password reset by mail', () => {
  it('mails a single-use link; the new password works, the old one stops', async () => {
    const user = await insertUser(t, 'author', { displayName: 'Lena Marsh' });
    const res = await request(t.app).post('/api/auth/password-reset').send({ email: user.email });
    expect(res.status).toBe(202);
    const mail = await waitForMail(user.email, 'Choose a new Traceloom password');
    const key = keyOf(mail);
    const weak = await accept(key, 'password1234567');
    expect(weak.status).toBe(400);
    expect(weak.body.error).toMatchObject({ code: 'weak_password', field: 'password' });
    expect(weak.body.error.message).toMatch(/^password: too easy to guess/);
    const productName = await accept(key, 'traceloom12345');
    expect(productName.body.error?.code).toBe('weak_password');
    await accept(key, 'violet kernels hum at dawn').expect(204);
    expect((await login(user.email, 'violet kernels hum at dawn')).status).toBe(200);
    expect((await login(user.email, TEST_PASSWORD)).status).toBe(401);
    // Single use.
    expect((await accept(key, 'another fine long passphrase')).status).toBe(400);
  });

  it('answers an unknown or disabled address the same, and mails nothing', async () => {
    const disabled = await insertUser(t, 'author', { disabled: true });
    const unknown = await request(t.app)
      .post('/api/auth/password-reset')
      .send({ email: 'nobody@example.test' });
    const off = await request(t.app)
      .post('/api/auth/password-reset')
      .send({ email: disabled.email });
    expect(unknown.status).toBe(202);
    expect(off.status).toBe(202);
    expect(off.body).toEqual(unknown.body);
    await new Promise((r) => setTimeout(r, 300));
    expect(await mailsTo('nobody@example.test')).toEqual([]);
    expect(await mailsTo(disabled.email)).toEqual([]);
    const bad = await request(t.app).post('/api/auth/password-reset').send({ email: 'not-mail' });
    expect(bad.body.error).toMatchObject({ code: 'invalid_input', field: 'email' });
  });
});

describe('invitation resend', () => {
  it('sends an invited person a fresh link; refuses one who has a password', async () => {
    const invited = await insertUser(t, 'reviewer');
    await t.dataSource
      .getRepository(User)
      .update({ id: invited.id }, { passwordHash: unusablePasswordHash() });
    await api(t, admin, 'post', `/users/${invited.id}/invitations`, undefined, 201);
    const mail = await waitForMail(invited.email, 'You are invited to Traceloom');
    await accept(keyOf(mail), 'seven quiet rings of fermions').expect(204);
    const again = await api(t, admin, 'post', `/users/${invited.id}/invitations`, undefined, 409);
    expect(again.error.code).toBe('already_active');
  });
});
