/**
 * The one place where coefficient arrays are multiplied: everything in the engine that multiplies
 * series goes through `mulTrunc` (first n coefficients of the product of two integer arrays),
 * provided by the numeric kernels.
 */
export {
  findRationalFactor,
  mulTrunc,
  mulTruncRational,
  mulTruncStrided,
  rationalCost,
  type RationalFactor,
} from '../kernel/index.js';
