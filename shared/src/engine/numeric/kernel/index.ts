import { EngineError } from '../../errors.js';
import type { Estimate } from '../estimate.js';
import { add, bitsFor, fromNumber, ldexp, Real, sub, toNumber } from '../real.js';
import { type Arithmetic, levelResult, type LevelResult, nystromBlocks } from './level.js';
import type { FastCompiled } from '../expr/compile-dd.js';
import { pace } from './matrix.js';
import { type FastAt, fastAgrees, fastKernel, nystromBlocksDD } from './nystrom-dd.js';
import {
  circleFamily,
  halfLineFamily,
  intervalFamily,
  lineFamily,
  type Rule,
  type RuleFamily,
} from './quadrature.js';
import {
  checkSymmetric,
  guarded,
  hasParity,
  type KernelAt,
  samplePoints,
  tailMass,
  windowFor,
} from './sampling.js';

/** The kernel as compiled by the expression language: working bits -> (x, y) -> rho(x, y). */
export type KernelSource = (bits: number) => (values: Real[]) => Real;

export interface KernelDomain {
  from: Real | null;
  to: Real | null;
  periodic: boolean;
}

export interface KernelOptions {
  digits: number;
  nMax: number;
  fermion: boolean;
  shouldStop?: () => boolean;
  tick?: () => void;
  /** Largest Nystrom matrix (all blocks together) refinement may reach; default 4000. */
  maxPoints?: number;
  /** First finest resolution m (a multiple of 4); default from the digits. */
  resolution?: number;
  /** The kernel compiled to double-double (elementary expressions only), for the fast path. */
  fast?: FastCompiled | null;
  /** Receives one line per level and value (relative differences, errors) when set. */
  debug?: (line: string) => void;
}

/** What the discretisation of a kernel gives the numeric routes. */
export interface KernelOutcome {
  /** Z_1..Z_nMax = Tr rho^L, from products of the Nystrom matrix. */
  traces: Estimate[];
  /** Z(0..nMax) from det(1 + kappa rho) (fermions) or 1/det(1 - kappa rho) (bosons). */
  fredholm: Estimate[];
  /** Matrix sizes of the resolutions used (the last one gave the values). */
  points: number[];
  parity: boolean;
  rule: string;
  workingBits: number;
  /** Set when refinement stopped at the point cap before every value had its digits. */
  note?: string;
}

/**
 * Z_L = Tr rho^L (L = 1..nMax) and the canonical Z(N) of a symmetric kernel rho(x, y) on a line,
 * half-line, interval or circle, by Nystrom discretisation (Bornemann 2010): trapezoid after a
 * sinh map on the line, a double-exponential map on a half-line, Gauss-Legendre on an interval,
 * the periodic trapezoid on a circle; even and odd blocks when rho(2c - x, 2c - y) = rho(x, y).
 *
 * Three resolutions are compared (first m/4, m/2, m; then each new one extends the last two by
 * the step the measured convergence asks for, see `nextResolution`); the discretisation error of
 * the finest is estimated from the other two (`assemble`), plus the working-precision rounding and
 * the truncation of an infinite side (tail of the diagonal), until every value has opts.digits
 * significant digits; at the point cap the values are returned with their (large) errors and a
 * `note`. It is an estimate, not a proof.
 */
