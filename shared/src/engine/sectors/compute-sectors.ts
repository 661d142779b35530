import Fraction from 'fraction.js';
import { classRowJsonText } from '../canonical/class-text.js';
import { markHonestRows } from '../canonical/honest-rows.js';
import { runLargeN, runTableChecks, tagged } from '../checks/table-checks.js';
import { EngineError } from '../errors.js';
import { parseExpression } from '../expr/sandbox.js';
import { KSeries, kLog } from '../grand/kseries.js';
import { frac } from '../rational.js';
import type {
  ClassRowJson,
  ComputeOptions,
  ComputeResult,
  Progress,
  Route,
  SectorsJson,
} from '../result.js';
import { mul, scale } from '../series/arith.js';
import { compareSeries } from '../series/compare.js';
import { toValueJson } from '../series/format.js';
import { cutAt, Series } from '../series/series.js';
import { sumSeries } from '../series/sum.js';
import { isNumericSpec, type GasSpec } from '../spec/schema.js';
import { sectorPart, type SectorContext, type SectorPart } from './sector.js';
import { computeNumericSectors } from './numeric-sectors.js';
import { hasTerms, SectorWalk, ZERO_CONVENTION, type WeightedSector } from './walk.js';

/** What compute passes down: phases, throttled steps and cancellation. */
export interface SectorProgress {
  phase(p: Progress['phase'], total: number): void;
  step(done: number, total: number): void;
  tick(): void;
}

/** The context every sector of a spec is computed in. */
export function sectorContext(spec: GasSpec, opts: ComputeOptions = {}): SectorContext {
  if (isNumericSpec(spec))
    throw new EngineError('internal: a numeric sector sum has its own path', 'sectors');
  const cap = spec.order == null ? null : new Fraction(spec.order);
  const weightNode = parseExpression(spec.sectors!.weight, 'sectors.weight');
  return { spec, cap, weightNode, ...(opts.shouldStop && { shouldStop: opts.shouldStop }) };
}

/**
 * A gas with `sectors` (series mode): Z(N) = sum_n w(n) Z_n(N) for N >= 1 over the sectors the
 * walk visits, each sector's gas computed by `sectorPart`; the routes, the class table, the checks
 * and the large-N analysis on the summed table.
 */
export function computeSectors(
  spec: GasSpec,
  opts: ComputeOptions,
  progress: SectorProgress,
  now: () => number,
): ComputeResult {
  if (isNumericSpec(spec)) return computeNumericSectors(spec, opts, progress, now);
  const t0 = now();
  const ctx = { ...sectorContext(spec, opts), tick: progress.tick };
  const walk = new SectorWalk(spec, ctx.cap);
  progress.phase('sectors', walk.total);
  for (let list = walk.next(); list !== null; list = walk.next()) {
    const parts: SectorPart[] = [];
    for (const n of list) {
      parts.push(sectorPart(ctx, n));
      progress.step(walk.sectors.length + parts.length, walk.total);
    }
    walk.accept(parts);
  }
  return assembleSectors(spec, walk, opts, progress, now() - t0, now);
}

/** The weighted sum of one table over the sectors, cut at the order when the walk stopped early. */
function summed(
  sectors: readonly WeightedSector[],
  N: number,
  pick: (s: WeightedSector, j: number) => Series,
  cap: Fraction | null,
  truncated: boolean,
): Series {
  if (N === 0) return Series.constant(frac(1));
  const total = sumSeries(sectors.map(pick));
  return truncated && cap !== null ? cutAt(total, cap) : total;
}

/**
 * The result of a walked sector sum: the summed canonical table by every route, the class table
 * summed over sectors (streamed like compute's), the checks and the sector breakdown.
 */
export function assembleSectors(
  spec: GasSpec,
  walk: SectorWalk,
  opts: ComputeOptions,
  progress: SectorProgress,
  sectorsMs: number,
  now: () => number,
): ComputeResult {
  const t1 = now();
  const cap = spec.order == null ? null : new Fraction(spec.order);
  const nMax = spec.nMax;
  const fermion = spec.statistics === 'fermion';
  const truncated = !walk.bounded;
  const sectors = walk.sectors;
  const Z: Series[] = [];
  for (let N = 0; N <= nMax; N++) Z.push(summed(sectors, N, (s) => s.terms[N]!, cap, truncated));
  const routes: Route[][] = Z.map(() => ['recursion']);
  const agrees: boolean[] = Z.map(() => true);
  const methods: ComputeResult['methods'] = { recursion: { nMax } };
  const first = sectors[0]?.part;
  if (first?.product) {
    progress.phase('product', nMax);
    let all = true;
    const weighted = (s: WeightedSector, N: number): Series =>
      mul(s.part.weight, s.part.product![N]!, cap);
    for (let N = 0; N <= nMax; N++) {
      const X = summed(sectors, N, (s) => weighted(s, N), cap, truncated);
      routes[N]!.push('product');
      const ok = compareSeries(Z[N]!, X).agrees;
      agrees[N] = agrees[N]! && ok;
      all &&= ok;
    }
    const points = sectors.reduce((n, s) => n + (s.part.points ?? 0), 0);
    methods.product = { nMax, agrees: all, points };
  }
  const weights = impliedWeights(Z, nMax, fermion, cap);
  const result: ComputeResult = {
    format: 'traceloom.result/1',
    spec,
    weights: weights.map((value, i) => ({ L: i + 1, value: toValueJson(value) })),
    canonical: [],
    classes: [],
    methods,
    truncations: [],
    timings: {
      totalMs: 0,
      weightsMs: sectorsMs,
      recursionMs: 0,
      productMs: 0,
      checksMs: 0,
      classesMs: 0,
    },
  };
  for (const s of sectors) result.truncations.push(...tagged('weights', s.part.truncations));
  const t2 = now();
  runTableChecks(spec, Z, weights, cap, result, progress.phase);
  const t3 = now();
  classTable(spec, sectors, Z, cap, truncated, opts, result, progress, routes, agrees);
  const t4 = now();
  const breakdown = sectorBreakdown(spec, walk);
  result.canonical = Z.map((value, N) => ({
    N,
    value: toValueJson(value),
    routes: routes[N]!,
    agrees: agrees[N]!,
    sectors: N === 0 ? 0 : breakdown.rows.filter((r) => r.contributes[N - 1]).length,
  }));
  result.sectors = breakdown;
  markHonestRows(result, Z, weights);
  runLargeN(spec, Z, { variable: spec.variable, cap, nMax }, result);
  result.timings.productMs = t2 - t1;
  result.timings.checksMs = t3 - t2;
  result.timings.classesMs = t4 - t3;
  result.timings.totalMs = sectorsMs + now() - t1;
  return result;
}

