/**
 * The one place where the Newton recursion picks its route (see ../README.md for the table):
 *  1. series arithmetic when the weights do not fit the kernel's shape (no packed input);
 *  2. grid compression when every Z_L is t^(cL) times a series in t^g (g >= 2);
 *  3. multi-modular (word primes, transforms) when the grid fits a transform, else BigInt;
 *  4. on the multi-modular route, the integrality certificate (integer Z(N) skip N! D^N).
 */
import { compressInput, findCompression } from './grid-compression.js';
import { newtonIsIntegral } from './integrality.js';
import type { NewtonTableInput } from './types.js';

/** Transforms above 2^19 points cost more than the BigInt route (measured on the bench tasks). */
export const MAX_TRANSFORM_BITS = 19;

/** The route the canonical table takes, with the reasons, decided once before any work. */
export type NewtonRoute =
  | { readonly kind: 'series'; readonly reason: string }
  | {
      readonly kind: 'modular' | 'bigint';
      /** the input the chosen kernel runs on (the compressed one when compression applies) */
      readonly grid: NewtonTableInput;
      /** Z(N)[cN + gk] = V_N[k] when compressed */
      readonly compression: { readonly g: number; readonly c: number } | null;
      /** modular route only: the weights are certified to give integer Z(N) */
      readonly integral: boolean;
      readonly reason: string;
    };

/** Smallest power of two holding a product of two arrays of `length` coefficients. */
export function transformSize(length: number): number {
  let t = 1;
  while (t < 2 * length - 1) t *= 2;
  return t;
}

/** True when integer weights (den 1) are certified to give integer Z(N) (integrality.ts). */
export function isIntegral(input: NewtonTableInput): boolean {
  return input.den === 1n && newtonIsIntegral(input.weights, input.nMax, input.sign, input.length);
}

/**
 * Decides the route for packed weights (null: the weights have negative exponents, no common
 * grid or an unbounded table, so only series arithmetic applies).
 */
export function chooseNewtonRoute(input: NewtonTableInput | null): NewtonRoute {
  if (input === null || input.length <= 0)
    return { kind: 'series', reason: 'weights not on one grid from exponent 0' };
  if (input.den <= 0n) throw new RangeError('den must be positive');
  const compression = findCompression(input);
  const grid = compression ? compressInput(input, compression.g, compression.c) : input;
  const squeeze = compression ? `, grid compressed by ${compression.g}` : '';
  const { nMax, length } = grid;
  const fits = length >= 8 && nMax >= 2 && nMax < 2 ** 20;
  if (!fits || Math.log2(transformSize(length)) > MAX_TRANSFORM_BITS) {
    const why = fits ? 'grid too long for a word-prime transform' : 'table too small to pay';
    return { kind: 'bigint', grid, compression, integral: false, reason: why + squeeze };
  }
  // compressed weights are cut at different lengths, so certify integrality on the originals
  const integral = isIntegral(input);
  const scale = integral ? 'integral weights' : 'N! D^N scaling';
  return { kind: 'modular', grid, compression, integral, reason: `${scale}${squeeze}` };
}
