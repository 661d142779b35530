import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { User } from '../db/entities/index.js';
import { createTestApp, insertUser, tokenFor, type TestApp } from '../testing/test-app.js';

let t: TestApp;
let author: User;
let token: string;
const logged: unknown[] = [];

const post = (url: string) => request(t.app).post(url).set('Authorization', `Bearer ${token}`);

/** A response body that leaks nothing: no stack frames, no SQL, no file paths. */
function expectNoLeak(text: string) {
  expect(text).not.toMatch(/\n\s+at |SQLITE|SELECT |INSERT |\/work\/|node_modules|\.ts:\d+/);
}

beforeAll(async () => {
  t = await createTestApp({}, (err) => logged.push(err));
  author = await insertUser(t, 'author');
  token = await tokenFor(t, author);
});
afterAll(() => t.close());

describe('validation', () => {
  it.each([
    [{ title: '' }, 'title', /title: must not be empty/],
    [{ title: '   ' }, 'title', /title: must not be empty/],
    [{ title: 'x'.repeat(201) }, 'title', /title: must be at most 200 characters/],
    [{}, 'title', /^title: /],
    [{ title: 42 }, 'title', /title: must be a text value/],
    [
      { title: 'ok', description: 'd'.repeat(5001) },
      'description',
      /description: must be at most 5000/,
    ],
    [{ title: 'ok', colour: 'red' }, 'colour', /colour: is not a known field/],
  ])('study body %j -> 400 naming %s', async (body, field, message) => {
    const res = await post('/api/studies').send(body);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_input');
    expect(res.body.error.field).toBe(field);
    expect(res.body.error.message).toMatch(message);
  });

  it('accepts a title at the 200-character limit and trims it', async () => {
    const res = await post('/api/studies').send({ title: `  ${'t'.repeat(200)}  ` });
    expect(res.status).toBe(201);
    expect(res.body.title).toBe('t'.repeat(200));
  });

  it.each([
    [{ email: 'not-an-address', displayName: 'A', role: 'author' }, 'email'],
    [{ email: `${'a'.repeat(250)}@x.io`, displayName: 'A', role: 'author' }, 'email'],
    [{ email: 'a@b.test', displayName: '', role: 'author' }, 'displayName'],
    [{ email: 'a@b.test', displayName: 'A', role: 'overlord' }, 'role'],
  ])('invite body %j names the field', async (body, field) => {
    const admin = await insertUser(t, 'admin');
    const res = await request(t.app)
      .post('/api/users')
      .set('Authorization', `Bearer ${await tokenFor(t, admin)}`)
      .send(body);
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe(field);
    expect(res.body.error.message.startsWith(`${field}: `)).toBe(true);
  });

  it('names the password field for an over-long password', async () => {
    const res = await request(t.app)
      .post('/api/auth/login')
      .send({ email: 'a@b.test', password: 'p'.repeat(1025) });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('password');
  });

  it('answers 400 for a body that is not an object', async () => {
    const res = await post('/api/studies').send([1, 2]);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_input');
  });
});

