import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { lockedDataset, warmWorkers } from '../testing/dataset-fixtures.js';
import { createTestApp, insertStudy, insertUser, type TestApp } from '../testing/test-app.js';

let t: TestApp;
let hash: string;

beforeAll(async () => {
  t = await createTestApp();
  const author = await insertUser(t, 'author', { displayName: 'Ines Okafor' });
  const reviewer = await insertUser(t, 'reviewer', { displayName: 'Tomas Varga_{x}' });
  const steward = await insertUser(t, 'steward', { displayName: 'Mei Lindqvist' });
  const studyId = await insertStudy(t, author, [reviewer, steward]);
  await warmWorkers(t, author);
  ({ hash } = await lockedDataset(t, { author, reviewer, steward }, studyId));
});
afterAll(() => t.close());

describe('citation exports of a locked dataset', () => {
  it('gives BibTeX naming the maker and the approving reviewer, the hash and the public address', async () => {
    const res = await request(t.app).get(`/api/public/datasets/${hash}/citation?format=bibtex`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toContain('application/x-bibtex');
    const text = res.text;
    expect(text).toMatch(new RegExp(`^@misc\\{traceloom-${hash.slice(0, 12)},\\n`));
    // BibTeX separates authors by "and"; special characters escaped (common practice).
    expect(text).toContain('author = {{Ines Okafor} and {Tomas Varga\\_\\{x\\}}}');
    expect(text).toContain(`howpublished = {Traceloom dataset, SHA-256 ${hash}}`);
    expect(text).toMatch(new RegExp(`url = \\{http[^}]*/public/${hash}\\}`));
    expect(text.match(/\{/g)!.length).toBe(text.match(/\}/g)!.length);
  });

  it('gives CSL-JSON (item type dataset) with the same authors and date', async () => {
    const res = await request(t.app).get(`/api/public/datasets/${hash}/citation?format=csl`);
    expect(res.status).toBe(200);
    const [item] = JSON.parse(res.text);
    expect(item).toMatchObject({
      type: 'dataset',
      author: [{ literal: 'Ines Okafor' }, { literal: 'Tomas Varga_{x}' }],
      version: '1',
      note: `SHA-256 ${hash}`,
    });
    const today = new Date().toISOString().slice(0, 10).split('-').map(Number);
    expect(item.issued['date-parts'][0]).toEqual(today);
    expect(item.URL).toMatch(new RegExp(`/public/${hash}$`));
  });

  it('refuses another format on its field, and an unknown hash with 404', async () => {
    const bad = await request(t.app).get(`/api/public/datasets/${hash}/citation?format=ris`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('format');
    const none = await request(t.app).get(
      `/api/public/datasets/${'0'.repeat(64)}/citation?format=csl`,
    );
    expect(none.status).toBe(404);
  });
});
