/**
 * The independent routes checked against the Newton recursion's table: the product form of the
 * grand function over a spectrum, and the class sum for N <= classTable. Each records, per N, the
 * routes that produced Z(N) and whether they all agree.
 */
import type Fraction from 'fraction.js';
import type { ClassRowJson, ComputeOptions, ComputeResult, Route } from '../result.js';
import { compareSeries } from '../series/compare.js';
import { toValueJson } from '../series/format.js';
import type { Series } from '../series/series.js';
import type { CycleWeights } from '../weights.js';
import { classRowJsonText } from './class-text.js';
import { classSum, type ClassRow } from './classes.js';
import { spectrumProduct } from './product.js';

/** Per N: the routes that gave Z(N) and whether they agree with the recursion. */
export class RouteLedger {
  readonly routes: Route[][];
  readonly agrees: boolean[];
  constructor(readonly Z: readonly Series[]) {
    this.routes = Z.map(() => ['recursion']);
    this.agrees = Z.map(() => true);
  }

  /** Records route `route` for Z(N) with value `value`; returns whether it agrees. */
  record(N: number, route: Route, value?: Series): boolean {
    this.routes[N]!.push(route);
    const ok = value === undefined || compareSeries(this.Z[N]!, value).agrees;
    this.agrees[N] = this.agrees[N]! && ok;
    return ok;
  }
}

/** What both route checks need about the gas. */
export interface RouteContext {
  readonly nMax: number;
  readonly fermion: boolean;
  readonly cap: Fraction | null;
  readonly step: (done: number, total: number) => void;
  readonly tick: () => void;
}

/** The product form over the spectrum's lattice points, compared for every N. */
export function checkProductRoute(
  spectrum: NonNullable<CycleWeights['spectrum']>,
  ctx: RouteContext,
  ledger: RouteLedger,
): NonNullable<ComputeResult['methods']['product']> {
  const { nMax, fermion, cap } = ctx;
  const X = spectrumProduct(spectrum.points, nMax, fermion, cap, spectrum.truncated, ctx.step);
  let all = true;
  for (let N = 0; N <= nMax; N++) all = ledger.record(N, 'product', X[N]!) && all;
  return { nMax, agrees: all, points: spectrum.points.length };
}

/**
 * The class tables of S_1..S_classTable: each row streamed to the caller (as JSON, as text, or
 * kept in `rows`), each class sum compared with the recursion.
 */
export function checkClassSums(
  weights: readonly Series[],
  classTable: number,
  ctx: RouteContext,
  opts: ComputeOptions,
  ledger: RouteLedger,
  rows: ClassRowJson[],
): NonNullable<ComputeResult['methods']['classSum']> {
  const keep = opts.collectClasses ?? !(opts.onClass || opts.onClassText);
  const onText = opts.onClassText;
  // exact rows go straight to text when nobody needs the row objects
  const lean = onText && !keep && !opts.onClass ? onText : undefined;
  const emit = (row: ClassRow): void => {
    const json: ClassRowJson = {
      N: row.N,
      cycleType: row.cycleType,
      size: row.size,
      sign: row.sign,
      contribution: toValueJson(row.contribution),
    };
    opts.onClass?.(json);
    onText?.(classRowJsonText(json));
    if (keep) rows.push(json);
  };
  let all = true;
  for (let N = 1; N <= classTable; N++) {
    const sum = classSum(N, weights, ctx.fermion, ctx.cap, emit, ctx.tick, lean);
    all = ledger.record(N, 'classSum', sum) && all;
    ctx.step(N, classTable);
  }
  ledger.record(0, 'classSum');
  return { nMax: classTable, agrees: all };
}
