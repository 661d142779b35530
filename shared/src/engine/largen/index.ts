import type { GasSpec } from '../spec/schema.js';
import type { Series } from '../series/series.js';
import { analyseClass } from './analyse.js';
import { fittedClasses, givenClass, type NormalizedClass } from './normalize.js';
import type { LargeNJson } from './types.js';

export type * from './types.js';

/** Options of the large-N analysis. */
export interface LargeNOptions {
  /** The user's normalization factor for each N (already evaluated), from spec.largeN. */
  normalization?: Series[];
}

/**
 * The large-N structure of a canonical q-series table Z(0..nMax): normalization (fitted exactly or
 * given), the coefficient-wise limit Z(inf) to the order it is determined, where each row stops
 * agreeing with it, the correction walls, and the product exponents of the limit. Every formula is
 * fitted on some rows and reported with the rows that verify it. Undefined when the table has too
 * few usable rows (fewer than 4 with N >= 1).
 */
export function largeNAnalysis(
  Z: Series[],
  spec: GasSpec,
  opts: LargeNOptions = {},
): LargeNJson | undefined {
  const notes: string[] = [];
  const variable = spec.variable;
  let classes: NormalizedClass[];
  if (opts.normalization && spec.largeN?.normalization !== undefined) {
    classes = [givenClass(Z, opts.normalization, spec.largeN.normalization)];
  } else {
    if (Z.length < 5) return undefined;
    classes = fittedClasses(Z, variable, notes);
  }
  return { variable, classes: classes.map((c) => analyseClass(c, variable, notes)), notes };
}
