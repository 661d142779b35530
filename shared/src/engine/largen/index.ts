import Fraction from 'fraction.js';
import type { Series } from '../series/series.js';
import type { GasSpec } from '../spec/schema.js';
import { analyseClass } from './analyse.js';
import { fittedClasses, givenClass, parityClasses } from './normalize.js';
import type { LargeNClassJson, LargeNJson } from './types.js';

export type * from './types.js';
export { productForm, productExponentList, moebius } from './product.js';
export { grandProductForm, seriesProductForm, ON_REQUEST_EXPONENTS } from './on-request.js';

/** Options of the large-N analysis. */
export interface LargeNOptions {
  /** The user's normalization factor for each N (already evaluated), from spec.largeN. */
  normalization?: Series[];
}

/** Exponent up to which a class's limit is known (Infinity: exact; -Infinity: none). */
function limitReach(c: LargeNClassJson): number {
  if (!c.limit) return -Infinity;
  return c.limit.order === null ? Infinity : new Fraction(c.limit.order).valueOf();
}

/**
 * The large-N structure of a canonical q-series table Z(0..nMax): normalization (fitted exactly or
 * given), the coefficient-wise limit Z(inf) to the order it is determined, where each row stops
 * agreeing with it, the correction walls, and the product exponents of the limit. Every formula is
 * fitted on some rows and reported with the rows that verify it. One class for all N, or one per
 * parity of N when one quadratic does not fit the leading exponents or when even and odd rows
 * determine their limits further apart than together. Undefined for fewer than 4 rows N >= 1
 * (without a given normalization).
 */
export function largeNAnalysis(
  Z: Series[],
  spec: GasSpec,
  opts: LargeNOptions = {},
): LargeNJson | undefined {
  const notes: string[] = [];
  const variable = spec.variable;
  if (opts.normalization && spec.largeN?.normalization !== undefined) {
    const c = analyseClass(givenClass(Z, opts.normalization, spec.largeN.normalization));
    return { variable, classes: [c], notes };
  }
  if (Z.length < 5) return undefined;
  let classes = fittedClasses(Z, variable, notes).map(analyseClass);
  if (classes.length === 1) {
    const split = parityClasses(Z, variable, []).map(analyseClass);
    const reach = limitReach(classes[0]!);
    if (split.length === 2 && split.every((s) => limitReach(s) > reach)) {
      notes.push(
        'even and odd N analysed apart: each class determines its limit further than all rows together',
      );
      classes = split;
    }
  } else {
    notes.push('even and odd N analysed apart: one quadratic does not fit every leading exponent');
  }
  return { variable, classes, notes };
}
