import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { User } from '../db/entities/index.js';
import { api, finishedRunOf } from '../testing/dataset-fixtures.js';
import { TRAP_SPEC } from '../testing/gas-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';

let t: TestApp;
let author: User;
let stranger: User;
let runId: string;

beforeAll(async () => {
  t = await createTestApp();
  author = await insertUser(t, 'author');
  stranger = await insertUser(t, 'author');
  const studyId = await insertStudy(t, author);
  runId = await finishedRunOf(t, await tokenFor(t, author), studyId, TRAP_SPEC);
});
afterAll(() => t.close());

const ask = (query: string, status: number, who: User = author) =>
  api(t, who, 'get', `/runs/${runId}/product-form?${query}`, undefined, status);

describe('GET /runs/:id/product-form', () => {
  // The trap of TRAP_SPEC: Z(N) = q^(N^2/2)/(q;q)_N, Z_L = q^(L/2)/(1 - q^L) and
  // Xi = (-kappa q^(1/2); q)_inf (Andrews, Theory of Partitions, Cor. 2.2).
  it('a canonical row: leading term divided out, exact exponents and their pattern', async () => {
    const body = await ask('of=row&N=2', 200);
    expect(body).toMatchObject({ runId, target: 'row', N: 2, of: 'Z(2)', leadingExponent: '2' });
    expect(body.leadingCoefficient).toBe('1');
    expect(body.product.exponents.slice(0, 4)).toEqual([
      { n: '1', a: '1' },
      { n: '2', a: '1' },
      { n: '3', a: '0' },
      { n: '4', a: '0' },
    ]);
    expect(body.product.pattern).toBe('a_n = 0 for n > 2');
    expect(body.product.determinedBelow).toBe('18');
  });

  it('a cycle weight', async () => {
    const body = await ask('of=weight&L=1', 200);
    expect(body).toMatchObject({ target: 'weight', L: 1, of: 'Z_1', leadingExponent: '1/2' });
    expect(body.product.pattern).toBe('a_n = 0 for n > 1');
  });

  it('the grand function: c_1 = q^(1/2)/(1-q), c_2 = -q/(1-q^2), the rest vanish', async () => {
    const body = await ask('of=grand', 200);
    expect(body.target).toBe('grand');
    expect(body.factors).toHaveLength(5);
    expect(body.factors[0].value.terms.slice(0, 3)).toEqual([
      ['1/2', '1'],
      ['3/2', '1'],
      ['5/2', '1'],
    ]);
    expect(body.factors[1].value.terms.slice(0, 3)).toEqual([
      ['1', '-1'],
      ['3', '-1'],
      ['5', '-1'],
    ]);
    expect(body.pattern).toBe('c_N = 0 for N > 2');
  });

  it('refuses bad queries naming the field', async () => {
    expect((await ask('of=row&N=9', 400)).error).toMatchObject({
      field: 'N',
      message: 'N: 9 is not in this run (it holds N = 0..5).',
    });
    expect((await ask('of=weight&L=0', 400)).error.field).toBe('L');
    expect((await ask('of=row', 400)).error.field).toBe('N');
    expect((await ask('of=row&N=x', 400)).error.message).toBe('N: must be a whole number N.');
    expect((await ask('of=limit', 400)).error.field).toBe('of');
    expect((await ask('', 400)).error.field).toBe('of');
  });

  it('is a 404 for a run the caller cannot see', async () => {
    expect((await ask('of=grand', 404, stranger)).error.code).toBe('not_found');
  });
});
