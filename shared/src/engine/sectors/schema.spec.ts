import { describe, expect, it } from 'vitest';
import { EngineError } from '../errors.js';
import { parseGasSpec } from '../spec/schema.js';

const base = {
  format: 'traceloom.gas/1',
  statistics: 'fermion',
  order: '10',
  nMax: 3,
  weights: { kind: 'formula', expression: 'q^(L*(abs(n)+1))' },
};

/** The field and message a spec with these sectors is refused with (or null when accepted). */
function refusal(sectors: unknown, extra: object = {}): [string | undefined, string] | null {
  try {
    parseGasSpec({ ...base, ...extra, sectors });
    return null;
  } catch (e) {
    if (!(e instanceof EngineError)) throw e;
    return [e.field, e.message];
  }
}

describe('sectors field of the gas spec', () => {
  it('accepts one unbounded index and fills in the weight 1', () => {
    const spec = parseGasSpec({ ...base, sectors: { index: ['n'], from: [null], to: [null] } });
    expect(spec.sectors).toEqual({ index: ['n'], from: [null], to: [null], weight: '1' });
  });

  it.each([
    [{ index: ['q'], from: [null], to: [null] }, 'sectors.index.0', /series variable/],
    [{ index: ['L'], from: [null], to: [null] }, 'sectors.index.0', /already has a meaning/],
    [{ index: ['p'], from: [null], to: [null] }, 'sectors.index.0', /already has a meaning/],
    [{ index: ['kappa'], from: [null], to: [null] }, 'sectors.index.0', /already has a meaning/],
    [{ index: ['n', 'n'], from: [0, 0], to: [1, 1] }, 'sectors.index.1', /twice/],
    [{ index: ['n', 'm'], from: [null], to: [null, 2] }, 'sectors.from', /2 entries/],
    [{ index: ['n'], from: [3], to: ['1'] }, 'sectors.to.0', /below from/],
    [{ index: ['n'], from: [1.5], to: [3] }, 'sectors.from.0', /integer/],
    [{ index: ['a', 'b', 'c', 'd'], from: [0, 0, 0, 0], to: [1, 1, 1, 1] }, 'sectors.index', /3/],
    [{ index: [], from: [], to: [] }, 'sectors.index', /at least one/],
    [{ index: ['n'], from: [null], to: [null], weight: '' }, 'sectors.weight', /empty/],
  ])('refuses %j naming %s', (sectors, field, message) => {
    const r = refusal(sectors);
    expect(r?.[0]).toBe(field);
    expect(r?.[1]).toMatch(message);
  });

  it('refuses an index named like the variable of the gas', () => {
    expect(refusal({ index: ['t'], from: [0], to: [2] }, { variable: 't' })?.[0]).toBe(
      'sectors.index.0',
    );
  });

  it('refuses sectors on a kernel gas', () => {
    const kernel = { kind: 'kernel', expression: 'exp(-(x-y)^2)', from: null, to: null };
    expect(
      refusal({ index: ['n'], from: [0], to: [2] }, { weights: kernel, precision: 10 })?.[0],
    ).toBe('sectors');
  });
});