export function kernelTraces(
  source: KernelSource,
  domain: KernelDomain,
  opts: KernelOptions,
): KernelOutcome {
  const { digits: D, nMax, fermion } = opts;
  const maxPoints = opts.maxPoints ?? 4000;
  const paceOpts = {
    ...(opts.tick && { tick: opts.tick }),
    ...(opts.shouldStop && { shouldStop: opts.shouldStop }),
  };
  const { from, to, periodic } = domain;
  if (periodic && (from === null || to === null))
    throw new EngineError('a periodic kernel needs both ends of its circle', 'weights.periodic');
  let evalBits = bitsFor(D, 40);
  let rho: KernelAt = guarded(source(evalBits));
  // the checks, the window and the fast-path comparisons ask rho at the same few points again
  let sampled = remembered(rho);
  const pts = samplePoints(from, to, evalBits);
  checkSymmetric(sampled, pts, evalBits);
  const centre =
    from !== null && to !== null
      ? ldexp(add(from, to, evalBits), -1)
      : from === null && to === null
        ? new Real(0n, 0)
        : null;
  const parity = centre !== null && hasParity(sampled, centre, pts, evalBits);
  const target = 10 ** -D;

  // the cut of the infinite sides and the family of rules
  const diag0 = Math.abs(toNumber(sampled(centre ?? (from ?? to)!, centre ?? (from ?? to)!)));
  const makeFamily = (tol: number): { family: RuleFamily; tail: () => number } => {
    if (from !== null && to !== null) {
      const family = periodic
        ? circleFamily(from, to, evalBits)
        : intervalFamily(from, to, evalBits);
      return { family, tail: () => 0 };
    }
    if (from === null && to === null) {
      const c = new Real(0n, 0);
      const X = Math.max(
        windowFor(sampled, c, 1, tol, evalBits),
        windowFor(sampled, c, -1, tol, evalBits),
      );
      const Xr = fromNumber(Math.ceil(X));
      return {
        family: lineFamily(Xr, evalBits),
        tail: () =>
          tailMass(sampled, c, 1, toNumber(Xr), evalBits) +
          tailMass(sampled, c, -1, toNumber(Xr), evalBits),
      };
    }
    const a = (from ?? to)!;
    const dir = from !== null ? 1 : -1;
    const X = Math.ceil(windowFor(sampled, a, dir, tol, evalBits));
    return {
      family: halfLineFamily(a, dir, fromNumber(X), tol, evalBits),
      tail: () => tailMass(sampled, a, dir, X, evalBits),
    };
  };
  let tol = target * 1e-3 * Math.max(diag0, 1e-300);
  let { family, tail } = makeFamily(tol);

  // provisional pass at the coarsest level: sizes of the Z's choose the working bits and the cut
  const m = opts.resolution ?? initialResolution(D, family);
  let F = bitsFor(D, 32) + 2 * Math.ceil(Math.log2(4 * m + 8));
  let cache = new Map<string, Real>();
  let arithmetic: Arithmetic = 'fixed';
  let fastAt: FastAt | null = null;
  let entryBits = 0;
  // a rule is built once per family and resolution (in Real arithmetic: a tenth of a warm run)
  const rules = new WeakMap<RuleFamily, Map<number, Rule>>();
  const ruleAt = (mm: number): Rule => {
    let kept = rules.get(family);
    if (!kept) rules.set(family, (kept = new Map()));
    let rule = kept.get(mm);
    if (!rule) kept.set(mm, (rule = family.at(mm)));
    return rule;
  };
  const run = (mm: number): LevelResult => {
    const rule = ruleAt(mm);
    const blocks = fastAt
      ? nystromBlocksDD(rule, fastAt, parity, entryBits, paceOpts)
      : nystromBlocks(rule, rho, parity, cache, evalBits, F, paceOpts);
    return levelResult(blocks, nMax, fermion, F, arithmetic, paceOpts);
  };
  // the coarse pass only sizes things: double-double entries when the kernel allows them
  if (opts.fast && fastAgrees(opts.fast, sampled, pts, PROBE_BITS)) {
    fastAt = fastKernel(opts.fast, rho);
    entryBits = PROBE_BITS;
    arithmetic = 'dd';
  }
  const probe = run(Math.max(2, m / 4));
  const need = requirements(probe, D, nMax, m * 4);
  // double-double when its 104 bits hold what the values need, relative to the matrix norm
  arithmetic = need.fitsDD ? 'dd' : 'fixed';
  fastAt = null;
  F = arithmetic === 'dd' ? Math.max(F, need.relative + 8) : Math.max(F, need.fixed);
  if (F + 24 > evalBits) {
    evalBits = F + 32;
    rho = guarded(source(evalBits));
    sampled = remembered(rho);
    cache = new Map();
  }
  // entries in double-double too, when the expression is elementary and agrees with the Real
  // evaluator on the sample points to the bits the values need
  if (arithmetic === 'dd' && opts.fast && fastAgrees(opts.fast, sampled, pts, need.ddBits)) {
    fastAt = fastKernel(opts.fast, rho);
    entryBits = need.ddBits;
  }
  if (need.tail < tol && (from === null || to === null)) {
    tol = need.tail;
    ({ family, tail } = makeFamily(tol));
    cache = new Map();
  }

  const levels = new Map<number, LevelResult>();
  const level = (mm: number): LevelResult => {
    let r = levels.get(mm);
    if (!r) {
      r = run(mm);
      levels.set(mm, r);
    }
    pace(paceOpts);
    return r;
  };
  const tailNow = tail();
  // three resolutions; after the first (m/4, m/2, m) each new one extends the last two by the
  // smallest step the measured convergence says will do (at least the last gap, at most twice)
  let trip: [number, number, number] = [m / 4, m / 2, m];
  for (;;) {
    const ls = trip.map(level) as [LevelResult, LevelResult, LevelResult];
    const r = (trip[2] - trip[1]) / (trip[1] - trip[0]);
    const out = assemble(ls[0], ls[1], ls[2], r, tailNow, nMax, fermion, D);
    const done = converged(out, D);
    if (opts.debug) debugLevels(opts.debug, trip[2], ls, out);
    const next = done ? trip[2] : nextResolution(trip, out, D);
    const nextTooBig = family.points(next) > maxPoints;
    if (done || nextTooBig) {
      const l3 = ls[2];
      const rule = ruleAt(trip[2]);
      const blocksText = parity ? `; even and odd blocks of ${l3.blocks.join(' and ')}` : '';
      const result: KernelOutcome = {
        traces: out.traces,
        fredholm: out.fredholm,
        points: ls.map((l) => l.points),
        parity,
        rule: `${rule.text}${blocksText}`,
        workingBits: arithmetic === 'dd' ? 104 : F,
      };
      if (!done) {
        const worst = Math.min(...[...out.traces, ...out.fredholm].map((e) => shownDigits(e, D)));
        result.note = `the discretisation did not converge: ${worst} digits certified at ${l3.points} points`;
      }
      return result;
    }
    trip = [trip[1], trip[2], next];
  }
}

