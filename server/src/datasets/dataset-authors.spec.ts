import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { User } from '../db/entities/index.js';
import { api, approve, draftOf, inReview, warmWorkers } from '../testing/dataset-fixtures.js';
import { finishedRun } from '../testing/gas-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';

let t: TestApp;
let maker: User;
let coauthor: User;
let reviewer: User;
let steward: User;
let admin: User;
let outsider: User;
let studyId: string;
let runId: string;

beforeAll(async () => {
  t = await createTestApp();
  maker = await insertUser(t, 'author', { displayName: 'Ada Kovacs' });
  coauthor = await insertUser(t, 'author', { displayName: 'Ravi Anand' });
  reviewer = await insertUser(t, 'reviewer', { displayName: 'Lena Brandt' });
  steward = await insertUser(t, 'steward', { displayName: 'Omar Haddad' });
  admin = await insertUser(t, 'admin');
  outsider = await insertUser(t, 'author');
  studyId = await insertStudy(t, maker, [coauthor, reviewer, steward]);
  await warmWorkers(t, maker);
  runId = await finishedRun(t, await tokenFor(t, maker), studyId);
});
afterAll(() => t.close());

const names = (dto: { authors: Array<{ displayName: string }> }) =>
  dto.authors.map((a) => a.displayName);

describe('the citation authors of a dataset', () => {
  it('default to the maker, then each approving reviewer', async () => {
    const id = await draftOf(t, maker, runId);
    const draft = await api(t, maker, 'get', `/datasets/${id}`, undefined, 200);
    expect(names(draft)).toEqual(['Ada Kovacs']);
    expect(draft).toMatchObject({ authorsEdited: false, can: { editAuthors: true } });
    await inReview(t, maker, id, reviewer);
    await approve(t, reviewer, id);
    const approved = await api(t, maker, 'get', `/datasets/${id}`, undefined, 200);
    expect(names(approved)).toEqual(['Ada Kovacs', 'Lena Brandt']);
  });

  it('are chosen by the maker (draft) or a steward (in review), in the order given', async () => {
    const id = await draftOf(t, maker, runId);
    const ids = [coauthor.id, maker.id];
    const byMaker = await api(t, maker, 'patch', `/datasets/${id}`, { authors: ids }, 200);
    expect(names(byMaker)).toEqual(['Ravi Anand', 'Ada Kovacs']);
    expect(byMaker.authorsEdited).toBe(true);
    await inReview(t, maker, id, reviewer);
    const byMakerInReview = { authors: [maker.id, coauthor.id] };
    await api(t, maker, 'patch', `/datasets/${id}`, byMakerInReview, 200);
    const all = { authors: [maker.id, coauthor.id, reviewer.id] };
    const bySteward = await api(t, steward, 'patch', `/datasets/${id}`, all, 200);
    expect(names(bySteward)).toEqual(['Ada Kovacs', 'Ravi Anand', 'Lena Brandt']);
    // The title stays a draft's: in review it is refused even with the authors beside it.
    await api(t, maker, 'patch', `/datasets/${id}`, { title: 'New' }, 409);
  });

  it('refuse every other role, and say which field is wrong', async () => {
    const id = await draftOf(t, maker, runId);
    const body = { authors: [maker.id] };
    for (const who of [coauthor, reviewer, admin]) {
      const res = await api(t, who, 'patch', `/datasets/${id}`, body, 403);
      expect(res.error.code).toBe('forbidden');
    }
    await api(t, outsider, 'patch', `/datasets/${id}`, body, 404);
    const stranger = await api(
      t,
      maker,
      'patch',
      `/datasets/${id}`,
      { authors: [maker.id, outsider.id] },
      400,
    );
    expect(stranger.error).toMatchObject({ field: 'authors' });
    expect(stranger.error.message).toBe('authors: entry 2 is not a member of the study.');
    const twice = { authors: [maker.id, maker.id] };
    const dup = await api(t, maker, 'patch', `/datasets/${id}`, twice, 400);
    expect(dup.error.message).toMatch(/^authors: must name each author once/);
    const none = await api(t, maker, 'patch', `/datasets/${id}`, { authors: [] }, 400);
    expect(none.error.field).toBe('authors');
    const res = await request(t.app)
      .patch(`/api/datasets/${id}`)
      .send({ authors: [maker.id] });
    expect(res.status).toBe(401);
  });

  it('are frozen into the locked document, its hash and the BibTeX and CSL exports', async () => {
    const id = await draftOf(t, maker, runId);
    await inReview(t, maker, id, reviewer);
    await approve(t, reviewer, id);
    const before = await api(t, steward, 'get', `/datasets/${id}/lock-preview`, undefined, 200);
    const chosen = { authors: [coauthor.id, maker.id, reviewer.id] };
    await api(t, maker, 'patch', `/datasets/${id}`, chosen, 200);
    const after = await api(t, steward, 'get', `/datasets/${id}/lock-preview`, undefined, 200);
    // The authors are part of what is hashed: choosing them changes the hash-to-be.
    expect(after.hash).not.toBe(before.hash);
    const body = { lockedAt: after.lockedAt, hash: after.hash };
    const { hash } = await api(t, steward, 'post', `/datasets/${id}/lock`, body, 200);
    expect(hash).toBe(after.hash);

    const pub = await request(t.app).get(`/api/public/datasets/${hash}`).expect(200);
    expect(pub.body.authors).toEqual(['Ravi Anand', 'Ada Kovacs', 'Lena Brandt']);
    expect(pub.body.document.authors.map((a: { id: string }) => a.id)).toEqual(chosen.authors);
    const bib = await request(t.app).get(`/api/public/datasets/${hash}/citation?format=bibtex`);
    expect(bib.text).toContain('author = {{Ravi Anand} and {Ada Kovacs} and {Lena Brandt}}');
    const csl = await request(t.app).get(`/api/public/datasets/${hash}/citation?format=csl`);
    expect(JSON.parse(csl.text)[0].author).toEqual([
      { literal: 'Ravi Anand' },
      { literal: 'Ada Kovacs' },
      { literal: 'Lena Brandt' },
    ]);

    // Once locked, the same answer for every role, the dataset's maker and the admin included.
    for (const who of [maker, coauthor, reviewer, steward, admin]) {
      const res = await api(t, who, 'patch', `/datasets/${id}`, { authors: [maker.id] }, 409);
      expect(res.error.code).toBe('dataset_locked');
    }
    const locked = await api(t, maker, 'get', `/datasets/${id}`, undefined, 200);
    expect(locked.can.editAuthors).toBe(false);
    expect(names(locked)).toEqual(['Ravi Anand', 'Ada Kovacs', 'Lena Brandt']);
  });
});
