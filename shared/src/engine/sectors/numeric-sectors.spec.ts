import { describe, expect, it } from 'vitest';
import { compute } from '../compute.js';
import { EngineError } from '../errors.js';
import { parseGasSpec } from '../spec/schema.js';
import {
  NumericSectorWalk,
  numericSectorContext,
  numericSectorPart,
  type NumericSectorPart,
} from './numeric-part.js';
import { assembleNumericSectors } from './numeric-sectors.js';

const gas = (sectors: object, expression = 'q^(abs(p) + abs(n))') => ({
  format: 'traceloom.gas/1',
  statistics: 'fermion',
  precision: 20,
  at: { q: '1/10' },
  nMax: 4,
  classTable: 2,
  weights: { kind: 'spectrum', expression },
  sectors,
});

describe('sector sums in numeric mode', () => {
  it('sum_n (-1)^n Z_n(N) at q = 1/10 matches an independent mpmath computation', () => {
    // python3 + mpmath (mp.dps = 40): e_N of {x^|p|}, |p| <= 60, times (1 - x^N)/(1 + x^N), x = 1/10
    const want = [
      '1.00000000000000000000000000000',
      '0.232123212321232123212321232123',
      '0.0148123481456814790148123481457',
      '0.000253113461545704741138284203731',
    ];
    const r = compute(gas({ index: ['n'], from: [null], to: [null], weight: '(-1)^n' }));
    for (let N = 1; N <= 4; N++) {
      const v = r.canonical[N]!.value as { real: string; error: string };
      const diff = Math.abs(Number(v.real) - Number(want[N - 1]));
      expect(diff).toBeLessThanOrEqual(Number(v.real) * 1e-15);
      // every shown digit agrees with the reference (the shown text is a prefix of it, rounded)
      const shown = v.real.replace(/e.*$/, '').replace(/[-.]/g, '').replace(/^0+/, '');
      const ref = want[N - 1]!.replace(/[-.]/g, '').replace(/^0+/, '');
      expect(shown.slice(0, -1)).toBe(ref.slice(0, shown.length - 1));
      expect(r.canonical[N]!.agrees).toBe(true);
    }
    expect(r.canonical[0]!.value).toEqual({ real: '1.0000000000000000000', error: '0' });
    expect(r.sectors!.truncated).toBe(true);
    expect(r.sectors!.rows[0]!.magnitudes).toHaveLength(4);
    expect(r.methods.classSum?.agrees).toBe(true);
  });

  it('refuses a numeric sector sum whose contributions stop falling, naming sectors', () => {
    let e: unknown;
    try {
      compute(gas({ index: ['n'], from: [null], to: [null] }, 'q^abs(p)'));
    } catch (x) {
      e = x;
    }
    expect(e).toBeInstanceOf(EngineError);
    expect((e as EngineError).field).toBe('sectors');
    expect((e as EngineError).message).toMatch(/does not converge/);
  });

  it('sectors computed apart and posted as plain data sum to the same result (the pool path)', () => {
    // the server computes each shell's parts on worker threads (structured clone drops the Real
    // class) and sums them in one last task: the answer must be the one-thread answer exactly
    const input = gas({ index: ['n'], from: [-3], to: [3], weight: '(-1)^n' });
    const whole = compute(input);
    const spec = parseGasSpec(input);
    const ctx = numericSectorContext(spec);
    const walk = new NumericSectorWalk(spec);
    const parts: NumericSectorPart[] = [];
    for (let list = walk.next(); list !== null; list = walk.next()) {
      const shell = structuredClone(list.map((n) => numericSectorPart(ctx, n)));
      walk.accept(shell.map((p) => p.terms));
      parts.push(...shell);
    }
    const summed = assembleNumericSectors(spec, walk, parts, {}, 0, () => 0);
    expect(summed.canonical).toEqual(whole.canonical);
    expect(summed.classes).toEqual(whole.classes);
    expect(summed.sectors!.count).toBe(7);
    expect(summed.sectors!.rows).toEqual(whole.sectors!.rows);
  });
});