/** rho with its values kept per point (for the few sample points, never for a whole grid). */
function remembered(rho: KernelAt): KernelAt {
  const kept = new Map<string, Real>();
  return (x, y) => {
    const key = `${x.m}p${x.e},${y.m}p${y.e}`;
    let v = kept.get(key);
    if (v === undefined) {
      v = rho(x, y);
      kept.set(key, v);
    }
    return v;
  };
}

/**
 * The next finest resolution after (mA, mB, mC): mC + r (mC - mB) for the smallest r in
 * [1, 2] (m in steps of 2) whose predicted errors (the estimate rule of `assemble` applied once more with
 * the measured convergence) meet the digits; 3/2 when none does.
 */
function nextResolution(trip: [number, number, number], out: Assembled, D: number): number {
  const [, mB, mC] = trip;
  for (let j = Math.ceil((mC - mB) / 2); j <= mC - mB; j++) {
    const r = (2 * j) / (mC - mB);
    const ok = (e: Estimate, p: Parts, floor: number): boolean => {
      const shrink = p.gap > 0 && p.disc > 0 ? Math.min(1, (p.disc / p.gap) ** (r / 2)) : 0;
      const predicted = p.disc * shrink + p.rest;
      return predicted <= 0.1 * 10 ** -D * Math.abs(toNumber(e.value)) || predicted <= floor;
    };
    const all =
      out.traces.every((e, i) => ok(e, out.parts.traces[i]!, out.floors.traces[i]!)) &&
      out.fredholm.every((e, i) => ok(e, out.parts.fredholm[i]!, out.floors.fredholm[i]!));
    if (all) return mC + 2 * j;
  }
  // no step is predicted to suffice (the prediction rests on the coarser, slower levels): the
  // middle step, whose n^3 cost is less than half a doubling's
  return mC + Math.ceil((1.5 * (mC - mB)) / 2) * 2;
}

