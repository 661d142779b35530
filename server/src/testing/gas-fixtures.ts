import request from 'supertest';
import { Run } from '../db/entities/index.js';
import type { TestApp } from './test-app.js';

/** The harmonic trap: Z_L = q^(L/2)/(1-q^L), with its grand check (a fast spec). */
export const TRAP_SPEC = {
  format: 'traceloom.gas/1',
  title: 'harmonic trap',
  statistics: 'fermion',
  variable: 'q',
  step: '1/2',
  order: '20',
  nMax: 5,
  classTable: 4,
  weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
  grand: { kind: 'expression', expression: 'qpoch(-kappa*q^(1/2), q, inf)' },
} as const;

/** A spec the engine needs minutes for (measured: over 2 minutes on this machine). */
export const RUNAWAY_SPEC = {
  format: 'traceloom.gas/1',
  title: 'runaway',
  statistics: 'fermion',
  variable: 'q',
  step: '1',
  order: '3000',
  nMax: 200,
  weights: { kind: 'formula', expression: 'q^L/(1-q^L)' },
} as const;

/** `Authorization` header value. */
export const bearer = (token: string) => `Bearer ${token}`;

/** Creates a gas through the API and returns its id. */
export async function createGas(
  t: TestApp,
  token: string,
  studyId: string,
  spec: object = TRAP_SPEC,
): Promise<string> {
  const res = await request(t.app)
    .post(`/api/studies/${studyId}/gases`)
    .set('Authorization', bearer(token))
    .send({ spec });
  if (res.status !== 201)
    throw new Error(`gas creation answered ${res.status}: ${JSON.stringify(res.body)}`);
  return res.body.id as string;
}

/** Starts a run through the API and returns its id. */
export async function startRun(t: TestApp, token: string, gasId: string): Promise<string> {
  const res = await request(t.app)
    .post(`/api/gases/${gasId}/runs`)
    .set('Authorization', bearer(token))
    .send({});
  if (res.status !== 202)
    throw new Error(`run start answered ${res.status}: ${JSON.stringify(res.body)}`);
  return res.body.id as string;
}

/** Polls the database until the run reaches one of `statuses` (or throws after `timeoutMs`). */
export async function waitForRun(
  t: TestApp,
  runId: string,
  statuses: readonly string[] = ['done', 'failed', 'cancelled'],
  timeoutMs = 30_000,
): Promise<Run> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const run = await t.dataSource.getRepository(Run).findOneByOrFail({ id: runId });
    if (statuses.includes(run.status)) return run;
    if (Date.now() > until)
      throw new Error(`run ${runId} still ${run.status} after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 20));
  }
}

/** A finished run of the trap, ready for comparisons. */
export async function finishedRun(t: TestApp, token: string, studyId: string): Promise<string> {
  const runId = await startRun(t, token, await createGas(t, token, studyId));
  const run = await waitForRun(t, runId);
  if (run.status !== 'done') throw new Error(`run ended ${run.status}: ${run.error}`);
  return runId;
}
