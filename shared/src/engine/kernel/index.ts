/**
 * The exact kernels of the engine on plain integer arrays (see README.md for which route runs
 * when): the Newton recursion for canonical tables (newton/), word-prime arithmetic and
 * transforms (modular/), truncated products (multiply/) and streaming cycle-type walks for class
 * sums (classes/). The rational and series bookkeeping stays in the engine's general layer.
 */
export { mulTrunc, mulTruncStrided } from './multiply/mul-trunc.js';
export {
  findRationalFactor,
  mulTruncRational,
  rationalCost,
  type RationalFactor,
} from './multiply/rational-factor.js';
export { newtonTable } from './newton/table.js';
export { logAbs } from './newton/coefficient-bound.js';
export { chooseNewtonRoute, type NewtonRoute } from './newton/route.js';
export type { NewtonTableInput, NewtonTableResult } from './newton/types.js';
export { foldCycleTypes, exponentNotation, type CycleTypeVisit } from './classes/cycle-types.js';
export { classSumRational, type ClassSumInput, type RationalParts } from './classes/class-sum.js';
