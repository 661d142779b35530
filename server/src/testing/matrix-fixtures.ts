import type { Role } from '@traceloom/shared/api';
import { GasVersion, Run, type User } from '../db/entities/index.js';
import { createGas, finishedRun, TRAP_SPEC } from './gas-fixtures.js';
import { tokenFor, type TestApp } from './test-app.js';

/** What an allowed caller sends: JSON `body` or a multipart `file`, and the status expected. */
export interface MatrixCall {
  path: string;
  body?: unknown;
  file?: { bytes: Buffer; filename: string };
  status: number;
}

/** A CSV reference table any role may upload. */
export const REFERENCE_CSV = Buffer.from(
  'N,value,note\n0,1,\n1,"q^(1/2) + q^(3/2) + O(q^3)",first\n',
);

/** Access of the gas, compute, run, reference and comparison routes, as the contract states it. */
export function featureAccess(
  all: readonly Role[],
  editors: readonly Role[],
): Record<string, readonly Role[]> {
  return {
    'GET /studies/:id/gases': all,
    'POST /studies/:id/gases': editors,
    'GET /gases/:id': all,
    'GET /gases/:id/versions/:version': all,
    'PUT /gases/:id': editors,
    'DELETE /gases/:id': editors,
    'POST /compute': all,
    'POST /compute/estimate': all,
    'POST /gases/:id/runs': editors,
    'GET /gases/:id/runs': all,
    'GET /runs/:id': all,
    'GET /runs/:id/events': all,
    'POST /runs/:id/cancel': editors,
    'POST /studies/:id/references': all,
    'GET /studies/:id/references': all,
    'GET /references/:id': all,
    'PATCH /references/:id': all,
    'DELETE /references/:id': all,
    'GET /references/:id/comparisons': all,
    'POST /runs/:id/comparisons': all,
    'GET /runs/:id/comparisons': all,
    'GET /runs/:id/product-form': all,
  };
}

/**
 * Matrix fixtures for those routes. `studyFor(actor)` gives a study the actor may use; gases
 * and runs in it are made by `admin` (who may act in every study) so the reviewer's study gets
 * them too.
 */
