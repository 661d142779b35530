import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { User } from '../db/entities/index.js';
import { api } from '../testing/dataset-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  TEST_PASSWORD,
  type TestApp,
} from '../testing/test-app.js';

// Audit scope (issue finding 6): a steward outside a study read its events, a confidential
// draft description, invited e-mail addresses and login IPs. Replayed here.
let t: TestApp;
let author: User;
let memberSteward: User;
let outsideSteward: User;
let admin: User;
let studyId: string;
const SECRET = 'confidential: unpublished conjecture for the ring kernel';

interface Event {
  action: string;
  targetType: string;
  targetId: string;
  detail: Record<string, unknown>;
}

beforeAll(async () => {
  t = await createTestApp();
  author = await insertUser(t, 'author');
  memberSteward = await insertUser(t, 'steward');
  outsideSteward = await insertUser(t, 'steward');
  admin = await insertUser(t, 'admin');
  const created = await api(
    t,
    author,
    'post',
    '/studies',
    { title: 'Ring', description: SECRET },
    201,
  );
  studyId = created.id;
  await api(t, author, 'post', `/studies/${studyId}/members`, { userId: memberSteward.id }, 201);
  await api(
    t,
    admin,
    'post',
    '/users',
    {
      email: 'new.colleague@example.test',
      displayName: 'New colleague',
      role: 'author',
    },
    201,
  );
  await request(t.app)
    .post('/api/auth/login')
    .send({ email: author.email, password: TEST_PASSWORD })
    .expect(200);
});
afterAll(() => t.close());

const audit = (user: User): Promise<Event[]> =>
  api(t, user, 'get', '/audit?limit=500', undefined, 200);

describe('the audit log', () => {
  it('shows a steward outside the study none of its events, and no user events', async () => {
    const events = await audit(outsideSteward);
    const text = JSON.stringify(events);
    expect(events).toEqual([]);
    expect(text).not.toContain(SECRET);
    expect(text).not.toContain('new.colleague@example.test');
    // Asking for the study's events by id gives nothing either.
    const byId = await api(
      t,
      outsideSteward,
      'get',
      `/audit?targetType=study&targetId=${studyId}`,
      undefined,
      200,
    );
    expect(byId).toEqual([]);
  });

  it("shows a member steward the study's events but no addresses", async () => {
    const events = await audit(memberSteward);
    expect(events.map((e) => e.action).sort()).toEqual(['study.create', 'study.member_add']);
    expect(events.every((e) => e.targetId === studyId)).toBe(true);
    const text = JSON.stringify(events);
    expect(text).not.toMatch(/"ip"|"email"/);
    expect(text).not.toContain('new.colleague@example.test');
  });

  it('shows an admin everything, with the login address and the invited e-mail', async () => {
    const events = await audit(admin);
    const login = events.find((e) => e.action === 'auth.login');
    expect(login?.detail.ip).toEqual(expect.any(String));
    const invite = events.find((e) => e.action === 'user.invite');
    expect(invite?.detail.email).toBe('new.colleague@example.test');
    expect(events.some((e) => e.targetId === studyId)).toBe(true);
  });

  it('is append-only inside the database: UPDATE and DELETE are refused', async () => {
    const [{ n: before }] = await t.dataSource.query('SELECT count(*) AS n FROM audit_event');
    await expect(t.dataSource.query(`UPDATE audit_event SET detail = '{}'`)).rejects.toThrow(
      /audit_append_only/,
    );
    await expect(t.dataSource.query('DELETE FROM audit_event')).rejects.toThrow(
      /audit_append_only/,
    );
    const [{ n: after }] = await t.dataSource.query('SELECT count(*) AS n FROM audit_event');
    expect(after).toBe(before);
    expect(before).toBeGreaterThan(3);
  });

  it('stores the study of each event, and backfills it for older events', async () => {
    const rows: Array<{ target_type: string; study_id: string | null }> = await t.dataSource.query(
      'SELECT target_type, study_id FROM audit_event',
    );
    for (const row of rows) {
      if (row.target_type === 'study') expect(row.study_id).toBe(studyId);
      else expect(row.study_id).toBeNull();
    }
    // Down to the level before the study column, an older event, then up again.
    const applied = async () =>
      (
        await t.dataSource.query(
          `SELECT count(*) AS n FROM migrations WHERE name = 'AuditStudyScope1796300000000'`,
        )
      )[0].n as number;
    while ((await applied()) > 0) await t.dataSource.undoLastMigration({ transaction: 'each' });
    const other = await insertStudy(t, author);
    await t.dataSource.query(
      `INSERT INTO audit_event (id, actor_id, action, target_type, target_id, detail, created_at)
       VALUES ('00000000-0000-4000-8000-000000000001', ?, 'study.update', 'study', ?, '{}', ?)`,
      [author.id, other, new Date().toISOString()],
    );
    await t.dataSource.runMigrations({ transaction: 'each' });
    const [row] = await t.dataSource.query(
      `SELECT study_id FROM audit_event WHERE id = '00000000-0000-4000-8000-000000000001'`,
    );
    expect(row.study_id).toBe(other);
  });
});
