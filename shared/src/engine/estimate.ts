import Fraction from 'fraction.js';
import {
  isDetermined,
  lowestExponentBounds,
  orderAdvice,
  type OrderAdviceJson,
} from './canonical/order-advice.js';
import { newtonRecursion } from './canonical/recursion.js';
import { GasSpec, isNumericSpec, parseGasSpec } from './spec/schema.js';
import { cycleWeights } from './weights.js';

/**
 * Bytes one held class-table coefficient costs, measured on this engine (a spectrum gas at
 * O(q^100), class tables of 16 and 20: 100-160 bytes per coefficient with the rows held, plus
 * about 21 bytes per coefficient of JSON text when the result is written). Common practice for a
 * planning figure: a measured constant with headroom, not a bound.
 */
export const BYTES_PER_CLASS_COEFFICIENT = 160;
/** Microseconds of class-table work per coefficient, measured the same way (noisy, shared CPU). */
export const MICROSECONDS_PER_CLASS_COEFFICIENT = 16;
/** Rows of the canonical table computed before a run to fit the lowest exponents. */
const TRIAL_ROWS = 8;
/** Grid steps of the short order the trial rows are computed to. */
const TRIAL_STEPS = 128;

/** Number of partitions p(n) for n = 0..nMax (Euler's recurrence by parts; OEIS A000041). */
export function partitionCounts(nMax: number): number[] {
  const p = new Array<number>(nMax + 1).fill(0);
  p[0] = 1;
  for (let part = 1; part <= nMax; part++) {
    for (let n = part; n <= nMax; n++) p[n]! += p[n - part]!;
  }
  return p;
}

/** What a run of a gas will cost, and what it will determine, judged before it starts. */
export interface RunEstimate {
  /** Cycle types of the class table: p(1) + ... + p(classTable). */
  cycleTypes: number;
  /** Coefficients per value: order / step for a series gas, 1 for exact or numeric values. */
  seriesLength: number;
  /** cycleTypes x seriesLength: an upper bound of the class table's coefficients. */
  classCoefficients: number;
  /** Memory the class rows take when held, in MB (planning figure). */
  classMemoryMb: number;
  /** Time of the class table, in seconds (planning figure). */
  classSeconds: number;
  /** Rows the order is too low for, and the order that reaches N_max (series gases). */
  orderAdvice: OrderAdviceJson | null;
  /** One sentence with the figures, for people. */
  summary: string;
}

const thousands = (n: number): string => Math.round(n).toLocaleString('en-US');

/** The class table's size for a spec, without computing anything. */
export function classTableCost(spec: GasSpec): Omit<RunEstimate, 'orderAdvice' | 'summary'> {
  const p = partitionCounts(spec.classTable);
  const cycleTypes = p.slice(1).reduce((a, b) => a + b, 0);
  const numeric = isNumericSpec(spec);
  const seriesLength =
    numeric || spec.order == null
      ? 1
      : Number(new Fraction(spec.order).div(new Fraction(spec.step ?? '1')).ceil().n);
  const classCoefficients = cycleTypes * seriesLength;
  return {
    cycleTypes,
    seriesLength,
    classCoefficients,
    classMemoryMb: Math.ceil((classCoefficients * BYTES_PER_CLASS_COEFFICIENT) / 2 ** 20),
    classSeconds: Math.ceil((classCoefficients * MICROSECONDS_PER_CLASS_COEFFICIENT) / 1e6),
  };
}

/**
 * Estimate a run before it starts: the class table's cycle types, coefficients, memory and time,
 * and (series gases) the order advice from the weights' lowest exponents, the spectrum's levels
 * and the first few rows of the canonical table. Throws EngineError for a bad spec.
 */
export function estimateRun(input: unknown): RunEstimate {
  const spec = parseGasSpec(input);
  const cost = classTableCost(spec);
  let advice: OrderAdviceJson | null = null;
  if (!isNumericSpec(spec) && !spec.sectors && spec.order != null) {
    const cap = new Fraction(spec.order);
    const fermion = spec.statistics === 'fermion';
    // only what the trial rows need, to a short order: the estimate stays cheap for any gas.
    // A lowest exponent below the short order is exact; levels beyond it lie at or above it.
    const step = new Fraction(spec.step ?? '1');
    const short = step.mul(TRIAL_STEPS).compare(cap) < 0 ? step.mul(TRIAL_STEPS) : cap;
    const trial = Math.min(spec.nMax, TRIAL_ROWS);
    const w = cycleWeights(spec, { variable: spec.variable, cap: short, nMax: trial });
    const rows = newtonRecursion(w.weights, trial, fermion, short);
    // rows not determined at the short order say nothing about the real one: judge them as later rows
    const known = short === cap ? rows.length : rows.findIndex((z) => !isDetermined(z));
    const Z = known < 0 ? rows : rows.slice(0, known);
    // the weights' bound needs every Z_L up to N_max; with fewer, only the spectrum's levels bound
    const weights = trial === spec.nMax && short === cap ? w.weights : [];
    advice = orderAdvice({
      Z,
      bounds: lowestExponentBounds(weights, spec.nMax, fermion, w.spectrum, cap),
      nMax: spec.nMax,
      order: cap,
      step: new Fraction(spec.step ?? '1'),
      variable: spec.variable,
    });
  }
  const summary =
    spec.classTable > 0
      ? `A class table of ${spec.classTable} has ${thousands(cost.cycleTypes)} cycle types; ` +
        `with ${thousands(cost.seriesLength)} coefficient${cost.seriesLength === 1 ? '' : 's'} per value that is up to ` +
        `${thousands(cost.classCoefficients)} coefficients, about ${thousands(cost.classMemoryMb)} MB held ` +
        `and ${thousands(cost.classSeconds)} s of work (planning figures).`
      : 'No class table is asked for.';
  return { ...cost, orderAdvice: advice, summary };
}