describe('errors', () => {
  it('answers malformed JSON with 400 invalid_json', async () => {
    const res = await post('/api/studies')
      .set('Content-Type', 'application/json')
      .send('{"title":');
    expect(res.status).toBe(400);
    expect(res.body).toEqual({
      error: { code: 'invalid_json', message: 'The request body is not valid JSON.' },
    });
  });

  it('answers a body over 1 MB with 413 payload_too_large', async () => {
    const res = await post('/api/studies').send({
      title: 'big',
      description: 'x'.repeat(1024 * 1024),
    });
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload_too_large');
  });

  it('answers an unknown /api path with a JSON 404', async () => {
    const res = await request(t.app).get('/api/no/such/thing');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
    expect(res.headers['content-type']).toMatch(/json/);
  });

  it('turns a failing dependency into a 500 without details, and keeps serving', async () => {
    const spy = vi
      .spyOn(t.dataSource, 'query')
      .mockRejectedValueOnce(
        new Error('SQLITE_CORRUPT: SELECT id FROM study at /work/main/x.ts:1'),
      );
    const res = await request(t.app).get('/api/studies').set('Authorization', `Bearer ${token}`);
    spy.mockRestore();
    expect(res.status).toBe(500);
    expect(res.body).toEqual({
      error: { code: 'internal', message: 'Something went wrong on the server.' },
    });
    expectNoLeak(res.text);
    expect(logged.length).toBeGreaterThan(0);
    const again = await request(t.app).get('/api/studies').set('Authorization', `Bearer ${token}`);
    expect(again.status).toBe(200);
  });

  it('never shows a stack trace in any error answer', async () => {
    const answers = await Promise.all([
      request(t.app).get('/api/studies'),
      post('/api/studies').set('Content-Type', 'application/json').send('{oops'),
      request(t.app).get('/api/studies/not-a-uuid').set('Authorization', `Bearer ${token}`),
      post('/api/studies').send({ title: 7 }),
    ]);
    for (const res of answers) {
      expect(res.status).toBeGreaterThanOrEqual(400);
      expect(Object.keys(res.body)).toEqual(['error']);
      expectNoLeak(res.text);
    }
  });
});

describe('headers', () => {
  it('sends a strict CSP with no external origin, and no X-Powered-By', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.headers['x-powered-by']).toBeUndefined();
    const csp: string = res.headers['content-security-policy'];
    const directives = Object.fromEntries(
      csp.split(';').map((part) => {
        const [name, ...values] = part.trim().split(/\s+/);
        return [name, values.join(' ')];
      }),
    );
    expect(directives).toMatchObject({
      'default-src': "'self'",
      'script-src': "'self'",
      'style-src': "'self' 'unsafe-inline'",
      'font-src': "'self'",
      'img-src': "'self' data:",
      'connect-src': "'self'",
      'object-src': "'none'",
      'frame-ancestors': "'none'",
      'base-uri': "'self'",
      'form-action': "'self'",
    });
    for (const value of Object.values(directives)) {
      for (const source of value.split(' ').filter(Boolean)) {
        expect(source, `CSP source ${source}`).toMatch(/^('self'|'none'|'unsafe-inline'|data:)$/);
      }
    }
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-frame-options']).toBe('DENY');
  });

  it('serves health without a token', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', version: '0.1.0', database: 'ok', mode: 'test' });
  });
});

describe('built client', () => {
  it('serves files, falls back to index.html for app paths, and keeps /api JSON', async () => {
    const dir = path.join(t.dir, 'client');
    mkdirSync(dir);
    writeFileSync(path.join(dir, 'index.html'), '<!doctype html><title>Traceloom test</title>');
    writeFileSync(path.join(dir, 'main.js'), 'console.log(1);');
    const withClient = await createTestApp({ staticDir: dir });
    try {
      const deep = await request(withClient.app).get('/studies/some-id');
      expect(deep.status).toBe(200);
      expect(deep.text).toContain('Traceloom test');
      expect(deep.headers['content-security-policy']).toContain("default-src 'self'");
      const file = await request(withClient.app).get('/main.js');
      expect(file.text).toBe('console.log(1);');
      const api = await request(withClient.app).get('/api/nothing-here');
      expect(api.status).toBe(404);
      expect(api.body.error.code).toBe('not_found');
    } finally {
      await withClient.close();
    }
  });
});

describe('client not built', () => {
  it('answers app paths with a JSON 404 when the client directory has no index.html', async () => {
    const missing = await createTestApp({ staticDir: path.join(t.dir, 'no-client-here') });
    try {
      const res = await request(missing.app).get('/studies/some-id');
      expect(res.status).toBe(404);
      expect(res.body.error.code).toBe('not_found');
    } finally {
      await missing.close();
    }
  });
});
