import type {
  ClassRowJson,
  ComputeOptions,
  ComputeResult,
  NumericCanonicalExtras,
  Route,
} from '../result.js';
import type { GasSpec } from '../spec/schema.js';
import { grandCheckNumeric, referenceCheckNumeric } from './checks.js';
import { bitsFor } from './real.js';
import { agreeWithin, best, Estimate, size, toNumericJson } from './estimate.js';
import { classSumNumeric, newtonNumeric, productNumeric, type Pace } from './routes.js';
import { recognizeRows } from './recognize-rows.js';
import { airyFit } from './airy-fit.js';
import { fixedVariable, numericWeights } from './weights.js';

/** Guard digits on top of the requested ones (rounding of the routes, the checks). */
export const GUARD_DIGITS = 12;

/** What a numeric computation reports about its method, in the result's `numeric` block. */
export const ERROR_ESTIMATE_TEXT =
  'Each error is an estimate, not a bound: weights from expressions are evaluated at two working ' +
  'precisions and differ by at most the error; a kernel is discretised at three resolutions and ' +
  'the error of the finest is estimated from their differences; the routes propagate these ' +
  'errors and add the rounding of every operation, so a row that cancels shows the digits it lost.';

interface Progressing extends Pace {
  phase(
    p: 'weights' | 'recursion' | 'product' | 'grand' | 'reference' | 'classSum',
    total: number,
  ): void;
  step(done: number, total: number): void;
}

/**
 * The numeric mode of `compute` (spec.precision given): cycle weights as numbers with errors
 * (a kernel's traces, or a formula/spectrum/list at a number), the canonical table by the Newton
 * recursion and — for kernels — the Fredholm determinant, for spectra the product form, the class
 * sum for N <= classTable; checks within tolerance; closed-form recognition; the Airy fit.
 */
export function computeNumeric(
  spec: GasSpec,
  opts: ComputeOptions,
  progress: Progressing,
  now: () => number,
): ComputeResult {
  const t0 = now();
  const digits = spec.precision!;
  const prec = bitsFor(digits + GUARD_DIGITS);
  const fermion = spec.statistics === 'fermion';
  const nMax = spec.nMax;
  const pace: Pace = {
    tick: progress.tick,
    ...(opts.shouldStop && { shouldStop: opts.shouldStop }),
  };

  progress.phase('weights', nMax);
  const w = numericWeights(spec, prec, pace);
  const t1 = now();

  progress.phase('recursion', nMax);
  const newton = newtonNumeric(w.weights, nMax, fermion, prec, pace);
  const t2 = now();

  const byRoute: Partial<Record<Route, Estimate[]>> = { recursion: newton };
  const methods: ComputeResult['methods'] = { recursion: { nMax } };
  if (w.kernel) {
    byRoute.fredholm = w.kernel.fredholm;
    methods.fredholm = {
      nMax,
      agrees: true,
      points: w.kernel.points[w.kernel.points.length - 1] ?? 0,
    };
  }
  if (w.spectrum) {
    progress.phase('product', w.spectrum.points.length);
    byRoute.product = productNumeric(w.spectrum.points, nMax, fermion, prec, w.spectrum.tail, pace);
    methods.product = { nMax, agrees: true, points: w.spectrum.points.length };
  }
  const t3 = now();

  const classes: ClassRowJson[] = [];
  const keep = opts.collectClasses ?? !(opts.onClass || opts.onClassText);
  if (spec.classTable > 0) {
    progress.phase('classSum', spec.classTable);
    const sums: Estimate[] = [{ value: newton[0]!.value, error: 0 }];
    for (let N = 1; N <= spec.classTable; N++) {
      sums.push(
        classSumNumeric(
          N,
          w.weights,
          fermion,
          prec,
          (row) => {
            const json: ClassRowJson = {
              ...row,
              contribution: toNumericJson(row.contribution, digits),
            };
            opts.onClass?.(json);
            opts.onClassText?.(JSON.stringify(json));
            if (keep) classes.push(json);
          },
          pace,
        ),
      );
      progress.step(N, spec.classTable);
    }
    byRoute.classSum = sums;
    methods.classSum = { nMax: spec.classTable, agrees: true };
  }
  const t4 = now();

  const canonical = newton.map((_, N) => {
    const routes = (Object.keys(byRoute) as Route[]).filter((r) => byRoute[r]![N] !== undefined);
    const ests = routes.map((r) => byRoute[r]![N]!);
    const shown = best(ests);
    const agrees = ests.every((a) => ests.every((b) => agreeWithin(a, b)));
    for (const r of routes) {
      const m = methods[r as 'fredholm' | 'product' | 'classSum'] as
        { agrees: boolean } | undefined;
      if (m && r !== 'recursion' && !agreeWithin(byRoute[r]![N]!, newton[N]!)) m.agrees = false;
    }
    const extras: NumericCanonicalExtras = {
      routeValues: Object.fromEntries(routes.map((r, i) => [r, toNumericJson(ests[i]!, digits)])),
    };
    return { N, value: toNumericJson(shown, digits), routes, agrees, ...extras, best: shown };
  });

  const truncations: ComputeResult['truncations'] = w.truncations.map((t) => ({
    field: 'weights',
    ...t,
  }));
  const q = fixedVariable(spec, prec, []);
  const canonicalEst = canonical.map((r) => r.best);
  const result: ComputeResult = {
    format: 'traceloom.result/1',
    spec,
    weights: w.weights.map((value, i) => ({ L: i + 1, value: toNumericJson(value, digits) })),
    canonical: canonical.map(({ best: _b, ...row }) => row),
    classes,
    methods,
    truncations,
    numeric: {
      precision: digits,
      workingBits: w.kernel?.workingBits ?? prec,
      errorEstimate: ERROR_ESTIMATE_TEXT,
      rule:
        w.kernel?.rule ??
        (w.spectrum ? 'spectrum summed over the lattice' : 'expressions evaluated at a number'),
      points: w.kernel?.points ?? [],
      parity: w.kernel?.parity ?? false,
    },
    timings: {
      totalMs: 0,
      weightsMs: t1 - t0,
      recursionMs: t2 - t1,
      productMs: t3 - t2,
      checksMs: 0,
      classesMs: t4 - t3,
    },
  };

  if (spec.grand) {
    progress.phase('grand', nMax);
    const list: { what: string; terms: number }[] = [];
    const g = grandCheckNumeric(spec, canonicalEst, w.weights, q, prec, list);
    result.grandCheck = g.rows;
    result.impliedWeights = g.impliedWeights;
    truncations.push(...list.map((t) => ({ field: 'grand', ...t })));
  }
  if (spec.reference) {
    progress.phase('reference', spec.reference.rows.length);
    const list: { what: string; terms: number }[] = [];
    result.referenceCheck = referenceCheckNumeric(spec, canonicalEst, q, prec, list);
    truncations.push(...list.map((t) => ({ field: 'reference', ...t })));
  }
  if (spec.recognize) recognizeRows(spec, canonicalEst, result, q, prec);
  const fitRows = canonicalEst
    .map((e, N) => ({ N, value: e.value, error: e.error }))
    .filter((r) => r.N >= 1 && r.value.m > 0n && r.error < size(r.value));
  if (nMax >= 4 && fitRows.length >= 4) {
    const airy = airyFit(fitRows);
    if (airy) result.largeN = { ...(result.largeN ?? {}), airy };
  }
  const t5 = now();
  result.timings.checksMs = t5 - t4;
  result.timings.totalMs = t5 - t0;
  return result;
}
