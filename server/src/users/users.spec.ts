import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Invitation, type User } from '../db/entities/index.js';
import { createTestApp, insertUser, tokenFor, type TestApp } from '../testing/test-app.js';

let t: TestApp;
let admin: User;

async function asAdmin(method: 'get' | 'post' | 'patch', path: string, body?: object) {
  const req = request(t.app)
    [method](`/api${path}`)
    .set('Authorization', `Bearer ${await tokenFor(t, admin)}`);
  return body ? req.send(body) : req;
}

beforeAll(async () => {
  t = await createTestApp();
  admin = await insertUser(t, 'admin');
});
afterAll(() => t.close());

describe('users', () => {
  it('invites a person: an account without a usable password and a recorded invitation', async () => {
    const res = await asAdmin('post', '/users', {
      email: ' New.Person@Example.TEST ',
      displayName: 'New Person',
      role: 'steward',
    });
    expect(res.status).toBe(201);
    expect(res.body.user).toMatchObject({
      email: 'new.person@example.test',
      role: 'steward',
      disabled: false,
    });
    expect(res.body.invitation).toMatchObject({ email: 'new.person@example.test' });
    const invitation = await t.dataSource
      .getRepository(Invitation)
      .findOneOrFail({ where: { id: res.body.invitation.id }, relations: { invitedBy: true } });
    expect(invitation.invitedBy.id).toBe(admin.id);
    expect(invitation.acceptedAt).toBeNull();
    const [{ password_hash }] = await t.dataSource.query(
      'SELECT password_hash FROM user WHERE id = ?',
      [res.body.user.id],
    );
    expect(password_hash.startsWith('scrypt$')).toBe(false);
    const signIn = await request(t.app)
      .post('/api/auth/login')
      .send({ email: 'new.person@example.test', password: '' + password_hash });
    expect(signIn.status).toBe(401);
    const taken = await asAdmin('post', '/users', {
      email: 'NEW.person@example.test',
      displayName: 'Again',
      role: 'author',
    });
    expect(taken.status).toBe(409);
    expect(taken.body.error).toMatchObject({ code: 'email_taken', field: 'email' });
  });

  it('gives exactly one account when the same invitation arrives five times at once', async () => {
    const body = { email: 'twice@example.test', displayName: 'Twice', role: 'author' };
    const answers = await Promise.all(
      Array.from({ length: 5 }, () => asAdmin('post', '/users', body)),
    );
    expect(answers.map((res) => res.status).sort()).toEqual([201, 409, 409, 409, 409]);
    const [{ n }] = await t.dataSource.query(
      "SELECT count(*) AS n FROM user WHERE email = 'twice@example.test'",
    );
    expect(n).toBe(1);
  });

  it('lists users for admins and an active directory for everyone', async () => {
    const disabled = await insertUser(t, 'author', { disabled: true });
    const all = (await asAdmin('get', '/users')).body as Array<{ id: string; email: string }>;
    expect(all.map((u) => u.id)).toContain(disabled.id);
    expect(Object.keys(all[0]).sort()).toEqual([
      'createdAt',
      'disabled',
      'displayName',
      'email',
      'id',
      'invited',
      'role',
    ]);
    const reviewer = await insertUser(t, 'reviewer');
    const directory = await request(t.app)
      .get('/api/users/directory')
      .set('Authorization', `Bearer ${await tokenFor(t, reviewer)}`);
    expect(directory.status).toBe(200);
    const ids = (directory.body as Array<{ id: string }>).map((u) => u.id);
    expect(ids).toContain(reviewer.id);
    expect(ids).not.toContain(disabled.id);
    expect(Object.keys(directory.body[0]).sort()).toEqual(['displayName', 'email', 'id', 'role']);
  });

  it('patches role, disabled and display name, and audits the change', async () => {
    const user = await insertUser(t, 'author');
    const res = await asAdmin('patch', `/users/${user.id}`, {
      role: 'reviewer',
      displayName: 'Renamed',
    });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      id: user.id,
      role: 'reviewer',
      displayName: 'Renamed',
      disabled: false,
    });
    const [{ token_version }] = await t.dataSource.query(
      'SELECT token_version FROM user WHERE id = ?',
      [user.id],
    );
    expect(token_version).toBe(1);
    const rows = await t.dataSource.query(
      "SELECT actor_id, detail FROM audit_event WHERE action = 'user.update' AND target_id = ?",
      [user.id],
    );
    expect(rows).toHaveLength(1);
    expect(rows[0].actor_id).toBe(admin.id);
    expect(JSON.parse(rows[0].detail).before.role).toBe('author');
  });

  it('refuses an admin demoting or disabling themselves, an empty patch and an unknown user', async () => {
    const demote = await asAdmin('patch', `/users/${admin.id}`, { role: 'author' });
    expect(demote.status).toBe(400);
    expect(demote.body.error).toMatchObject({ code: 'self_change', field: 'role' });
    const disable = await asAdmin('patch', `/users/${admin.id}`, { disabled: true });
    expect(disable.body.error).toMatchObject({ code: 'self_change', field: 'disabled' });
    expect(
      (await asAdmin('patch', `/users/${admin.id}`, { displayName: 'Still Admin' })).status,
    ).toBe(200);
    const empty = await asAdmin('patch', `/users/${admin.id}`, {});
    expect(empty.status).toBe(400);
    expect(empty.body.error.code).toBe('invalid_input');
    const unknown = await asAdmin('patch', '/users/00000000-0000-4000-8000-000000000000', {
      disabled: true,
    });
    expect(unknown.status).toBe(404);
  });
});
