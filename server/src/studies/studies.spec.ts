import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { User } from '../db/entities/index.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';
import { createGas } from '../testing/gas-fixtures.js';

let t: TestApp;
let owner: User;
let stewardMember: User;
let reviewerMember: User;
let outsider: User;
let admin: User;

type Method = 'get' | 'post' | 'patch' | 'delete';
async function as(user: User, method: Method, path: string, body?: object) {
  const req = request(t.app)
    [method](`/api${path}`)
    .set('Authorization', `Bearer ${await tokenFor(t, user)}`);
  return body ? req.send(body) : req;
}

async function auditActions(studyId: string): Promise<string[]> {
  const rows = await t.dataSource.query(
    "SELECT action FROM audit_event WHERE target_type = 'study' AND target_id = ? ORDER BY rowid",
    [studyId],
  );
  return rows.map((row: { action: string }) => row.action);
}

beforeAll(async () => {
  t = await createTestApp();
  owner = await insertUser(t, 'author');
  stewardMember = await insertUser(t, 'steward');
  reviewerMember = await insertUser(t, 'reviewer');
  outsider = await insertUser(t, 'author');
  admin = await insertUser(t, 'admin');
});
afterAll(() => t.close());

describe('studies', () => {
  it('creates a study owned by the caller, with an empty description by default', async () => {
    const res = await as(owner, 'post', '/studies', { title: 'Ring kernels' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      title: 'Ring kernels',
      description: '',
      owner: { id: owner.id, displayName: owner.displayName, email: owner.email },
      members: [],
    });
    expect(res.body.createdAt).toBe(res.body.updatedAt);
    expect(await auditActions(res.body.id)).toEqual(['study.create']);
  });

  it('shows a study only to its owner, members and admins; others get 404', async () => {
    const id = await insertStudy(t, owner, [reviewerMember]);
    for (const user of [owner, reviewerMember, admin]) {
      expect((await as(user, 'get', `/studies/${id}`)).status).toBe(200);
      const list = (await as(user, 'get', '/studies')).body as Array<{ id: string }>;
      expect(list.map((s) => s.id)).toContain(id);
    }
    const hidden = await as(outsider, 'get', `/studies/${id}`);
    expect(hidden.status).toBe(404);
    expect(hidden.body.error.code).toBe('not_found');
    const list = (await as(outsider, 'get', '/studies')).body as Array<{ id: string }>;
    expect(list.map((s) => s.id)).not.toContain(id);
    // Hidden and missing look the same.
    const missing = await as(outsider, 'get', '/studies/00000000-0000-4000-8000-000000000000');
    expect(missing.body).toEqual(hidden.body);
    for (const [method, path, body] of [
      ['patch', `/studies/${id}`, { title: 'x' }],
      ['delete', `/studies/${id}`, undefined],
      ['post', `/studies/${id}/members`, { userId: outsider.id }],
      ['delete', `/studies/${id}/members/${reviewerMember.id}`, undefined],
    ] as const) {
      expect((await as(outsider, method, path, body)).status, `${method} ${path}`).toBe(404);
    }
  });

  it('lets the owner, an admin and an author/steward member edit; a reviewer member gets 403', async () => {
    const id = await insertStudy(t, owner, [stewardMember, reviewerMember]);
    const steward = await as(stewardMember, 'patch', `/studies/${id}`, {
      description: 'harmonic trap',
    });
    expect(steward.status).toBe(200);
    expect(steward.body.description).toBe('harmonic trap');
    expect(steward.body.updatedAt >= steward.body.createdAt).toBe(true);
    expect((await as(admin, 'patch', `/studies/${id}`, { title: 'By admin' })).body.title).toBe(
      'By admin',
    );
    expect((await as(owner, 'patch', `/studies/${id}`, { title: 'By owner' })).body.title).toBe(
      'By owner',
    );
    const reviewer = await as(reviewerMember, 'patch', `/studies/${id}`, { title: 'No' });
    expect(reviewer.status).toBe(403);
    expect(await auditActions(id)).toEqual(['study.update', 'study.update', 'study.update']);
  });

  it('lets only the owner or an admin delete; members get 403; memberships go with the study', async () => {
    const id = await insertStudy(t, owner, [stewardMember]);
    expect((await as(stewardMember, 'delete', `/studies/${id}`)).status).toBe(403);
    expect((await as(owner, 'delete', `/studies/${id}`)).status).toBe(204);
    expect((await as(owner, 'get', `/studies/${id}`)).status).toBe(404);
    const [{ n }] = await t.dataSource.query(
      'SELECT count(*) AS n FROM study_member WHERE study_id = ?',
      [id],
    );
    expect(n).toBe(0);
    expect(await auditActions(id)).toEqual(['study.delete']);
  });

  it('adds and removes members with clear refusals', async () => {
    const id = await insertStudy(t, owner);
    const added = await as(owner, 'post', `/studies/${id}/members`, { userId: reviewerMember.id });
    expect(added.status).toBe(201);
    expect(added.body.members).toEqual([
      {
        id: reviewerMember.id,
        displayName: reviewerMember.displayName,
        email: reviewerMember.email,
        role: 'reviewer',
      },
    ]);
    const again = await as(owner, 'post', `/studies/${id}/members`, { userId: reviewerMember.id });
    expect(again.status).toBe(409);
    expect(again.body.error).toMatchObject({ code: 'already_member', field: 'userId' });
    const ownerAsMember = await as(owner, 'post', `/studies/${id}/members`, { userId: owner.id });
    expect(ownerAsMember.status).toBe(409);
    const unknown = await as(owner, 'post', `/studies/${id}/members`, {
      userId: '00000000-0000-4000-8000-000000000000',
    });
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.field).toBe('userId');
    const badId = await as(owner, 'post', `/studies/${id}/members`, { userId: 'x' });
    expect(badId.status).toBe(400);
    expect(badId.body.error.field).toBe('userId');
    const byMember = await as(reviewerMember, 'post', `/studies/${id}/members`, {
      userId: stewardMember.id,
    });
    expect(byMember.status).toBe(403);
    const removed = await as(owner, 'delete', `/studies/${id}/members/${reviewerMember.id}`);
    expect(removed.status).toBe(200);
    expect(removed.body.members).toEqual([]);
    const notMember = await as(owner, 'delete', `/studies/${id}/members/${reviewerMember.id}`);
    expect(notMember.status).toBe(404);
    expect(notMember.body.error.field).toBe('userId');
    expect((await as(reviewerMember, 'get', `/studies/${id}`)).status).toBe(404);
    expect(await auditActions(id)).toEqual(['study.member_add', 'study.member_remove']);
  });

  it('refuses a disabled user as a new member', async () => {
    const id = await insertStudy(t, owner);
    const disabled = await insertUser(t, 'reviewer', { disabled: true });
    const res = await as(owner, 'post', `/studies/${id}/members`, { userId: disabled.id });
    expect(res.status).toBe(404);
  });

  it('counts the owner and the members once, and dates a study by its latest change inside', async () => {
    const made = await as(owner, 'post', '/studies', { title: 'Counted study' });
    expect(made.body.memberCount).toBe(1);
    expect(made.body.lastChangeAt >= made.body.updatedAt).toBe(true);
    const added = await as(owner, 'post', `/studies/${made.body.id}/members`, {
      userId: reviewerMember.id,
    });
    expect(added.body.memberCount).toBe(2);
    expect(added.body.lastChangeAt > made.body.updatedAt).toBe(true);
    const older = await as(owner, 'post', '/studies', { title: 'Older study' });
    // A new gas in the first study makes it the latest change, though its own row is older.
    await createGas(t, await tokenFor(t, owner), made.body.id);
    const list = await as(owner, 'get', '/studies');
    const ids = list.body.map((st: { id: string }) => st.id);
    expect(ids.indexOf(made.body.id)).toBeLessThan(ids.indexOf(older.body.id));
    const first = list.body.find((st: { id: string }) => st.id === made.body.id);
    expect(first.lastChangeAt > older.body.updatedAt).toBe(true);
    const removed = await as(
      owner,
      'delete',
      `/studies/${made.body.id}/members/${reviewerMember.id}`,
    );
    expect(removed.status).toBeLessThan(300);
    const after = await as(owner, 'get', `/studies/${made.body.id}`);
    expect(after.body.memberCount).toBe(1);
    expect(after.body.lastChangeAt >= first.lastChangeAt).toBe(true);
  });
});
