import { gzipSync } from 'node:zlib';
import nodemailer from 'nodemailer';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ReferenceTable, type User } from '../db/entities/index.js';
import { api, lockedDataset, warmWorkers } from '../testing/dataset-fixtures.js';
import { bearer, finishedRun } from '../testing/gas-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';
import { nestedDeeperThan } from './api-guards.js';

// Errors and small leaks (issue finding 10), each replayed as it was found.
let t: TestApp;
let author: User;
let reviewer: User;
let steward: User;
let studyId: string;
let token: string;
const errors: unknown[] = [];

beforeAll(async () => {
  t = await createTestApp({}, (err) => errors.push(err));
  author = await insertUser(t, 'author');
  reviewer = await insertUser(t, 'reviewer');
  steward = await insertUser(t, 'steward');
  studyId = await insertStudy(t, author, [reviewer, steward]);
  token = await tokenFor(t, author);
  await warmWorkers(t, author);
});
afterAll(() => t.close());

describe('faults a client can cause answer 4xx, never 500', () => {
  it('malformed %-encoding in the path: 400 invalid_path', async () => {
    for (const path of ['/api/studies/%E0%A4%A', '/api/public/datasets/%ZZ', '/api/gases/%']) {
      const res = await request(t.app).get(path).set('Authorization', bearer(token));
      expect(res.status, path).toBe(400);
      expect(res.body.error.code, path).toBe('invalid_path');
    }
  });

  it('a body that claims gzip but is not: 400 invalid_body', async () => {
    const res = await request(t.app)
      .post('/api/compute')
      .set('Authorization', bearer(token))
      .set('Content-Type', 'application/json')
      .set('Content-Encoding', 'gzip')
      .serialize(((body: Buffer) => body) as unknown as (obj: unknown) => string)
      .send(Buffer.from('this is not gzip at all'));
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_body');
    // A real gzip body still works.
    const ok = await request(t.app)
      .post('/api/auth/login')
      .set('Content-Type', 'application/json')
      .set('Content-Encoding', 'gzip')
      .serialize(((body: Buffer) => body) as unknown as (obj: unknown) => string)
      .send(gzipSync(JSON.stringify({ email: 'x@example.test', password: 'not the password' })));
    expect(ok.body.error).toMatchObject({ code: 'invalid_credentials' });
  });

  it('JSON nested 5000 deep: 400 too_deep, on every route', async () => {
    const deep = '['.repeat(5000) + ']'.repeat(5000);
    for (const path of ['/api/compute', `/api/studies/${studyId}/gases`, '/api/auth/login']) {
      const res = await request(t.app)
        .post(path)
        .set('Authorization', bearer(token))
        .set('Content-Type', 'application/json')
        .send(`{"spec": {"weights": {"kind": "values", "values": ${deep}}}}`);
      expect(res.status, path).toBe(400);
      expect(res.body.error.code, path).toBe('too_deep');
    }
    expect(nestedDeeperThan({ a: [[[1]]] }, 4)).toBe(false);
    expect(nestedDeeperThan({ a: [[[[1]]]] }, 4)).toBe(true);
  });

  it('an upload whose reading runs out of memory: 413, nothing stored', async () => {
    const quick = t.services.pools.quick;
    const run = quick.run.bind(quick);
    // The worker's own out-of-memory error, as Node raises it when the heap limit is hit.
    quick.run = () =>
      Promise.reject(
        Object.assign(new Error('worker ran out of memory'), {
          code: 'ERR_WORKER_OUT_OF_MEMORY',
        }),
      );
    try {
      const before = await t.dataSource.getRepository(ReferenceTable).count();
      const res = await request(t.app)
        .post(`/api/studies/${studyId}/references`)
        .set('Authorization', bearer(token))
        .attach('file', Buffer.from('N,value\n1,"1 + q + O(q^2)"\n'), 'table.csv');
      expect(res.status).toBe(413);
      expect(res.body.error).toMatchObject({ code: 'file_too_complex', field: 'file' });
      expect(await t.dataSource.getRepository(ReferenceTable).count()).toBe(before);
    } finally {
      quick.run = run;
    }
  });

  it('logged no unexpected error for any of the above', () => {
    expect(errors).toEqual([]);
  });
});

