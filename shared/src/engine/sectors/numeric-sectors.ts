import type { Truncation } from '../expr/evaluate.js';
import type {
  ClassRowJson,
  ComputeOptions,
  ComputeResult,
  Route,
  SectorRowJson,
} from '../result.js';
import type { GasSpec } from '../spec/schema.js';
import { grandCheckNumeric, referenceCheckNumeric } from '../numeric/checks.js';
import { ERROR_ESTIMATE_TEXT } from '../numeric/compute-numeric.js';
import {
  addEstimates,
  agreeWithin,
  best,
  exact,
  mulEstimates,
  size,
  toNumericJson,
  type Estimate,
} from '../numeric/estimate.js';
import { airyFit } from '../numeric/airy-fit.js';
import { fromInt, neg, ONE, ZERO } from '../numeric/real.js';
import { recognizeRows } from '../numeric/recognize-rows.js';
import type { SectorProgress } from './compute-sectors.js';
import {
  NumericSectorWalk,
  numericSectorContext,
  numericSectorPart,
  type NumericSectorContext,
  type NumericSectorPart,
} from './numeric-part.js';
import { ZERO_CONVENTION } from './walk.js';

const zero = (): Estimate => ({ value: ZERO, error: 0 });

/**
 * Numeric mode with sectors: per sector the numeric gas with the indices bound (Newton recursion,
 * product form for spectra, class rows), summed as w(n) Z_n(N) with propagated errors, shell by
 * shell until `NumericSectorWalk` stops (see there); the left-out sectors are estimated by
 * extending the last two shells geometrically (an estimate: it assumes the decay goes on) and added
 * to the error. The sectors are computed here one after another; the server spreads the same parts
 * over its worker pool and sums them with `assembleNumericSectors`.
 */
export function computeNumericSectors(
  spec: GasSpec,
  opts: ComputeOptions,
  progress: SectorProgress,
  now: () => number,
): ComputeResult {
  const t0 = now();
  const ctx = numericSectorContext(spec, {
    tick: progress.tick,
    ...(opts.shouldStop && { shouldStop: opts.shouldStop }),
  });
  const walk = new NumericSectorWalk(spec);
  const parts: NumericSectorPart[] = [];
  progress.phase('sectors', 0);
  for (let list = walk.next(); list !== null; list = walk.next()) {
    const shellParts: NumericSectorPart[] = [];
    for (const n of list) {
      shellParts.push(numericSectorPart(ctx, n));
      progress.step(parts.length + shellParts.length, 0);
    }
    walk.accept(shellParts.map((p) => p.terms));
    parts.push(...shellParts);
  }
  return assembleNumericSectors(spec, walk, parts, opts, now() - t0, now, ctx);
}

/**
 * The result of a numeric sector sum from its computed sectors (in walk order) and the finished
 * walk: the summed routes with the tail estimate in the error, the class table summed over
 * sectors, the checks, recognition and the Airy fit.
 */
