import { ROLES, type Role } from '@traceloom/shared/api';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { unusablePasswordHash } from './auth/password.js';
import { User } from './db/entities/index.js';
import { routeKey, type RouteSpec } from './http/route-table.js';
import { datasetAccess, datasetMatrix } from './testing/dataset-matrix.js';
import { featureAccess, featureMatrix, type MatrixCall } from './testing/matrix-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  TEST_PASSWORD,
  tokenFor,
  type TestApp,
} from './testing/test-app.js';

/** What an allowed caller sends and the success status they must get. */
type AllowedCall = MatrixCall;

type Fixture = (actor: User) => Promise<AllowedCall>;

let t: TestApp;
const actors = {} as Record<Role, User>;
let outsider: User;

/** A study `actor` may act on: their own, or (for a role that cannot own one) as a member. */
async function studyFor(actor: User, members: User[] = []): Promise<string> {
  if (actor.role === 'reviewer') return insertStudy(t, outsider, [actor, ...members]);
  return insertStudy(t, actor, members);
}

let seq = 0;

/**
 * One entry per route in the table: how an allowed caller uses it. Adding a route without an
 * entry here fails the "covers every route" test below.
 */
const MATRIX: Record<string, Fixture> = {
  'GET /health': async () => ({ path: '/health', status: 200 }),
  'POST /auth/login': async (actor) => ({
    path: '/auth/login',
    body: { email: actor.email, password: TEST_PASSWORD },
    status: 200,
  }),
  'POST /auth/password-reset': async (actor) => ({
    path: '/auth/password-reset',
    body: { email: actor.email },
    status: 202,
  }),
  'POST /users/:id/invitations': async () => {
    const invited = await insertUser(t, 'author');
    await t.dataSource
      .getRepository(User)
      .update({ id: invited.id }, { passwordHash: unusablePasswordHash() });
    return { path: `/users/${invited.id}/invitations`, status: 201 };
  },
  'GET /auth/me': async () => ({ path: '/auth/me', status: 200 }),
  'POST /auth/logout': async () => ({ path: '/auth/logout', status: 204 }),
  'GET /users': async () => ({ path: '/users', status: 200 }),
  'POST /users': async () => ({
    path: '/users',
    body: { email: `invitee-${++seq}@example.test`, displayName: 'New Person', role: 'author' },
    status: 201,
  }),
  'GET /users/directory': async () => ({ path: '/users/directory', status: 200 }),
  'PATCH /users/:id': async () => ({
    path: `/users/${(await insertUser(t, 'author')).id}`,
    body: { displayName: 'Renamed Person' },
    status: 200,
  }),
  'GET /studies': async () => ({ path: '/studies', status: 200 }),
  'POST /studies': async () => ({ path: '/studies', body: { title: 'A new study' }, status: 201 }),
  'GET /studies/:id': async (actor) => ({ path: `/studies/${await studyFor(actor)}`, status: 200 }),
  'PATCH /studies/:id': async (actor) => ({
    path: `/studies/${await studyFor(actor)}`,
    body: { title: 'Renamed study' },
    status: 200,
  }),
  'DELETE /studies/:id': async (actor) => ({
    path: `/studies/${await studyFor(actor)}`,
    status: 204,
  }),
  'POST /studies/:id/members': async (actor) => ({
    path: `/studies/${await studyFor(actor)}/members`,
    body: { userId: (await insertUser(t, 'reviewer')).id },
    status: 201,
  }),
  'DELETE /studies/:id/members/:userId': async (actor) => {
    const member = await insertUser(t, 'reviewer');
    return {
      path: `/studies/${await studyFor(actor, [member])}/members/${member.id}`,
      status: 200,
    };
  },
  ...featureMatrix(
    () => t,
    () => actors.admin,
    (actor) => studyFor(actor),
  ),
  ...datasetMatrix(
    () => t,
    () => actors.admin,
  ),
};

const ALL = ROLES;
const ADMIN: Role[] = ['admin'];
const EDITORS: Role[] = ['author', 'steward', 'admin'];

