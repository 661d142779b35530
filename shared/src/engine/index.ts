/**
 * The Traceloom engine: exact Puiseux series, the expression language, cycle weights, the
 * canonical table by three routes, grand and reference checks, and the result format.
 */
export { compute } from './compute.js';
export type {
  CanonicalRowJson,
  ClassRowJson,
  ComputeOptions,
  ComputeResult,
  Progress,
  Route,
  SectorRowJson,
  SectorsJson,
} from './result.js';
export { sectorsSchema, MAX_SECTOR_INDICES } from './sectors/schema.js';
export type { SectorsSpec } from './sectors/schema.js';
export { assembleSectors, sectorContext } from './sectors/compute-sectors.js';
export { sectorPart } from './sectors/sector.js';
export { SectorWalk } from './sectors/walk.js';
export { assembleNumericSectors } from './sectors/numeric-sectors.js';
export {
  NumericSectorWalk,
  numericSectorContext,
  numericSectorPart,
} from './sectors/numeric-part.js';
export type { NumericSectorPart } from './sectors/numeric-part.js';
export { partFromData, partToData } from './sectors/transfer.js';
export type { SectorPartData } from './sectors/transfer.js';
export { EngineCancelled, EngineError, describeError, withField } from './errors.js';
export * from './limits.js';
export {
  gasSpecSchema,
  parseGasSpec,
  weightSourceSchema,
  grandSchema,
  referenceSchema,
} from './spec/schema.js';
export type { GasSpec, GasSpecInput } from './spec/schema.js';
export { Series, align, truncate, cutAt } from './series/series.js';
export { add, sub, neg, mul, div, inverse, powInt, scale, shift } from './series/arith.js';
export { exp, log, powRational } from './series/transcendental.js';
export { compareSeries } from './series/compare.js';
export type { Mismatch, Verdict } from './series/compare.js';
export { fromValueJson, toValueJson, toText, toLatex } from './series/format.js';
export type { ValueJson } from './series/format.js';
export { substitute } from './series/substitute.js';
export { KSeries } from './grand/kseries.js';
export { evaluateExpression, evaluateSeries } from './expr/evaluate.js';
export { EXACT_FUNCTIONS } from './expr/functions.js';
export { NUMERIC_FUNCTIONS } from './numeric/expr/functions.js';
export type { Truncation } from './expr/evaluate.js';
export { parseExpression, DISABLED_FUNCTIONS, limitedMath } from './expr/sandbox.js';
export { cycleWeights } from './weights.js';
export { newtonRecursion } from './canonical/recursion.js';
export { classSum } from './canonical/classes.js';
export type { ClassRow } from './canonical/classes.js';
export { classRowJsonText } from './canonical/class-text.js';
export { spectrumProduct } from './canonical/product.js';
export type { RowVerdict, WeightVerdict } from './checks/grand.js';
export { compareReferenceRows } from './checks/reference.js';
export { impliedReferenceWeights, weightsFromCanonical } from './checks/reference-weights.js';
export type {
  CompareRowsOptions,
  ReferenceRing,
  ReferenceRowVerdict,
  SuppliedRow,
} from './checks/reference.js';
export {
  grandProductForm,
  largeNAnalysis,
  productForm,
  productExponentList,
  seriesProductForm,
} from './largen/index.js';
export type * from './largen/types.js';
export type { LargeNOptions } from './largen/index.js';
export { estimateRun, classTableCost, partitionCounts } from './estimate.js';
export type { RunEstimate } from './estimate.js';
export {
  isDetermined,
  lowestExponentBounds,
  orderAdvice,
  rowsText,
} from './canonical/order-advice.js';
export type { OrderAdviceJson } from './canonical/order-advice.js';
