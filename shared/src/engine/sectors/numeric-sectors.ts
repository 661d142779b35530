import { EngineError } from '../errors.js';
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
import { ERROR_ESTIMATE_TEXT, GUARD_DIGITS } from '../numeric/compute-numeric.js';
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
import { bitsFor, fromInt, neg, ONE, ZERO } from '../numeric/real.js';
import { recognizeRows } from '../numeric/recognize-rows.js';
import { classSumNumeric, newtonNumeric, productNumeric, type Pace } from '../numeric/routes.js';
import { fixedVariable, numericWeights, twoPrecision } from '../numeric/weights.js';
import type { SectorProgress } from './compute-sectors.js';
import { isBounded, lastShell, sectorBox, shell } from './enumerate.js';
import { MAX_SECTORS, QUIET_SHELLS, STALL_SHELLS, ZERO_CONVENTION } from './walk.js';

const zero = (): Estimate => ({ value: ZERO, error: 0 });

/**
 * Numeric mode with sectors: per sector the numeric gas with the indices bound (Newton recursion,
 * product form for spectra, class rows), summed as w(n) Z_n(N) with propagated errors. An
 * unbounded sum stops after QUIET_SHELLS shells whose every contribution lies below 10^-(D+2)
 * times the largest contribution of its row so far, with the shell maxima falling; the left-out
 * sectors are estimated by extending the last two shells geometrically (an estimate: it assumes
 * the decay goes on) and added to the error.
 */
export function computeNumericSectors(
  spec: GasSpec,
  opts: ComputeOptions,
  progress: SectorProgress,
  now: () => number,
): ComputeResult {
  const t0 = now();
  const digits = spec.precision!;
  const prec = bitsFor(digits + GUARD_DIGITS);
  const nMax = spec.nMax;
  const fermion = spec.statistics === 'fermion';
  const pace: Pace = {
    tick: progress.tick,
    ...(opts.shouldStop && { shouldStop: opts.shouldStop }),
  };
  const truncations: Truncation[] = [];
  const q = fixedVariable(spec, prec, truncations);
  const index = spec.sectors!.index;
  const names = [...index, ...(q === undefined ? [] : [spec.variable])];
  const weightOf = twoPrecision(spec.sectors!.weight, names, prec, 'sectors.weight', truncations);
  const box = sectorBox(spec.sectors!);
  const bounded = isBounded(box);
  const tol = 10 ** -(digits + 2);
  const sums: Partial<Record<Route, Estimate[]>> = { recursion: [exact(ONE)] };
  for (let N = 1; N <= nMax; N++) sums.recursion!.push(zero());
  const classSums = new Map<string, { row: ClassRowJson; est: Estimate }>();
  const scale = new Array<number>(nMax + 1).fill(0);
  const rows: (SectorRowJson & { terms: number[] })[] = [];
  const shellSums: number[][] = [];
  let quiet = 0;
  let points = 0;
  let record = Infinity;
  let since = 0;
  progress.phase('sectors', 0);
  for (let r = 0; ; r++) {
    if (bounded && r > lastShell(box)) break;
    const list = shell(box, r);
    if (rows.length + list.length > MAX_SECTORS)
      throw new EngineError(
        `the sector sum does not stop within ${MAX_SECTORS} sectors`,
        'sectors',
      );
    const here = new Array<number>(nMax + 1).fill(0);
    for (const n of list) {
      const at = n.map(fromInt);
      const w = weightOf([...at, ...(q === undefined ? [] : [q])]);
      const gas = numericWeights(spec, prec, pace, { names: index, values: at });
      const Z = newtonNumeric(gas.weights, nMax, fermion, prec, pace);
      const add = (route: Route, table: readonly Estimate[]): void => {
        const acc = (sums[route] ??= [exact(ONE), ...Array.from({ length: nMax }, zero)]);
        for (let N = 1; N <= nMax; N++)
          acc[N] = addEstimates(acc[N]!, mulEstimates(w, table[N]!, prec), prec);
      };
      add('recursion', Z);
      points += gas.spectrum?.points.length ?? 0;
      if (gas.spectrum)
        add(
          'product',
          productNumeric(gas.spectrum.points, nMax, fermion, prec, gas.spectrum.tail, pace),
        );
      for (let N = 1; N <= spec.classTable; N++)
        classSumNumeric(
          N,
          gas.weights,
          fermion,
          prec,
          (row) => {
            const key = `${N}:${row.cycleType.join(';')}`;
            const c = mulEstimates(w, row.contribution, prec);
            const old = classSums.get(key);
            const { contribution: _c, ...rest } = row;
            classSums.set(key, {
              row: { ...rest, contribution: toNumericJson(c, digits) },
              est: old ? addEstimates(old.est, c, prec) : c,
            });
          },
          pace,
        );
      const terms = Z.map((z) => size(w.value) * size(z.value));
      for (let N = 1; N <= nMax; N++) {
        scale[N] = Math.max(scale[N]!, terms[N]!);
        here[N] = here[N]! + terms[N]!;
      }
      rows.push({
        index: n,
        weight: toNumericJson(w, digits),
        valuations: [],
        magnitudes: terms.slice(1).map((t) => (t > 0 ? Math.log10(t) : null)),
        contributes: [],
        contributed: false,
        terms,
      });
      progress.step(rows.length, 0);
    }
    shellSums.push(here);
    if (bounded) continue;
    const peak = Math.max(...here.slice(1));
    const silent = here.every((t, N) => N === 0 || t <= tol * scale[N]!);
    quiet = silent ? quiet + 1 : 0;
    if (peak < record) {
      record = peak;
      since = 0;
    } else if (++since > STALL_SHELLS)
      throw new EngineError(
        'the sector sum does not converge: the contributions stop falling',
        'sectors',
      );
    if (quiet >= QUIET_SHELLS && shellSums.length >= 2) break;
  }
  const tails = bounded ? new Array<number>(nMax + 1).fill(0) : tailOf(shellSums, nMax);
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
          : `sectors summed shell by shell over ${shellSums.length} shells (${rows.length} sectors) until two shells stayed below 10^-${digits + 2} of the largest contribution of each row; the left-out sectors are estimated geometrically from the last two shells and added to the error (an estimate, not a bound)`,
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

/** The left-out sectors per row, estimated by extending the last two shells' sums geometrically. */
function tailOf(shells: number[][], nMax: number): number[] {
  const last = shells[shells.length - 1]!;
  const prev = shells[shells.length - 2]!;
  const tails = [0];
  for (let N = 1; N <= nMax; N++) {
    const ratio = Math.min(prev[N]! > 0 ? last[N]! / prev[N]! : 0, 0.9);
    tails.push((last[N]! * ratio) / (1 - ratio) + last[N]!);
  }
  return tails;
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