/** A first guess of the finest resolution for D digits (refinement corrects it). */
function initialResolution(D: number, family: RuleFamily): number {
  const m = Math.ceil((D * (family.nested ? 4.5 : 2.2)) / 4) * 4;
  return Math.max(8, m);
}

/** Bits the coarse sizing pass needs of its double-double entries. */
const PROBE_BITS = 60;

/** Largest relative precision (bits, guard included) the double-double path (104) is given. */
const DD_BITS = 100;

/**
 * Working bits and the diagonal tail the requested digits need, from a coarse pass: the digits,
 * the size of the matrix, the smallness of Z(N) against e_(N-1)(|lambda|) (Fredholm rounding).
 * `fitsDD` says whether a double-double reduction holds them; `fixed` adds what absolute rounding
 * in fixed point costs on small Z(N).
 */
function requirements(
  probe: LevelResult,
  D: number,
  nMax: number,
  points: number,
): { fitsDD: boolean; ddBits: number; relative: number; fixed: number; tail: number } {
  const z = probe.fredholm.map((v) => Math.abs(toNumber(v)));
  const t = probe.traces.map((v) => Math.abs(toNumber(v)));
  let loss = 0;
  let small = 0;
  let tail = Infinity;
  const lgn = 2 * Math.ceil(Math.log2(points + 8));
  for (let N = 1; N <= nMax; N++) {
    const noise = 1e-12 * probe.absSymmetric[N]! + 1e-300;
    if (z[N]! <= noise) continue;
    // the Fredholm route rounds against e_(N-1)(|lambda|); the Newton recursion's own
    // cancellation is not paid for here: that route shows the digits it keeps
    const scale = Math.max(probe.absSymmetric[N - 1]!, probe.absSymmetric[N]!);
    loss = Math.max(loss, Math.log2(scale / z[N]!));
    small = Math.max(small, Math.log2((4 * N * points) / (0.01 * 10 ** -D * z[N]!)));
    tail = Math.min(tail, (0.01 * 10 ** -D * z[N]!) / Math.max(probe.absSymmetric[N - 1]!, 1e-300));
  }
  for (let L = 1; L <= nMax; L++)
    if (t[L - 1]! > 0)
      tail = Math.min(
        tail,
        (0.01 * 10 ** -D * t[L - 1]!) / (L * Math.max(probe.norm, 1e-300) ** (L - 1)),
      );
  const lost = Math.ceil(Math.min(loss, 4 * D * 3.33));
  const relative = bitsFor(D, 24) + lgn + lost;
  const ddBits = bitsFor(D, 8) + lgn + lost;
  return {
    fitsDD: ddBits <= DD_BITS,
    ddBits,
    relative,
    fixed: Math.max(relative, Math.ceil(small) + 8),
    tail,
  };
}

/** Parts of one value's error: discretisation estimate, the last gap |V_C - V_B|, the rest. */
interface Parts {
  disc: number;
  gap: number;
  rest: number;
}

interface Assembled {
  traces: Estimate[];
  fredholm: Estimate[];
  parts: { traces: Parts[]; fredholm: Parts[] };
  floors: { traces: number[]; fredholm: number[] };
}

/**
 * Values of the finest level with discretisation + rounding + truncation error estimates. With
 * dA = |V_C - V_A| and dB = |V_C - V_B| for resolutions mA < mB < mC and r = (mC - mB) / (mB -
 * mA), the discretisation error of V_C is estimated as dB * min(1, (dB / dA)^(r/2)): half the
 * convergence rate measured between A and B, carried over the step from B to C (exponential
 * convergence squares the error per doubling; the estimate stays above that model).
 */