export function assembleNumericSectors(
  spec: GasSpec,
  walk: NumericSectorWalk,
  parts: readonly NumericSectorPart[],
  opts: ComputeOptions,
  sectorsMs: number,
  now: () => number,
  context?: NumericSectorContext,
): ComputeResult {
  const t0 = now() - sectorsMs;
  const ctx = context ?? numericSectorContext(spec);
  const { digits, prec, q, fermion } = ctx;
  const nMax = spec.nMax;
  const index = spec.sectors!.index;
  const bounded = walk.bounded;
  const tol = walk.tol;
  const scale = walk.scale;
  const truncations: Truncation[] = [...ctx.truncations];
  const most = new Map<string, number>();
  for (const p of parts)
    for (const t of p.truncations) most.set(t.what, Math.max(most.get(t.what) ?? 0, t.terms));
  for (const [what, terms] of most) truncations.push({ what, terms });
  const sums: Partial<Record<Route, Estimate[]>> = {};
  const add = (route: Route, table: readonly Estimate[]): void => {
    const acc = (sums[route] ??= [exact(ONE), ...Array.from({ length: nMax }, zero)]);
    for (let N = 1; N <= nMax; N++) acc[N] = addEstimates(acc[N]!, table[N]!, prec);
  };
  const classSums = new Map<string, { row: ClassRowJson; est: Estimate }>();
  let points = 0;
  const rows: (SectorRowJson & { terms: number[] })[] = [];
  for (const part of parts) {
    add('recursion', part.recursion);
    if (part.product) add('product', part.product);
    points += part.points;
    for (const { key, row, c } of part.classes) {
      const old = classSums.get(key);
      classSums.set(key, {
        row: old?.row ?? { ...row, contribution: toNumericJson(c, digits) },
        est: old ? addEstimates(old.est, c, prec) : c,
      });
    }
    rows.push({
      index: part.index,
      weight: toNumericJson(part.weight, digits),
      valuations: [],
      magnitudes: part.terms.slice(1).map((t) => (t > 0 ? Math.log10(t) : null)),
      contributes: [],
      contributed: false,
      terms: part.terms,
    });
  }
  sums.recursion ??= [exact(ONE), ...Array.from({ length: nMax }, zero)];
  const shellCount = walk.shellSums.length;
  const tails = walk.tails();
  return assemble();

  function assemble(): ComputeResult {
    const t1 = now();
    for (const row of rows) {
      row.contributes = row.terms.slice(1).map((t, i) => t > tol * scale[i + 1]!);
      row.contributed = row.contributes.some(Boolean);
    }
    const byRoute = sums as Record<string, Estimate[]>;
    if (spec.classTable > 0) {
      const cs: Estimate[] = [exact(ONE)];
      for (let N = 1; N <= spec.classTable; N++) cs.push(zero());
      for (const { row, est } of classSums.values())
        cs[row.N] = addEstimates(cs[row.N]!, est, prec);
      byRoute.classSum = cs;
    }
    for (const table of Object.values(byRoute))
      for (let N = 1; N < table.length; N++)
        table[N] = { ...table[N]!, error: table[N]!.error + tails[N]! };
    const methods: ComputeResult['methods'] = { recursion: { nMax } };
    if (byRoute.product) methods.product = { nMax, agrees: true, points };
    if (byRoute.classSum) methods.classSum = { nMax: spec.classTable, agrees: true };
    const canonicalEst: Estimate[] = [];
    const canonical = byRoute.recursion!.map((_, N) => {
      const routes = (Object.keys(byRoute) as Route[]).filter((k) => byRoute[k]![N] !== undefined);
      const ests = routes.map((k) => byRoute[k]![N]!);
      const agrees = ests.every((a) => ests.every((b) => agreeWithin(a, b)));
      for (const k of routes)
        if (k !== 'recursion' && !agreeWithin(byRoute[k]![N]!, byRoute.recursion![N]!))
          (methods[k as 'product' | 'classSum'] as { agrees: boolean }).agrees = false;
      const shown = best(ests);
      canonicalEst.push(shown);
      const made = N === 0 ? 0 : rows.filter((s) => s.contributes[N - 1]).length;
      return { N, value: toNumericJson(shown, digits), routes, agrees, sectors: made };
    });
    const classes = [...classSums.values()].map(({ row, est }) => ({
      ...row,
      contribution: toNumericJson(est, digits),
    }));
    const keep = opts.collectClasses ?? !(opts.onClass || opts.onClassText);
    for (const c of classes) {
      opts.onClass?.(c);
      opts.onClassText?.(JSON.stringify(c));
    }
    const result: ComputeResult = {
      format: 'traceloom.result/1',
      spec,
      weights: [],
      canonical,
      classes: keep ? classes : [],
      methods,
      truncations: truncations.map((t) => ({ field: 'weights', ...t })),
      numeric: {
        precision: digits,
        workingBits: prec,
        errorEstimate: ERROR_ESTIMATE_TEXT,
        rule: bounded
          ? `every sector of the bounded ranges summed (${rows.length} sectors)`
          : `sectors summed shell by shell over ${shellCount} shells (${rows.length} sectors) until two shells stayed below 10^-${digits + 2} of the largest contribution of each row; the left-out sectors are estimated geometrically from the last two shells and added to the error (an estimate, not a bound)`,
        points: [],
        parity: false,
      },
      sectors: {
        index: [...index],
        count: rows.length,
        contributing: rows.filter((s) => s.contributed).length,
        truncated: !bounded,
        rule: '',
        convention: ZERO_CONVENTION,
        rows: rows.map(({ terms: _t, ...row }) => row),
      },
      timings: {
        totalMs: 0,
        weightsMs: t1 - t0,
        recursionMs: 0,
        productMs: 0,
        checksMs: 0,
        classesMs: 0,
      },
    };
    result.sectors!.rule = result.numeric!.rule;
    if (spec.grand) {
      const g = grandCheckNumeric(
        spec,
        canonicalEst,
        impliedNumeric(canonicalEst, nMax, fermion, prec),
        q,
        prec,
        [],
      );
      result.grandCheck = g.rows;
      result.impliedWeights = g.impliedWeights;
    }
    if (spec.reference)
      result.referenceCheck = referenceCheckNumeric(spec, canonicalEst, q, prec, []);
    if (spec.recognize) recognizeRows(spec, canonicalEst, result, q, prec);
    const fit = canonicalEst
      .map((e, N) => ({ N, value: e.value, error: e.error }))
      .filter((x) => x.N >= 1 && x.value.m > 0n && x.error < size(x.value));
    if (nMax >= 4 && fit.length >= 4) {
      const airy = airyFit(fit);
      if (airy) result.largeN = { airy };
    }
    result.timings.totalMs = now() - t0;
    return result;
  }
}

/** Cycle weights of a numeric table by Newton's identities run backwards. */
function impliedNumeric(
  Z: readonly Estimate[],
  nMax: number,
  fermion: boolean,
  prec: number,
): Estimate[] {
  const w: Estimate[] = [];
  for (let L = 1; L <= nMax; L++) {
    let acc = mulEstimates(exact(fromInt(L)), Z[L]!, prec);
    for (let k = 1; k < L; k++) {
      const t = mulEstimates(w[k - 1]!, Z[L - k]!, prec);
      acc = addEstimates(acc, t, prec, fermion && k % 2 === 0 ? 1 : -1);
    }
    w.push(fermion && L % 2 === 0 ? { value: neg(acc.value), error: acc.error } : acc);
  }
  return w;
}
