import Fraction from 'fraction.js';
import { classRowJsonText } from './canonical/class-text.js';
import { classSum } from './canonical/classes.js';
import { spectrumProduct } from './canonical/product.js';
import { newtonRecursion } from './canonical/recursion.js';
import { grandCheck } from './checks/grand.js';
import { referenceCheck } from './checks/reference.js';
import { EngineCancelled, EngineError } from './errors.js';
import type { Truncation } from './expr/evaluate.js';
import type { ClassRowJson, ComputeOptions, ComputeResult, Progress, Route } from './result.js';
import { compareSeries } from './series/compare.js';
import { toValueJson } from './series/format.js';
import { Series } from './series/series.js';
import { computeNumeric } from './numeric/compute-numeric.js';
import { GasSpec, isNumericSpec, parseGasSpec } from './spec/schema.js';
import { parseExpression } from './expr/sandbox.js';
import { largeNAnalysis } from './largen/index.js';
import { cycleWeights, seriesAt } from './weights.js';

const clock = (globalThis as { performance?: { now(): number } }).performance;
const now = (): number => (clock ? clock.now() : Date.now());

/** Throttled progress and cancellation for one computation. */
function progressReporter(opts: ComputeOptions) {
  let last = 0;
  let phase: Progress['phase'] = 'weights';
  const check = (): void => {
    if (opts.shouldStop?.()) throw new EngineCancelled();
  };
  return {
    phase(p: Progress['phase'], total: number): void {
      phase = p;
      check();
      last = now();
      opts.onProgress?.({ phase: p, done: 0, total });
    },
    step(done: number, total: number): void {
      check();
      const t = now();
      if (t - last >= 50) {
        last = t;
        opts.onProgress?.({ phase, done, total });
      }
    },
    tick(): void {
      check();
      const t = now();
      if (t - last >= 50 && opts.onProgress) {
        last = t;
        opts.onProgress({ phase, done: 0, total: 0 });
      }
    },
  };
}

/** Tag truncation records with the spec field they come from. */
function tagged(
  field: string,
  list: Truncation[],
): { field: string; what: string; terms: number }[] {
  return list.map((t) => ({ field, ...t }));
}

/**
 * Compute everything a gas spec asks for: cycle weights, the canonical table by every route that
 * applies (recursion always; class sum for N <= classTable; the product form for spectra), the
 * grand and reference checks, and the class table (streamed through `onClass`, produced last).
 * Throws EngineError (with `field`) for a bad spec, EngineCancelled when stopped.
 */
export function compute(input: unknown, opts: ComputeOptions = {}): ComputeResult {
  const t0 = now();
  const spec: GasSpec = parseGasSpec(input);
  const progress = progressReporter(opts);
  if (spec.sectors) throw new EngineError('sector sums are not computed yet', 'sectors');
  if (isNumericSpec(spec)) return computeNumeric(spec, opts, progress, now);
  const cap = spec.order == null ? null : new Fraction(spec.order);
  const fermion = spec.statistics === 'fermion';
  const nMax = spec.nMax;
  const truncations: ComputeResult['truncations'] = [];

  progress.phase('weights', nMax);
  const ring = { variable: spec.variable, cap, nMax, tick: progress.tick };
  const w = cycleWeights(spec, ring);
  truncations.push(...tagged('weights', w.truncations));
  const t1 = now();

  progress.phase('recursion', nMax);
  const Z = newtonRecursion(w.weights, nMax, fermion, cap, progress.step, opts.shouldStop);
  const t2 = now();

  const routes: Route[][] = Z.map(() => ['recursion']);
  const agrees: boolean[] = Z.map(() => true);
  const methods: ComputeResult['methods'] = { recursion: { nMax } };
  if (w.spectrum) {
    progress.phase('product', w.spectrum.points.length);
    const X = spectrumProduct(
      w.spectrum.points,
      nMax,
      fermion,
      cap,
      w.spectrum.truncated,
      progress.step,
    );
    let all = true;
    for (let N = 0; N <= nMax; N++) {
      routes[N]!.push('product');
      const ok = compareSeries(Z[N]!, X[N]!).agrees;
      agrees[N] = agrees[N]! && ok;
      all &&= ok;
    }
    methods.product = { nMax, agrees: all, points: w.spectrum.points.length };
  }
  const t3 = now();

  const result: ComputeResult = {
    format: 'traceloom.result/1',
    spec,
    weights: w.weights.map((value, i) => ({ L: i + 1, value: toValueJson(value) })),
    canonical: [],
    classes: [],
    methods,
    truncations,
    timings: {
      totalMs: 0,
      weightsMs: t1 - t0,
      recursionMs: t2 - t1,
      productMs: t3 - t2,
      checksMs: 0,
      classesMs: 0,
    },
  };

  if (spec.grand) {
    progress.phase('grand', nMax);
    const list: Truncation[] = [];
    const g = grandCheck(spec, Z, w.weights, cap, list);
    result.grandCheck = g.rows;
    result.impliedWeights = g.impliedWeights;
    truncations.push(...tagged('grand', list));
  }
  if (spec.reference) {
    progress.phase('reference', spec.reference.rows.length);
    const list: Truncation[] = [];
    result.referenceCheck = referenceCheck(spec, Z, cap, list);
    truncations.push(...tagged('reference', list));
  }
  const t4 = now();

  const keep = opts.collectClasses ?? !(opts.onClass || opts.onClassText);
  const onText = opts.onClassText;
  const lean = onText && !keep && !opts.onClass ? onText : undefined;
  if (spec.classTable > 0) {
    progress.phase('classes', spec.classTable);
    let all = true;
    for (let N = 1; N <= spec.classTable; N++) {
      const emit = (row: Parameters<NonNullable<Parameters<typeof classSum>[4]>>[0]): void => {
        const json: ClassRowJson = {
          N: row.N,
          cycleType: row.cycleType,
          size: row.size,
          sign: row.sign,
          contribution: toValueJson(row.contribution),
        };
        opts.onClass?.(json);
        onText?.(classRowJsonText(json));
        if (keep) result.classes.push(json);
      };
      const sum: Series = classSum(N, w.weights, fermion, cap, emit, progress.tick, lean);
      routes[N]!.push('classSum');
      const ok = compareSeries(Z[N]!, sum).agrees;
      agrees[N] = agrees[N]! && ok;
      all &&= ok;
      progress.step(N, spec.classTable);
    }
    routes[0]!.push('classSum');
    methods.classSum = { nMax: spec.classTable, agrees: all };
  }
  const t5 = now();

  result.canonical = Z.map((value, N) => ({
    N,
    value: toValueJson(value),
    routes: routes[N]!,
    agrees: agrees[N]!,
  }));
  if (spec.largeN !== undefined || nMax >= 4) {
    let normalization: Series[] | undefined;
    const text = spec.largeN?.normalization;
    if (text !== undefined) {
      const field = 'largeN.normalization';
      const node = parseExpression(text, field);
      const list: Truncation[] = [];
      normalization = Z.map((_, N) => seriesAt(node, ring, field, list, { N }));
      truncations.push(...tagged('largeN', list));
    }
    const analysis = largeNAnalysis(Z, spec, normalization ? { normalization } : {});
    if (analysis) result.largeN = analysis;
  }
  result.timings.checksMs = t4 - t3;
  result.timings.classesMs = t5 - t4;
  result.timings.totalMs = now() - t0;
  return result;
}
