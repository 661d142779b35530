import { createHash } from 'node:crypto';
import { ROLES, type Role } from '@traceloom/shared/api';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { User } from '../db/entities/index.js';
import {
  warmWorkers,
  api,
  approve,
  draftOf,
  finishedRunOf,
  inReview,
  lockedDataset,
  RED_SPEC,
} from '../testing/dataset-fixtures.js';
import { bearer, finishedRun } from '../testing/gas-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';

let t: TestApp;
let author: User;
let reviewer: User;
let steward: User;
let admin: User;
let studyId: string;

beforeAll(async () => {
  t = await createTestApp();
  author = await insertUser(t, 'author', { displayName: 'Ines Okafor' });
  reviewer = await insertUser(t, 'reviewer', { displayName: 'Tomas Varga' });
  steward = await insertUser(t, 'steward', { displayName: 'Mei Lindqvist' });
  admin = await insertUser(t, 'admin');
  studyId = await insertStudy(t, author, [reviewer, steward]);
  await warmWorkers(t, author);
});
afterAll(() => t.close());

interface Mail {
  to: string;
  subject: string;
  text: string;
  raw: string;
  envelope: { to: string[] };
  headers: Array<[string, string]>;
}
const mailbox = async (): Promise<Mail[]> => api(t, admin, 'get', '/dev/mailbox', undefined, 200);
const mailsTo = async (user: User) =>
  (await mailbox()).filter((m) => m.envelope.to.includes(user.email));

