import { describe, expect, it } from 'vitest';
import { parseDecimal } from '../decimal.js';
import { compileNumeric } from '../expr/compile.js';
import { compileFast } from '../expr/compile-dd.js';
import { sub, toNumber } from '../real.js';
import { kernelTraces } from './index.js';

const SLOW = { timeout: 60_000 };
const P = 300;

/**
 * Z(1..10) of the line kernel (fermions) computed independently with python3 + mpmath at 30
 * digits by `line-kernel-mpmath.py 150 180` (beside this file: trapezoid after x = 6 sinh t on
 * |x| <= 100, even and odd blocks, mpmath.eigsy): the two resolutions agree to 1.6e-18 relative
 * at Z(10) and better below; Z(1..4) match their closed forms (SOURCES.md) to 2e-21. The values
 * are the finer resolution's as printed; beyond the 18th significant digit they are not certain.
 */
const MPMATH_LINE_Z = [
  '0.250000000000000000',
  '0.0198943678864869169711',
  '7.04224085134812271666e-4',
  '1.29021840072047992566e-5',
  '1.33910736473507884818e-7',
  '8.37250100971817457741e-10',
  '3.29923114115797414457e-12',
  '8.48581567638961425504e-15',
  '1.46527183187284566880e-17',
  '1.73853123446691425557e-20',
];

describe('kernelTraces: the line kernel against an independent mpmath computation', () => {
  const LINE = '1/(2*pi) / sqrt(2*cosh(x/2)) / (2*cosh((x-y)/2)) / sqrt(2*cosh(y/2))';
  it.each([15, 18])(
    'Z(1..10) at %i digits lie within their errors of the mpmath values, errors below the digits',
    (digits) => {
      const r = kernelTraces(
        (bits) => compileNumeric(LINE, { names: ['x', 'y'], prec: bits, field: 'w' }),
        { from: null, to: null, periodic: false },
        { digits, nMax: 10, fermion: true, fast: compileFast(LINE, ['x', 'y']) },
      );
      for (let N = 1; N <= 10; N++) {
        const ref = parseDecimal(MPMATH_LINE_Z[N - 1]!, P);
        const size = Math.abs(toNumber(ref));
        const e = r.fredholm[N]!;
        // the reference carries 18 digits: its own rounding is part of the comparison
        const diff = Math.abs(toNumber(sub(e.value, ref, P)));
        expect(diff).toBeLessThanOrEqual(e.error + 1e-18 * size);
        expect(e.error).toBeLessThanOrEqual(0.5 * 10 ** -digits * size);
        expect(e.error).toBeGreaterThan(0);
      }
    },
    SLOW.timeout,
  );
});
