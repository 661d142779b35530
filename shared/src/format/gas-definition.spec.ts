import { describe, expect, it } from 'vitest';
import { parseGasSpec } from '../engine/spec/schema.js';
import { gasDefinition } from './gas-definition.js';

const base = {
  format: 'traceloom.gas/1',
  title: 't',
  statistics: 'fermion',
  variable: 'q',
  nMax: 5,
  classTable: 3,
};

describe('gasDefinition', () => {
  it.each([
    [
      { weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' }, step: '1/2', order: '20' },
      [
        'Particles: fermions',
        'Cycle weights: Z_L = q^(L/2)/(1-q^L)',
        'Exponent step: 1/2',
        'Order: O(q^20)',
        'Class-table depth: N ≤ 3',
      ],
    ],
    [
      { weights: { kind: 'values', values: ['q', '2*q^2'] }, nMax: 2, classTable: 0, order: '10' },
      [
        'Cycle weights: Z_1 = q; Z_2 = 2*q^2',
        'N_max: 2',
        'Order: O(q^10)',
        'Class-table depth: no class table',
      ],
    ],
    [
      {
        weights: { kind: 'spectrum', expression: 'q^(p^2)', offset: '1/2', from: null, to: null },
        order: '30',
        grand: { kind: 'expression', expression: 'qpoch(-kappa, q, inf)' },
      },
      [
        'Spectrum: c_p = q^(p^2) over p = 1/2 + n, n from −∞ to ∞',
        'Grand function: qpoch(-kappa, q, inf)',
      ],
    ],
  ])('%j reads as labelled lines', (over, expected) => {
    const spec = parseGasSpec({ ...base, ...over });
    const text = gasDefinition(spec).map((l) => `${l.label}: ${l.value}`);
    for (const line of expected) expect(text).toContain(line);
  });
});
