import type Fraction from 'fraction.js';
import { toValueJson } from '../series/format.js';
import { coarsen, type Series } from '../series/series.js';
import { correctionFits, correctionRowsJson, rowCorrections } from './corrections.js';
import { fitPolynomial, polyAt, polyText } from './fit.js';
import { onCommonGrid } from './grid.js';
import { classLimit, stabilizationRows } from './limit.js';
import type { NormalizedClass } from './normalize.js';
import { productForm } from './product.js';
import type { FitJson, LargeNClassJson, StabilizationRowJson } from './types.js';

/** Product exponents listed in the block (all are determined; the list is kept readable). */
const MAX_EXPONENTS_SHOWN = 200;

/**
 * A linear fit of the stabilization exponents: solved from the first rows from some N0 on,
 * verified on every later exact row, never below a later row's lower bound.
 */
function stabilizationFit(
  rows: readonly number[],
  stab: readonly { index: number; exact: boolean }[],
  step: Fraction,
): { fit: FitJson | null; note: string } {
  const exact = rows.map((N, i) => ({ N, i })).filter((r) => stab[r.i]!.exact);
  for (let s0 = 0; s0 + 3 <= exact.length; s0++) {
    const R = exact.slice(s0);
    const pts = R.map((r) => ({ N: r.N, y: step.mul(stab[r.i]!.index) }));
    const fit = fitPolynomial(pts, 1, 1);
    if (!fit) continue;
    const boundOk = rows.every(
      (N, i) =>
        N < R[0]!.N ||
        stab[i]!.exact ||
        stab[i]!.index === Infinity ||
        polyAt(fit.coeffs, N).compare(step.mul(stab[i]!.index)) >= 0,
    );
    if (!boundOk) continue;
    const skipped = exact.slice(0, s0).map((r) => r.N);
    const bounds = rows.filter((_, i) => !stab[i]!.exact);
    const note =
      `fitted on rows ${fit.fittedOn.join(', ')}, verified on ${fit.verifiedOn.join(', ')}` +
      (skipped.length ? `; rows ${skipped.join(', ')} do not follow it` : '') +
      (bounds.length
        ? bounds.length === 1
          ? `; row ${bounds[0]} agrees with the limit on all of its known range (consistent)`
          : `; rows ${bounds.join(', ')} agree with the limit on all of their known range (consistent)`
        : '');
    const json: FitJson = {
      expression: polyText(fit.coeffs),
      fittedOn: fit.fittedOn,
      verifiedOn: fit.verifiedOn,
    };
    return { fit: json, note };
  }
  return {
    fit: null,
    note: `no linear law in N verified on the rows where the agreement ends (${exact.map((r) => r.N).join(', ') || 'none'})`,
  };
}

/** The large-N structure of one normalized class. */
export function analyseClass(c: NormalizedClass): LargeNClassJson {
  const Y = onCommonGrid(c.rows.map((N) => c.Y.get(N)!));
  const step = Y[0]?.step;
  const base: LargeNClassJson = {
    parity: c.parity,
    rows: c.rows,
    normalization: c.normalization,
    normalizationDetail: c.detail,
    limit: null,
    limitNote: 'fewer than two rows',
    productExponents: [],
    product: null,
    stabilization: [],
    stabilizationFit: null,
    stabilizationDetail: null,
    stabilizationNote: 'no limit',
    correctionTerms: [],
    corrections: [],
  };
  if (!step || Y.length < 2) return base;
  const lim = classLimit(c.rows, Y);
  base.limitNote = lim.note;
  if (lim.value === null) return base;
  const limit: Series = lim.value;
  base.limit = toValueJson(limit);
  try {
    base.product = productForm(coarsen(limit), MAX_EXPONENTS_SHOWN);
    base.productExponents = base.product.exponents;
  } catch (e) {
    base.product = null;
    base.limitNote += `; no product form (${(e as Error).message})`;
  }
  const stab = stabilizationRows(Y, limit);
  base.stabilization = c.rows.map((N, i): StabilizationRowJson => {
    const s = stab[i]!;
    if (s.exact) return { N, agreesBelow: step.mul(s.index).toFraction() };
    return s.index === Infinity
      ? { N, agreesBelow: null }
      : { N, agreesBelow: null, atLeast: step.mul(s.index).toFraction() };
  });
  const sf = stabilizationFit(c.rows, stab, step);
  base.stabilizationFit = sf.fit?.expression ?? null;
  base.stabilizationDetail = sf.fit;
  base.stabilizationNote = sf.note;
  const rows = rowCorrections(c.rows, Y, limit, lim.K);
  base.correctionTerms = correctionRowsJson(rows);
  base.corrections = correctionFits(rows, step);
  return base;
}
