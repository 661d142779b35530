import type { NormalizedClass } from './normalize.js';
import type { LargeNClassJson } from './types.js';

/** The large-N structure of one normalized class (first version: normalization only). */
export function analyseClass(
  c: NormalizedClass,
  _variable: string,
  _notes: string[],
): LargeNClassJson {
  return {
    parity: c.parity,
    rows: c.rows,
    normalization: c.normalization,
    normalizationDetail: c.detail,
    limit: null,
    limitNote: 'not analysed yet',
    productExponents: [],
    product: null,
    stabilization: [],
    stabilizationFit: null,
    stabilizationDetail: null,
    stabilizationNote: 'not analysed yet',
    correctionTerms: [],
    corrections: [],
  };
}
