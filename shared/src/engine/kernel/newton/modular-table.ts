/**
 * The multi-modular route of the Newton recursion: Z(N) modulo word primes with number-theoretic
 * transforms (residue-run.ts), Garner digits prime by prime (digits.ts), stopped by the rules in
 * certificate.ts, rebuilt and reduced in assemble.ts.
 */
import { factorial } from '../../integers.js';
import { bigResidue } from '../modular/residues.js';
import { transformPrimes, type TransformPrime } from '../modular/word.js';
import { assembleTable } from './assemble.js';
import { certificateBasis, residualCertified } from './certificate.js';
import type { DigitTable } from './digits.js';
import { addPrimeDigits } from './digits.js';
import { residueRun, valuationBounds } from './residue-run.js';
import { isIntegral, transformSize } from './route.js';
import type { NewtonTableInput, NewtonTableResult } from './types.js';

/** Word primes stay below 2^24: see ACCUMULATE in residue-run.ts. */
const PRIME_LIMIT = 2 ** 24;
const MIN_TRANSFORM_BITS = 15;

/** Per N, how many leading coefficients are wanted (input.validLengths, capped by length). */
function validLengths(input: NewtonTableInput): number[] {
  const out = [input.length];
  for (let N = 1; N <= input.nMax; N++) {
    out.push(Math.min(input.length, input.validLengths?.[N] ?? input.length));
  }
  return out;
}

/** d_N = 1 for integral weights, N! D^N otherwise (Y_N = d_N Z(N) is then an integer). */
function scaleFactors(input: NewtonTableInput, integral: boolean): bigint[] {
  const out: bigint[] = [1n];
  for (let N = 1; N <= input.nMax; N++)
    out.push(integral ? 1n : factorial(N) * input.den ** BigInt(N));
  return out;
}

/** Primes of the transform family usable here: not dividing the denominator, above nMax. */
function primeSupply(input: NewtonTableInput, k: number, estimate: number) {
  let pool = transformPrimes(estimate, k, PRIME_LIMIT);
  let next = 0;
  return (): TransformPrime => {
    for (;;) {
      if (next >= pool.length) pool = transformPrimes(pool.length + 8, k, PRIME_LIMIT);
      const prime = pool[next++]!;
      if (input.den % BigInt(prime.p) !== 0n && prime.p > input.nMax) return prime;
    }
  };
}

/**
 * The multi-modular route (chooseNewtonRoute picks it when it applies). `integral` may pass a
 * certificate computed elsewhere (true only when Z(N) is known to be integral).
 */
export function newtonTableModular(
  input: NewtonTableInput,
  integral = isIntegral(input),
): NewtonTableResult {
  const { nMax, length } = input;
  const basis = certificateBasis(input, integral);
  const size = transformSize(length);
  const k = Math.max(MIN_TRANSFORM_BITS, Math.log2(size));
  const valuation = valuationBounds(input);
  const table: DigitTable = {
    primes: [],
    digits: [],
    valuation,
    upto: validLengths(input),
    nMax,
    length,
  };
  const estimate = Math.ceil(basis.aprioriBits / 23.9) + 1;
  const nextPrime = primeSupply(input, k, estimate + 4);
  let done = 0;
  const tick = (): void => input.onProgress?.(++done, (estimate + 1) * nMax);
  const scale = scaleFactors(input, integral);
  let log2Modulus = 0;
  for (;;) {
    const prime = nextPrime();
    const scales = scale.map((s) => bigResidue(s, prime.p));
    const res = residueRun(input, prime, size, valuation, (N) => scales[N]!, tick);
    addPrimeDigits(table, prime, res);
    log2Modulus += Math.log2(prime.p);
    if (log2Modulus >= basis.aprioriBits) break;
    if (residualCertified(table, basis, log2Modulus)) break;
  }
  return assembleTable(table, scale, integral);
}