/**
 * The cycle weights of the summed table, Z_L = L s^(L-1) [kappa^L] log(sum_N Z(N) kappa^N): the
 * weights whose Newton recursion gives the summed Z(N) (what the grand check compares with).
 */
export function impliedWeights(
  Z: readonly Series[],
  nMax: number,
  fermion: boolean,
  cap: Fraction | null,
): Series[] {
  const log = kLog(new KSeries([...Z], nMax), cap);
  const out: Series[] = [];
  for (let L = 1; L <= nMax; L++)
    out.push(scale(log.at(L), frac((fermion && L % 2 === 0 ? -1 : 1) * L)));
  return out;
}

/** The class table summed over sectors: per cycle type sum_n w(n) (its contribution in Z_n). */
function classTable(
  spec: GasSpec,
  sectors: readonly WeightedSector[],
  Z: readonly Series[],
  cap: Fraction | null,
  truncated: boolean,
  opts: ComputeOptions,
  result: ComputeResult,
  progress: SectorProgress,
  routes: Route[][],
  agrees: boolean[],
): void {
  if (spec.classTable === 0 || sectors.length === 0) return;
  progress.phase('classSum', spec.classTable);
  const keep = opts.collectClasses ?? !(opts.onClass || opts.onClassText);
  const rows = sectors[0]!.part.classes;
  const perN: Series[][] = [];
  for (let N = 0; N <= spec.classTable; N++) perN.push([]);
  const key = (N: number, t: [number, number][]): string => `${N}:${t.join(';')}`;
  const lookup = sectors.map((s) => {
    const m = new Map<string, Series>();
    for (const r of s.part.classes) m.set(key(r.N, r.cycleType), r.c);
    return m;
  });
  rows.forEach((row, i) => {
    const k = key(row.N, row.cycleType);
    const c = summed(
      sectors,
      row.N,
      (s, j) => mul(s.part.weight, lookup[j]!.get(k)!, cap),
      cap,
      truncated,
    );
    perN[row.N]!.push(c);
    const json: ClassRowJson = {
      N: row.N,
      cycleType: row.cycleType,
      size: row.size,
      sign: row.sign,
      contribution: toValueJson(c),
    };
    opts.onClass?.(json);
    opts.onClassText?.(classRowJsonText(json));
    if (keep) result.classes.push(json);
    if (i % 256 === 0) progress.tick();
  });
  let all = true;
  for (let N = 1; N <= spec.classTable; N++) {
    const total = sumSeries(perN[N]!);
    const ok = compareSeries(Z[N]!, truncated && cap ? cutAt(total, cap) : total).agrees;
    routes[N]!.push('classSum');
    agrees[N] = agrees[N]! && ok;
    all &&= ok;
  }
  routes[0]!.push('classSum');
  result.methods.classSum = { nMax: spec.classTable, agrees: all };
}

/** The `sectors` block: per sector its valuations and whether it contributed, and the rule. */
export function sectorBreakdown(spec: GasSpec, walk: SectorWalk): SectorsJson {
  const rows = walk.sectors.map(({ part, terms }) => {
    const valuations: (string | null)[] = [];
    const contributes: boolean[] = [];
    for (let N = 1; N <= spec.nMax; N++) {
      const z = part.canonical[N]!;
      valuations.push(hasTerms(z) ? z.valExponent()!.toFraction() : null);
      contributes.push(hasTerms(terms[N]!));
    }
    return {
      index: part.index,
      weight: toValueJson(part.weight),
      valuations,
      magnitudes: [],
      contributes,
      contributed: contributes.some(Boolean),
    };
  });
  const count = rows.length;
  const rule = walk.bounded
    ? `every sector of the bounded ranges was summed (${count} sectors).`
    : `sectors were summed shell by shell (growing max |n - centre|) over ${walk.shells} shells ` +
      `(${count} sectors); the sum stopped after shells with no contribution below the order ` +
      `O(${spec.variable}^${spec.order}) while the least valuations had stopped falling, so the ` +
      'omitted sectors are taken to lie beyond the order (evidence, not proof).';
  return {
    index: [...spec.sectors!.index],
    count,
    contributing: rows.filter((r) => r.contributed).length,
    truncated: !walk.bounded,
    rule,
    convention: ZERO_CONVENTION,
    rows,
  };
}