export function featureMatrix(
  app: () => TestApp,
  admin: () => User,
  studyFor: (actor: User) => Promise<string>,
): Record<string, (actor: User) => Promise<MatrixCall>> {
  const adminToken = async () => tokenFor(app(), admin());
  const gasFor = async (actor: User) => createGas(app(), await adminToken(), await studyFor(actor));
  const runs = new Map<string, string>();
  const runFor = async (actor: User) => {
    let id = runs.get(actor.id);
    if (!id) {
      id = await finishedRun(app(), await adminToken(), await studyFor(actor));
      runs.set(actor.id, id);
    }
    return id;
  };
  const studyOfRun = async (runId: string) => {
    const run = await app()
      .dataSource.getRepository(Run)
      .findOneOrFail({
        where: { id: runId },
        relations: { gas: { study: true } },
      });
    return run.gas.study.id;
  };
  /** A table in the actor's study, uploaded by admin, or by the actor with `own`. */
  const referenceFor = async (actor: User, own = false) => {
    const { default: request } = await import('supertest');
    const res = await request(app().app)
      .post(`/api/studies/${await studyOfRun(await runFor(actor))}/references`)
      .set('Authorization', `Bearer ${own ? await tokenFor(app(), actor) : await adminToken()}`)
      .attach('file', REFERENCE_CSV, 'table.csv');
    if (res.status !== 201)
      throw new Error(`upload answered ${res.status}: ${JSON.stringify(res.body)}`);
    return res.body.id as string;
  };
  /** A queued run stored directly (not handed to the executor), so cancelling it is instant. */
  const queuedRunFor = async (actor: User) => {
    const gasId = await gasFor(actor);
    const version = await app()
      .dataSource.getRepository(GasVersion)
      .findOneByOrFail({ gas: { id: gasId } });
    const run = await app()
      .dataSource.getRepository(Run)
      .save({
        gas: { id: gasId },
        gasVersion: { id: version.id },
        status: 'queued',
        createdBy: { id: admin().id },
        createdAt: new Date().toISOString(),
      });
    return run.id;
  };
  return {
    'GET /studies/:id/gases': async (actor) => ({
      path: `/studies/${await studyFor(actor)}/gases`,
      status: 200,
    }),
    'POST /studies/:id/gases': async (actor) => ({
      path: `/studies/${await studyFor(actor)}/gases`,
      body: { spec: TRAP_SPEC },
      status: 201,
    }),
    'GET /gases/:id': async (actor) => ({ path: `/gases/${await gasFor(actor)}`, status: 200 }),
    'GET /gases/:id/versions/:version': async (actor) => ({
      path: `/gases/${await gasFor(actor)}/versions/1`,
      status: 200,
    }),
    'PUT /gases/:id': async (actor) => ({
      path: `/gases/${await gasFor(actor)}`,
      body: { spec: { ...TRAP_SPEC, nMax: 4 } },
      status: 200,
    }),
    'DELETE /gases/:id': async (actor) => ({ path: `/gases/${await gasFor(actor)}`, status: 204 }),
    'POST /compute': async () => ({ path: '/compute', body: { spec: TRAP_SPEC }, status: 200 }),
    'POST /compute/estimate': async () => ({
      path: '/compute/estimate',
      body: { spec: TRAP_SPEC },
      status: 200,
    }),
    'POST /gases/:id/runs': async (actor) => ({
      path: `/gases/${await gasFor(actor)}/runs`,
      body: {},
      status: 202,
    }),
    'GET /gases/:id/runs': async (actor) => ({
      path: `/gases/${await gasFor(actor)}/runs`,
      status: 200,
    }),
    'GET /runs/:id': async (actor) => ({ path: `/runs/${await runFor(actor)}`, status: 200 }),
    'GET /runs/:id/events': async (actor) => ({
      path: `/runs/${await runFor(actor)}/events`,
      status: 200,
    }),
    'POST /runs/:id/cancel': async (actor) => ({
      path: `/runs/${await queuedRunFor(actor)}/cancel`,
      status: 200,
    }),
    'POST /studies/:id/references': async (actor) => ({
      path: `/studies/${await studyFor(actor)}/references`,
      file: { bytes: REFERENCE_CSV, filename: 'table.csv' },
      status: 201,
    }),
    'GET /studies/:id/references': async (actor) => ({
      path: `/studies/${await studyFor(actor)}/references`,
      status: 200,
    }),
    'GET /references/:id': async (actor) => ({
      path: `/references/${await referenceFor(actor)}`,
      status: 200,
    }),
    'PATCH /references/:id': async (actor) => ({
      path: `/references/${await referenceFor(actor, true)}`,
      body: { title: 'Renamed table', normalization: 'q^(N/2)' },
      status: 200,
    }),
    'DELETE /references/:id': async (actor) => ({
      path: `/references/${await referenceFor(actor, true)}`,
      status: 204,
    }),
    'GET /references/:id/comparisons': async (actor) => ({
      path: `/references/${await referenceFor(actor)}/comparisons`,
      status: 200,
    }),
    'POST /runs/:id/comparisons': async (actor) => {
      const runId = await runFor(actor);
      return {
        path: `/runs/${runId}/comparisons`,
        body: { referenceId: await referenceFor(actor) },
        status: 201,
      };
    },
    'GET /runs/:id/comparisons': async (actor) => ({
      path: `/runs/${await runFor(actor)}/comparisons`,
      status: 200,
    }),
    'GET /runs/:id/product-form': async (actor) => ({
      path: `/runs/${await runFor(actor)}/product-form?of=row&N=2`,
      status: 200,
    }),
  };
}