/** The access policy as the contract states it, written independently of the route table. */
const EXPECTED_ACCESS: Record<string, 'public' | readonly Role[]> = {
  'GET /health': 'public',
  'POST /auth/login': 'public',
  'POST /auth/password-reset': 'public',
  'POST /users/:id/invitations': ADMIN,
  'GET /auth/me': ALL,
  'POST /auth/logout': ALL,
  'GET /users': ADMIN,
  'POST /users': ADMIN,
  'GET /users/directory': ALL,
  'PATCH /users/:id': ADMIN,
  'GET /studies': ALL,
  'POST /studies': EDITORS,
  'GET /studies/:id': ALL,
  'PATCH /studies/:id': EDITORS,
  'DELETE /studies/:id': EDITORS,
  'POST /studies/:id/members': EDITORS,
  'DELETE /studies/:id/members/:userId': EDITORS,
  ...featureAccess(ALL, EDITORS),
  ...datasetAccess(ALL, EDITORS),
};

/** Fills path parameters with well-formed ids for calls that must be refused before lookup. */
function placeholderPath(path: string): string {
  return path.replace(/:[A-Za-z]+/g, '00000000-0000-4000-8000-000000000000');
}

function send(
  route: Pick<RouteSpec, 'method'>,
  path: string,
  token?: string,
  body?: unknown,
  file?: MatrixCall['file'],
) {
  let req = request(t.app)[route.method](`/api${path}`);
  if (token) req = req.set('Authorization', `Bearer ${token}`);
  if (file) return req.attach('file', file.bytes, file.filename);
  return body === undefined ? req : req.send(body as object);
}

beforeAll(async () => {
  t = await createTestApp();
  await t.services.pools.warm(); // timed answers: the threads load before the clock runs
  for (const role of ROLES) actors[role] = await insertUser(t, role);
  outsider = await insertUser(t, 'author');
});
afterAll(() => t.close());

const table = (): Array<Pick<RouteSpec, 'method' | 'path' | 'access'>> => t.app.locals.routeTable;

describe('route x role matrix', () => {
  it('has exactly one entry per route in the router table', () => {
    const keys = table().map(routeKey).sort();
    expect(keys.length).toBeGreaterThan(10);
    expect(Object.keys(MATRIX).sort()).toEqual(keys);
    expect(Object.keys(EXPECTED_ACCESS).sort()).toEqual(keys);
  });

  it('grants each route to the roles the contract names', () => {
    for (const route of table()) {
      const expected = EXPECTED_ACCESS[routeKey(route)];
      const actual = route.access === 'public' ? 'public' : [...route.access].sort();
      const want = expected === 'public' ? 'public' : [...expected].sort();
      expect(actual, routeKey(route)).toEqual(want);
    }
  });

  it('answers every route as the table says, for no token and for each role', async () => {
    const seen: string[] = [];
    for (const route of table()) {
      const key = routeKey(route);
      const fixture = MATRIX[key];
      expect(fixture, `matrix entry for ${key}`).toBeDefined();
      if (route.access === 'public') {
        const call = await fixture(actors.author);
        const res = await send(route, call.path, undefined, call.body);
        expect(res.status, `${key} without a token`).toBe(call.status);
        seen.push(`${key} public ${res.status}`);
        continue;
      }
      const anonymous = await send(route, placeholderPath(route.path));
      expect(anonymous.status, `${key} without a token`).toBe(401);
      expect(anonymous.body.error.code).toBe('unauthenticated');
      for (const role of ROLES) {
        const token = await tokenFor(t, actors[role]);
        if (!route.access.includes(role)) {
          const res = await send(route, placeholderPath(route.path), token, {});
          expect(res.status, `${key} as ${role}`).toBe(403);
          expect(res.body.error.code).toBe('forbidden');
          seen.push(`${key} ${role} 403`);
        } else {
          const call = await fixture(actors[role]);
          const res = await send(route, call.path, token, call.body, call.file);
          expect(res.status, `${key} as ${role}: ${JSON.stringify(res.body)}`).toBe(call.status);
          seen.push(`${key} ${role} ${res.status}`);
        }
      }
    }
    // Every protected route was tried once per role.
    const protectedRoutes = table().filter((route) => route.access !== 'public').length;
    expect(seen.length).toBe(protectedRoutes * ROLES.length + (table().length - protectedRoutes));
  }, 120_000);
});