describe('the review flow', () => {
  it('takes a run through review to a locked, public, verifiable dataset', async () => {
    const runId = await finishedRun(t, await tokenFor(t, author), studyId);
    const created = await api(
      t,
      author,
      'post',
      `/runs/${runId}/datasets`,
      { title: 'Trap canonical table' },
      201,
    );
    expect(created).toMatchObject({ state: 'draft', version: 1, supersedes: null, hash: null });
    expect(created.snapshot.nMax).toBe(5);
    // Z(1) of the trap is q^(1/2)/(1 - q) = q^(1/2) + q^(3/2) + ... (common practice).
    expect(created.snapshot.canonical[1].value.terms.slice(0, 2)).toEqual([
      ['1/2', '1'],
      ['3/2', '1'],
    ]);
    expect(created.checks.length).toBeGreaterThan(0);
    expect(created.checks.every((c: { status: string }) => c.status === 'passes')).toBe(true);

    const before = (await mailsTo(reviewer)).length;
    const inReviewDto = await api(
      t,
      author,
      'post',
      `/datasets/${created.id}/review-requests`,
      { reviewerIds: [reviewer.id] },
      200,
    );
    expect(inReviewDto.state).toBe('in_review');
    const requestMails = await mailsTo(reviewer);
    expect(requestMails.length).toBe(before + 1);
    expect(requestMails[0]!.subject).toBe('Review requested: Trap canonical table (v1)');
    expect(requestMails[0]!.text).toContain(`/datasets/${created.id}`);

    const inbox = await api(t, reviewer, 'get', '/review-requests', undefined, 200);
    expect(inbox.map((e: { dataset: { id: string } }) => e.dataset.id)).toContain(created.id);

    await api(
      t,
      reviewer,
      'post',
      `/datasets/${created.id}/comments`,
      { body: 'N = 3 checked by hand.', N: 3 },
      201,
    );
    await approve(t, reviewer, created.id);
    expect(
      (await mailsTo(author)).some((m) => m.subject === 'Approved: Trap canonical table (v1)'),
    ).toBe(true);

    const { hash } = await api(t, steward, 'post', `/datasets/${created.id}/lock`, undefined, 200);
    expect(hash).toMatch(/^[0-9a-f]{64}$/);
    const lockMails = (await mailbox()).filter(
      (m) => m.subject === 'Locked: Trap canonical table (v1)',
    );
    expect(lockMails.map((m) => m.envelope.to[0]).sort()).toEqual(
      [author.email, reviewer.email].sort(),
    );
    expect(lockMails[0]!.text).toContain(hash);

    const open = await request(t.app).get(`/api/public/datasets/${hash}`).expect(200);
    expect(open.body.hash).toBe(hash);
    expect(open.body.citation).toContain(hash);
    expect(open.body.citation).toContain('Trap canonical table, version 1');
    expect(open.body.document.comments[0]).toMatchObject({ N: 3, body: 'N = 3 checked by hand.' });
    expect(JSON.stringify(open.body)).not.toContain('@');

    const verify = await api(t, author, 'post', `/datasets/${created.id}/verify`, undefined, 200);
    expect(verify).toMatchObject({ ok: true, mismatches: [], hashOk: true });

    const audit = await api(
      t,
      steward,
      'get',
      `/audit?targetType=dataset&targetId=${created.id}`,
      undefined,
      200,
    );
    const actions = audit.map((e: { action: string }) => e.action);
    for (const action of [
      'dataset.create',
      'dataset.review_request',
      'dataset.comment',
      'dataset.review.approve',
      'dataset.lock',
      'dataset.verify',
    ]) {
      expect(actions).toContain(action);
    }
    await api(t, author, 'get', '/audit', undefined, 403);
  });

  it('refuses to lock without an approval, with a red check, or by the dataset creator', async () => {
    const red = await finishedRunOf(t, await tokenFor(t, steward), studyId, RED_SPEC);
    const id = await draftOf(t, steward, red);
    const dto = await api(t, steward, 'get', `/datasets/${id}`, undefined, 200);
    const redRows = dto.checks.filter((c: { status: string }) => c.status === 'fails');
    expect(redRows).toEqual([expect.objectContaining({ check: 'reference', N: 1 })]);
    await inReview(t, steward, id, reviewer);
    const byAdmin = await request(t.app)
      .post(`/api/datasets/${id}/lock`)
      .set('Authorization', bearer(await tokenFor(t, admin)));
    expect(byAdmin.status).toBe(403); // admins do not lock; stewards do
    await approve(t, reviewer, id);
    const own = await request(t.app)
      .post(`/api/datasets/${id}/lock`)
      .set('Authorization', bearer(await tokenFor(t, steward)));
    expect(own.status).toBe(403);
    expect(own.body.error.code).toBe('own_dataset');

    // A second dataset, made by the author: red until waived.
    const id2 = await draftOf(t, author, red);
    await inReview(t, author, id2, reviewer);
    await approve(t, reviewer, id2);
    const notReady = await request(t.app)
      .post(`/api/datasets/${id2}/lock`)
      .set('Authorization', bearer(await tokenFor(t, steward)));
    expect(notReady.status).toBe(409);
    expect(notReady.body.error).toMatchObject({ code: 'not_ready' });
    expect(notReady.body.error.message).toContain('1 check row(s) fail');
    const green = await request(t.app)
      .post(`/api/datasets/${id2}/waivers`)
      .set('Authorization', bearer(await tokenFor(t, steward)))
      .send({ check: 'reference', N: 0, reason: 'green anyway' });
    expect(green.status).toBe(400);
    expect(green.body.error.field).toBe('N');
    const waived = await api(
      t,
      steward,
      'post',
      `/datasets/${id2}/waivers`,
      { check: 'reference', N: 1, reason: 'The preprint misprints this coefficient.' },
      201,
    );
    expect(
      waived.checks.find((c: { N: number; check: string }) => c.check === 'reference' && c.N === 1)
        .status,
    ).toBe('waived');
    const { hash } = await api(t, steward, 'post', `/datasets/${id2}/lock`, undefined, 200);
    expect(hash).toMatch(/^[0-9a-f]{64}$/);
  });

  it('refuses a run that is not done and reviewers without access', async () => {
    const runId = await finishedRun(t, await tokenFor(t, author), studyId);
    const id = await draftOf(t, author, runId);
    const stranger = await insertUser(t, 'reviewer');
    const res = await request(t.app)
      .post(`/api/datasets/${id}/review-requests`)
      .set('Authorization', bearer(await tokenFor(t, author)))
      .send({ reviewerIds: [stranger.id] });
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ field: 'reviewerIds.0' });
    expect(res.body.error.message).toContain('no access to this study');
    const bad = await request(t.app)
      .post(`/api/datasets/${id}/review-requests`)
      .set('Authorization', bearer(await tokenFor(t, author)))
      .send({ reviewerIds: [author.id] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toContain('is not a reviewer or steward');
  });
});

