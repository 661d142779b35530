import Fraction from 'fraction.js';
import { checkClassSums, checkProductRoute, RouteLedger } from './canonical/agreement.js';
import { markHonestRows } from './canonical/honest-rows.js';
import { partitionCounts } from './estimate.js';
import { productLog2Bounds } from './canonical/product-bound.js';
import { newtonRecursion } from './canonical/recursion.js';
import { runLargeN, runTableChecks, tagged } from './checks/table-checks.js';
import { EngineCancelled } from './errors.js';
import { computeSectors } from './sectors/compute-sectors.js';
import type { ComputeOptions, ComputeResult, Progress } from './result.js';
import { toValueJson } from './series/format.js';
import type { Series } from './series/series.js';
import { computeNumeric } from './numeric/compute-numeric.js';
import { GasSpec, isNumericSpec, parseGasSpec } from './spec/schema.js';
import { cycleWeights } from './weights.js';

const clock = (globalThis as { performance?: { now(): number } }).performance;
const now = (): number => (clock ? clock.now() : Date.now());

/** Canonical rows in the result format (routes copied: the partial result keeps its own). */
function canonicalRows(Z: readonly Series[], ledger: RouteLedger) {
  return Z.map((value, N) => ({
    N,
    value: toValueJson(value),
    routes: [...ledger.routes[N]!],
    agrees: ledger.agrees[N]!,
  }));
}

/** Throttled progress and cancellation for one computation. */
function progressReporter(opts: ComputeOptions) {
  let last = 0;
  let phase: Progress['phase'] = 'weights';
  let unit: string | undefined;
  const check = (): void => {
    if (opts.shouldStop?.()) throw new EngineCancelled();
  };
  return {
    phase(p: Progress['phase'], total: number, what?: string): void {
      phase = p;
      unit = what;
      check();
      last = now();
      opts.onProgress?.({ phase: p, done: 0, total, ...(unit && { unit }) });
    },
    step(done: number, total: number): void {
      check();
      const t = now();
      if (t - last >= 50) {
        last = t;
        opts.onProgress?.({ phase, done, total, ...(unit && { unit }) });
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
  if (spec.sectors) return computeSectors(spec, opts, progress, now);
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

  // progress by work: row N of the recursion costs N products, so rows 1..N cost N(N+1)/2
  const products = (n: number): number => (n * (n + 1)) / 2;
  progress.phase('recursion', products(nMax), 'products');
  const Z = newtonRecursion(
    w.weights,
    nMax,
    fermion,
    cap,
    (done, total) => progress.step(products(done), products(total)),
    opts.shouldStop,
    w.spectrum && productLog2Bounds(w.spectrum.points, nMax, fermion, cap),
  );
  const t2 = now();

  const ledger = new RouteLedger(Z);
  const methods: ComputeResult['methods'] = { recursion: { nMax } };
  const routeCtx = { nMax, fermion, cap, step: progress.step, tick: progress.tick };
  if (w.spectrum) {
    progress.phase('product', w.spectrum.points.length);
    methods.product = checkProductRoute(w.spectrum, routeCtx, ledger);
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

  runTableChecks(spec, Z, w.weights, cap, result, progress.phase);
  const t4 = now();

  if (opts.onPartial && spec.classTable > 0) {
    const partial: ComputeResult = {
      ...result,
      canonical: canonicalRows(Z, ledger),
      incomplete: { phase: 'classSum', reason: 'the class table had not finished' },
    };
    markHonestRows(partial, Z, w.weights, w.spectrum);
    opts.onPartial(partial);
  }
  if (spec.classTable > 0) {
    // progress by work: cycle types done out of p(1) + ... + p(classTable)
    const p = partitionCounts(spec.classTable);
    const through = (N: number): number => p.slice(1, N + 1).reduce((a, b) => a + b, 0);
    const types = through(spec.classTable);
    let typesDone = 0;
    progress.phase('classSum', types, 'cycle types');
    const classCtx = {
      ...routeCtx,
      tick: (): void => {
        typesDone = Math.min(typesDone + 512, types); // classSum ticks every 512 rows
        progress.step(typesDone, types);
      },
      step: (N: number): void => {
        typesDone = through(N);
        progress.step(typesDone, types);
      },
    };
    methods.classSum = checkClassSums(
      w.weights,
      spec.classTable,
      classCtx,
      opts,
      ledger,
      result.classes,
    );
  }
  const t5 = now();

  result.canonical = canonicalRows(Z, ledger);
  markHonestRows(result, Z, w.weights, w.spectrum);
  runLargeN(spec, Z, ring, result);
  result.timings.checksMs = t4 - t3;
  result.timings.classesMs = t5 - t4;
  result.timings.totalMs = now() - t0;
  return result;
}