describe('small leaks', () => {
  it('stores an uploaded filename without CR/LF or markup', async () => {
    const res = await request(t.app)
      .post(`/api/studies/${studyId}/references`)
      .set('Authorization', bearer(token))
      .attach('file', Buffer.from('N,value\n1,"1 + q + O(q^2)"\n'), {
        filename: 'table\r\nX-Injected: 1<img src=x onerror=alert(1)>.csv',
        contentType: 'text/csv',
      });
    expect(res.status).toBe(201);
    expect(res.body.filename).not.toMatch(/[\r\n<>"]/);
    expect(res.body.filename).toMatch(/\.csv$/);
    const row = await t.dataSource
      .getRepository(ReferenceTable)
      .findOneByOrFail({ id: res.body.id });
    expect(row.filename).toBe(res.body.filename);
  });

  it('the public page does not name a private draft that supersedes it', async () => {
    const v1 = await lockedDataset(t, { author, reviewer, steward }, studyId);
    const runId = await finishedRun(t, token, studyId);
    const draft = await api(
      t,
      author,
      'post',
      `/runs/${runId}/datasets`,
      { title: 'Trap, second look', supersedesId: v1.id },
      201,
    );
    expect(draft.version).toBe(2);
    const open = await request(t.app).get(`/api/public/datasets/${v1.hash}`).expect(200);
    expect(open.body.supersededBy).toBeNull();
    expect(JSON.stringify(open.body)).not.toContain(draft.id);
    // Members still see it.
    const inside = await api(t, author, 'get', `/datasets/${v1.id}`, undefined, 200);
    expect(inside.supersededBy).toEqual({ id: draft.id, version: 2 });
  });

  it('the local mail fake refuses mail without its credentials', async () => {
    const fake = (await t.services.mail.mailbox())!;
    const port = fake.port;
    const message = { from: 'x@example.test', to: 'y@example.test', subject: 'planted', text: 'x' };
    const anonymous = nodemailer.createTransport({ host: '127.0.0.1', port, ignoreTLS: true });
    await expect(anonymous.sendMail(message)).rejects.toThrow();
    const wrong = nodemailer.createTransport({
      host: '127.0.0.1',
      port,
      ignoreTLS: true,
      auth: { user: 'traceloom', pass: 'guess' },
    });
    await expect(wrong.sendMail(message)).rejects.toThrow(/Invalid username or password|535/);
    expect(fake.list().some((m) => m.subject === 'planted')).toBe(false);
  });
});

describe('HTTP semantics', () => {
  it('every API answer carries Cache-Control: no-store', async () => {
    for (const res of [
      await request(t.app).get('/api/health'),
      await request(t.app).get('/api/auth/me').set('Authorization', bearer(token)),
      await request(t.app).get('/api/auth/me'),
      await request(t.app).get('/api/no/such/thing'),
    ]) {
      expect(res.headers['cache-control']).toBe('no-store');
    }
  });

  it('a wrong method on a known path: 405 with Allow; an unknown path stays 404', async () => {
    const health = await request(t.app).delete('/api/health');
    expect(health.status).toBe(405);
    expect(health.headers.allow).toBe('GET, HEAD');
    expect(health.body.error.code).toBe('method_not_allowed');
    const studies = await request(t.app).put('/api/studies').set('Authorization', bearer(token));
    expect(studies.status).toBe(405);
    expect(studies.headers.allow).toBe('GET, HEAD, POST');
    const one = await request(t.app).post(`/api/studies/${studyId}`);
    expect(one.status).toBe(405);
    expect(one.headers.allow).toContain('PATCH');
    expect((await request(t.app).get('/api/no/such/thing')).status).toBe(404);
  });
});