describe('a locked dataset', () => {
  let locked: { id: string; hash: string; runId: string };
  beforeAll(async () => {
    locked = await lockedDataset(t, { author, reviewer, steward }, studyId);
  });

  it('cannot be changed through raw SQL: the triggers refuse UPDATE and DELETE', async () => {
    const db = t.dataSource;
    await expect(
      db.query(`UPDATE "dataset" SET "title" = 'forged' WHERE "id" = ?`, [locked.id]),
    ).rejects.toThrow(/dataset_locked/);
    await expect(
      db.query(`UPDATE "dataset" SET "state" = 'draft' WHERE "id" = ?`, [locked.id]),
    ).rejects.toThrow(/dataset_locked/);
    await expect(db.query(`DELETE FROM "dataset" WHERE "id" = ?`, [locked.id])).rejects.toThrow(
      /dataset_locked/,
    );
    await expect(
      db.query(`UPDATE "dataset_review" SET "verdict" = 'changes' WHERE "dataset_id" = ?`, [
        locked.id,
      ]),
    ).rejects.toThrow(/dataset_locked/);
    await expect(
      db.query(`DELETE FROM "dataset_review_request" WHERE "dataset_id" = ?`, [locked.id]),
    ).rejects.toThrow(/dataset_locked/);
    await expect(
      db.query(
        `INSERT INTO "dataset_comment" ("id", "body", "created_at", "dataset_id", "author_id") VALUES ('c0ffee00-0000-4000-8000-000000000000', 'late', 'now', ?, ?)`,
        [locked.id, author.id],
      ),
    ).rejects.toThrow(/dataset_locked/);
    const [row] = await db.query(`SELECT "title", "state", "hash" FROM "dataset" WHERE "id" = ?`, [
      locked.id,
    ]);
    expect(row).toEqual({ title: 'Trap, first look', state: 'locked', hash: locked.hash });
    // An unlocked dataset is not affected by the triggers.
    const draft = await draftOf(t, author, locked.runId);
    await db.query(`UPDATE "dataset" SET "title" = 'renamed' WHERE "id" = ?`, [draft]);
  });

  it('keeps its study: deleting the study is refused with 409, not a server error', async () => {
    for (const who of [author, admin]) {
      const res = await request(t.app)
        .delete(`/api/studies/${studyId}`)
        .set('Authorization', bearer(await tokenFor(t, who)));
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('study_has_locked_datasets');
    }
    const [row] = await t.dataSource.query(`SELECT COUNT(*) AS n FROM "study" WHERE "id" = ?`, [
      studyId,
    ]);
    expect(row.n).toBe(1);
  });

  it('answers 409 dataset_locked to every write, for every role, admin included', async () => {
    const users: Record<Role, User> = { author, reviewer, steward, admin };
    const writes = (t.app.locals.routeTable as Array<{ method: string; path: string }>).filter(
      (r) =>
        r.method !== 'get' &&
        r.path.startsWith('/datasets/:id') &&
        r.path !== '/datasets/:id/verify',
    );
    expect(writes.length).toBe(8);
    const bodies: Record<string, object> = {
      '/datasets/:id': { title: 'changed' },
      '/datasets/:id/review-requests': { reviewerIds: [reviewer.id] },
      '/datasets/:id/comments': { body: 'late remark' },
      '/datasets/:id/reviews': { verdict: 'changes', comment: 'too late' },
      '/datasets/:id/waivers': { check: 'reference', reason: 'too late' },
    };
    for (const route of writes) {
      for (const role of ROLES) {
        const res = await request(t.app)
          [route.method as 'post'](`/api${route.path.replace(':id', locked.id)}`)
          .set('Authorization', bearer(await tokenFor(t, users[role])))
          .send(bodies[route.path] ?? {});
        expect(res.status, `${route.method} ${route.path} as ${role}`).toBe(409);
        expect(res.body.error.code).toBe('dataset_locked');
      }
    }
  });

  it('exports JSON whose SHA-256 is the lock hash, and an import of it gives the same hash', async () => {
    const res = await request(t.app)
      .get(`/api/datasets/${locked.id}/export?format=json`)
      .set('Authorization', bearer(await tokenFor(t, reviewer)))
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(res.status).toBe(200);
    const body = res.body as Buffer;
    expect(createHash('sha256').update(body).digest('hex')).toBe(locked.hash);
    const doc = JSON.parse(body.toString('utf8'));
    const imported = await api(t, reviewer, 'post', '/datasets/import', doc, 200);
    expect(imported).toMatchObject({ hash: locked.hash, known: true, idMatches: true });
    doc.snapshot.result.canonical[2].value.terms[0][1] = '7';
    const forged = await api(t, reviewer, 'post', '/datasets/import', doc, 200);
    expect(forged.known).toBe(false);
    expect(forged.hash).not.toBe(locked.hash);
    const wrong = await request(t.app)
      .post('/api/datasets/import')
      .set('Authorization', bearer(await tokenFor(t, reviewer)))
      .send({ ...doc, format: 'x' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.field).toBe('format');
  });

  it('stays readable when a new version supersedes it', async () => {
    const v2 = await api(
      t,
      author,
      'post',
      `/runs/${locked.runId}/datasets`,
      { title: 'Trap, second look', supersedesId: locked.id },
      201,
    );
    expect(v2).toMatchObject({ version: 2, supersedes: { id: locked.id, version: 1 } });
    const v1 = await api(t, reviewer, 'get', `/datasets/${locked.id}`, undefined, 200);
    expect(v1.supersededBy).toEqual({ id: v2.id, version: 2 });
    const again = await request(t.app)
      .post(`/api/runs/${locked.runId}/datasets`)
      .set('Authorization', bearer(await tokenFor(t, author)))
      .send({ title: 'x', supersedesId: locked.id });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('already_superseded');
  });
});

describe('exports and verify', () => {
  it('escapes CSV cells that a spreadsheet would run, and keeps numbers as numbers', async () => {
    const runId = await finishedRun(t, await tokenFor(t, author), studyId);
    const id = await draftOf(t, author, runId, '=HYPERLINK("http://x.test","open")');
    const res = await request(t.app)
      .get(`/api/datasets/${id}/export?format=csv`)
      .set('Authorization', bearer(await tokenFor(t, author)));
    expect(res.status).toBe(200);
    const lines = res.text.split('\n');
    expect(lines[0]).toBe(`dataset,"'=HYPERLINK(""http://x.test"",""open"")"`);
    expect(lines[1]).toBe('version,1');
    expect(res.text).toContain('\nN,Z(N),lowest exponent,terms,known to,routes,route check\n0,1,');
    for (const line of lines) expect(line).not.toMatch(/(^|,)[=+@\t\r]/);
    const tex = await request(t.app)
      .get(`/api/datasets/${id}/export?format=latex`)
      .set('Authorization', bearer(await tokenFor(t, author)));
    expect(tex.text).toContain('% needs \\usepackage{amsmath,longtable}');
    expect(tex.text).toMatch(/\\begin\{align\*\}\nZ\(0\) &= 1 \\\\\n/);
    const matrix = await request(t.app)
      .get(`/api/datasets/${id}/export?format=matrix`)
      .set('Authorization', bearer(await tokenFor(t, author)));
    expect(matrix.status).toBe(200);
    expect(matrix.headers['content-type']).toMatch(/^text\/csv/);
    expect(matrix.headers['content-disposition']).toMatch(/-v1\.matrix\.csv"$/);
    expect(matrix.text).toMatch(/^N,q\^0,/);
    expect(matrix.text.split('\n')[1]).toMatch(/^0,1(,0)*$/);
    const json = await request(t.app)
      .get(`/api/datasets/${id}/export?format=json`)
      .set('Authorization', bearer(await tokenFor(t, author)));
    expect(json.status).toBe(409);
    const pdf = await request(t.app)
      .get(`/api/datasets/${id}/export?format=pdf`)
      .set('Authorization', bearer(await tokenFor(t, author)));
    expect(pdf.body.error).toMatchObject({ code: 'invalid_input', field: 'format' });
  });

  it('verify reports a stored result that no longer matches its spec', async () => {
    const runId = await finishedRun(t, await tokenFor(t, author), studyId);
    const id = await draftOf(t, author, runId);
    const [{ snapshot }] = await t.dataSource.query(
      `SELECT "snapshot" FROM "dataset" WHERE "id" = ?`,
      [id],
    );
    const s = JSON.parse(snapshot);
    s.result.canonical[3].value.terms[0][1] = '5';
    await t.dataSource.query(`UPDATE "dataset" SET "snapshot" = ? WHERE "id" = ?`, [
      JSON.stringify(s),
      id,
    ]);
    const verify = await api(t, author, 'post', `/datasets/${id}/verify`, undefined, 200);
    expect(verify.ok).toBe(false);
    expect(verify.mismatches).toEqual(['canonical N = 3: differs']);
    expect(verify.hashOk).toBeNull();
  });

  it('edits and deletes drafts only', async () => {
    const runId = await finishedRun(t, await tokenFor(t, author), studyId);
    const id = await draftOf(t, author, runId);
    const patched = await api(
      t,
      author,
      'patch',
      `/datasets/${id}`,
      { description: 'low N only' },
      200,
    );
    expect(patched.description).toBe('low N only');
    const empty = await request(t.app)
      .patch(`/api/datasets/${id}`)
      .set('Authorization', bearer(await tokenFor(t, author)))
      .send({ title: '  ' });
    expect(empty.body.error).toMatchObject({ code: 'invalid_input', field: 'title' });
    await inReview(t, author, id, reviewer);
    const late = await request(t.app)
      .delete(`/api/datasets/${id}`)
      .set('Authorization', bearer(await tokenFor(t, author)));
    expect(late.status).toBe(409);
    expect(late.body.error.code).toBe('not_draft');
    const other = await draftOf(t, author, runId);
    await api(t, author, 'delete', `/datasets/${other}`, undefined, 204);
    await api(t, author, 'get', `/datasets/${other}`, undefined, 404);
  });
});

describe('mail', () => {
  it('puts no CR/LF from a display name or subject into a header', async () => {
    const eve = await insertUser(t, 'reviewer', { displayName: 'Eve\r\nBcc: spy@evil.test' });
    const study = await insertStudy(t, author, [eve]);
    const runId = await finishedRun(t, await tokenFor(t, author), study);
    const id = await draftOf(t, author, runId, 'Trap\r\nBcc: spy2@evil.test\r\nX-Injected: yes');
    await inReview(t, author, id, eve);
    const [mail] = await mailsTo(eve);
    expect(mail).toBeDefined();
    expect(mail!.envelope.to).toEqual([eve.email]);
    const names = mail!.headers.map(([name]) => name);
    expect(names).not.toContain('bcc');
    expect(names).not.toContain('x-injected');
    const head = mail!.raw.slice(0, mail!.raw.search(/\r?\n\r?\n/));
    expect(head.split(/\r?\n/)).toHaveLength(8);
    expect(head).not.toMatch(/(^|\n)(Bcc|X-Injected):/i);
    expect(mail!.subject).toBe('Review requested: Trap Bcc: spy2@evil.test X-Injected: yes (v1)');
    expect(mail!.to).toContain(eve.email);
  });

  it('sends the invitation to the invited address only', async () => {
    const res = await api(
      t,
      admin,
      'post',
      '/users',
      { email: 'newcomer@example.test', displayName: 'Noor Haddad', role: 'reviewer' },
      201,
    );
    const mails = (await mailbox()).filter((m) => m.envelope.to.includes('newcomer@example.test'));
    expect(mails).toHaveLength(1);
    expect(mails[0]!.subject).toBe('You are invited to Traceloom');
    expect(mails[0]!.text).toContain('Hello Noor Haddad');
    expect(mails[0]!.text).toContain('the role reviewer');
    expect(res.user.email).toBe('newcomer@example.test');
  });
});
