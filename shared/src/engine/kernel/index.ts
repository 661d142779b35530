/**
 * Fast numeric kernels of the engine: truncated products of integer coefficient arrays, the
 * multi-modular Newton recursion for canonical tables, and streaming cycle-type enumeration for
 * class sums. Pure TypeScript on plain integer arrays; the rational and series bookkeeping stays
 * in the engine's general layer.
 */
export { mulTrunc, mulSchoolbook, mulKronecker, mulSparse } from './mul-trunc.js';
export { newtonTable, newtonTableModular } from './newton-table.js';
export { newtonTableBig } from './newton-big.js';
export { newtonIsIntegral } from './integrality.js';
export { KernelStopped, type NewtonTableInput, type NewtonTableResult } from './types.js';
export {
  foldCycleTypes,
  forEachCycleType,
  exponentNotation,
  type CycleTypeVisit,
} from './cycle-types.js';
export {
  classSumRational,
  reduceRational,
  type ClassRow,
  type ClassSumInput,
  type RationalParts,
} from './class-sum.js';