function assemble(
  l1: LevelResult,
  l2: LevelResult,
  l3: LevelResult,
  r: number,
  tail: number,
  nMax: number,
  fermion: boolean,
  D: number,
): Assembled {
  const parts = (a: Real, b: Real, c: Real, rest: number): Parts => {
    const d1 = Math.abs(toNumber(sub(c, a, 200)));
    const d2 = Math.abs(toNumber(sub(c, b, 200)));
    const disc = d2 === 0 ? 0 : d1 > 0 ? d2 * Math.min(1, (d2 / d1) ** (r / 2)) : d2;
    return { disc, gap: d2, rest };
  };
  const traceParts = l3.traces.map((v, i) => {
    const L = i + 1;
    const trunc = L * tail * Math.max(l3.norm, 0) ** (L - 1);
    return parts(l1.traces[i]!, l2.traces[i]!, v, l3.roundTraces[i]! + trunc);
  });
  const fredholmParts = l3.fredholm.map((v, N) => {
    if (N === 0) return { disc: 0, gap: 0, rest: 0 };
    const prev = fermion ? l3.absSymmetric[N - 1]! : N * Math.abs(toNumber(l3.fredholm[N - 1]!));
    return parts(l1.fredholm[N]!, l2.fredholm[N]!, v, l3.roundFredholm[N]! + tail * prev);
  });
  const total = (p: Parts): number => p.disc + p.rest;
  return {
    traces: l3.traces.map((v, i) => ({ value: v, error: total(traceParts[i]!) })),
    fredholm: l3.fredholm.map((v, N) => ({ value: v, error: total(fredholmParts[N]!) })),
    parts: { traces: traceParts, fredholm: fredholmParts },
    // a value that is zero (finite rank) is noise at the level of the discretisation of its
    // neighbours: below 10^-2D of its natural scale it counts as determined (absolute error)
    floors: {
      traces: l3.roundTraces.map((rr, i) => Math.max(2 * rr, 10 ** (-2 * D) * l3.norm ** (i + 1))),
      fredholm: l3.roundFredholm.map((rr, N) =>
        N === 0 ? 0 : Math.max(2 * rr, 10 ** (-2 * D) * l3.absSymmetric[N - 1]! * l3.norm),
      ),
    },
  };
}

/** Every value has D significant digits, or is zero within its rounding (nothing to refine). */
function converged(out: Assembled, D: number): boolean {
  const ok = (e: Estimate, floor: number): boolean =>
    e.error <= 0.5 * 10 ** -D * Math.abs(toNumber(e.value)) || e.error <= floor;
  return (
    out.traces.every((e, i) => ok(e, out.floors.traces[i]!)) &&
    out.fredholm.every((e, i) => ok(e, out.floors.fredholm[i]!))
  );
}

function shownDigits(e: Estimate, D: number): number {
  const v = Math.abs(toNumber(e.value));
  if (e.error === 0) return D;
  if (v === 0) return 0;
  return Math.max(0, Math.min(D, Math.floor(Math.log10(v / (2 * e.error))) + 1));
}

function debugLevels(
  print: (line: string) => void,
  m: number,
  ls: LevelResult[],
  out: Assembled,
): void {
  print(`m = ${m}: points ${ls.map((l) => l.points).join(', ')}`);
  for (let N = 1; N < out.fredholm.length; N++) {
    const v = out.fredholm[N]!.value;
    const d = ls.map(
      (l) => Math.abs(toNumber(sub(l.fredholm[N]!, v, 300))) / Math.abs(toNumber(v)),
    );
    print(
      `  Z(${N}) rel diffs ${d.map((x) => x.toExponential(1)).join(' ')} err ${(out.fredholm[N]!.error / Math.abs(toNumber(v))).toExponential(1)} round ${(ls[2]!.roundFredholm[N]! / Math.abs(toNumber(v))).toExponential(1)}`,
    );
  }
}
