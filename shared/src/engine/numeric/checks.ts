import { EngineError } from '../errors.js';
import type { Truncation } from '../expr/evaluate.js';
import type { GasSpec } from '../spec/schema.js';
import { formatError } from './decimal.js';
import { agreeWithin, Estimate, NumericValueJson, size, toNumericJson, ulp } from './estimate.js';
import { fromInt, fromNumber, mul, neg, Real, sub, toNumber } from './real.js';
import { taylorByInterpolation } from './taylor.js';
import { twoPrecision } from './weights.js';

/** A numeric verdict: computed and supplied values, their difference and the tolerance used. */
export interface NumericVerdict {
  agrees: boolean;
  /** The combined error estimate both values were compared within. */
  tolerance: string;
  difference: string;
  computed: NumericValueJson;
  supplied: NumericValueJson;
}
export interface NumericRowVerdict extends NumericVerdict {
  N: number;
}
export interface NumericWeightVerdict extends NumericVerdict {
  L: number;
}

const DECIMAL_LITERAL = /^\s*[+-]?(\d+)(?:\.(\d*))?(?:[eE]([+-]?\d+))?\s*$/;

/**
 * A supplied number: an expression evaluated at two precisions; a plain decimal literal is known
 * to half a unit of its last digit (a table printed to 12 digits is not exact).
 */
function supplied(
  text: string,
  names: string[],
  values: Real[],
  prec: number,
  field: string,
  truncations: Truncation[],
): Estimate {
  const e = twoPrecision(text, names, prec, field, truncations)(values);
  const m = DECIMAL_LITERAL.exec(text);
  if (m) {
    const frac = m[2] ?? '';
    const exp10 = Number(m[3] ?? '0') - frac.length;
    if (m[2] !== undefined || m[3] !== undefined) e.error = Math.max(e.error, 0.5 * 10 ** exp10);
  }
  return e;
}

/** Compare one computed estimate with one supplied one. */
export function verdict(computed: Estimate, sup: Estimate, digits: number): NumericVerdict {
  const d = size(sub(computed.value, sup.value, 64));
  return {
    agrees: agreeWithin(computed, sup),
    tolerance: formatError(computed.error + sup.error),
    difference: formatError(d),
    computed: toNumericJson(computed, digits),
    supplied: toNumericJson(sup, digits),
  };
}

/** Names and values an expression of this gas may use besides its own index. */
function variableBinding(spec: GasSpec, q: Real | undefined): [string[], Real[]] {
  return q === undefined ? [[], []] : [[spec.variable], [q]];
}

/**
 * Grand check in numeric mode: the supplied coefficients Z(0), Z(1), ... (or those of an
 * expression in kappa) against the table, and the cycle weights they imply (Newton's identities
 * run backwards) against the entered ones.
 */
export function grandCheckNumeric(
  spec: GasSpec,
  canonical: readonly Estimate[],
  weights: readonly Estimate[],
  q: Real | undefined,
  prec: number,
  truncations: Truncation[],
): { rows: NumericRowVerdict[]; impliedWeights: NumericWeightVerdict[] } {
  const g = spec.grand!;
  const [names, values] = variableBinding(spec, q);
  const xi =
    g.kind === 'coefficients'
      ? g.values
          .slice(0, spec.nMax + 1)
          .map((text, j) => supplied(text, names, values, prec, `grand.values.${j}`, truncations))
      : grandExpressionCoefficients(
          spec,
          g.expression,
          canonical,
          names,
          values,
          prec,
          truncations,
        );
  const digits = spec.precision!;
  const rows = xi.map((s, N) => ({ N, ...verdict(canonical[N]!, s, digits) }));
  const implied = impliedWeightsNumeric(xi, spec.statistics === 'fermion', prec);
  const impliedWeights = implied.map((w, i) => ({
    L: i + 1,
    ...verdict(weights[i]!, w, digits),
  }));
  return { rows, impliedWeights };
}

/**
 * Z(0..nMax) of a grand function given as an expression in kappa: its Taylor coefficients by
 * interpolation on [-r, r] (taylor.ts). r keeps every computed |Z(N)| r^N at most 1, and for
 * bosons half the radius 1 / sqrt(Z_2) below which 1/det(1 - kappa rho) has no pole.
 */
function grandExpressionCoefficients(
  spec: GasSpec,
  text: string,
  canonical: readonly Estimate[],
  names: string[],
  values: Real[],
  prec: number,
  truncations: Truncation[],
): Estimate[] {
  const n = spec.nMax;
  let radius = Infinity;
  for (let N = 1; N <= n; N++) {
    const z = Math.abs(toNumber(canonical[N]!.value));
    if (z > 0) radius = Math.min(radius, z ** (-1 / N));
  }
  if (spec.statistics === 'boson' && n >= 2) {
    const z2 = Math.abs(toNumber(canonical[2]!.value) * 2 - toNumber(canonical[1]!.value) ** 2);
    if (z2 > 0) radius = Math.min(radius, 0.5 / Math.sqrt(z2));
  }
  if (!Number.isFinite(radius)) radius = 1;
  const W = prec + n + 40 + 32;
  const f = twoPrecision(text, ['kappa', ...names], W, 'grand.expression', truncations);
  return taylorByInterpolation((k) => f([k, ...values]), n, fromNumber(radius), W);
}

/** Z_L from Z(0..n): s^(L-1) Z_L = L Z(L) - sum_(l<L) s^(l-1) Z_l Z(L-l) (Z(0) must be 1). */
function impliedWeightsNumeric(Z: readonly Estimate[], fermion: boolean, prec: number): Estimate[] {
  const out: Estimate[] = [];
  for (let L = 1; L < Z.length; L++) {
    let acc: Real = mul(fromInt(L), Z[L]!.value, prec);
    let err = L * Z[L]!.error;
    for (let l = 1; l < L; l++) {
      const w = out[l - 1]!;
      const t = mul(w.value, Z[L - l]!.value, prec);
      acc = sub(acc, fermion && l % 2 === 0 ? neg(t) : t, prec);
      err +=
        size(w.value) * Z[L - l]!.error + w.error * size(Z[L - l]!.value) + size(t) * ulp(prec);
    }
    out.push({ value: fermion && L % 2 === 0 ? neg(acc) : acc, error: err });
  }
  return out;
}

/**
 * Reference check in numeric mode: normalization(N) * Z(N) against each row, within the combined
 * error (a decimal row is known to half a unit of its last digit).
 */
export function referenceCheckNumeric(
  spec: GasSpec,
  canonical: readonly Estimate[],
  q: Real | undefined,
  prec: number,
  truncations: Truncation[],
): NumericRowVerdict[] {
  const ref = spec.reference!;
  const [names, values] = variableBinding(spec, q);
  const norm = twoPrecision(
    ref.normalization,
    ['N', ...names],
    prec,
    'reference.normalization',
    truncations,
  );
  return ref.rows.map((row, i) => {
    if (row.N > spec.nMax)
      throw new EngineError(`N = ${row.N} is beyond nMax = ${spec.nMax}`, `reference.rows.${i}.N`);
    const f = norm([fromInt(row.N), ...values]);
    const z = canonical[row.N]!;
    const value = mul(f.value, z.value, prec);
    const computed: Estimate = {
      value,
      error: size(f.value) * z.error + f.error * size(z.value) + size(value) * ulp(prec),
    };
    const s = supplied(
      row.value,
      ['N', ...names],
      [fromInt(row.N), ...values],
      prec,
      `reference.rows.${i}.value`,
      truncations,
    );
    return { N: row.N, ...verdict(computed, s, spec.precision!) };
  });
}
