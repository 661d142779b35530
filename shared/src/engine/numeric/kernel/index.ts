import { EngineError } from '../../errors.js';
import type { Estimate } from '../estimate.js';
import { add, bitsFor, fromNumber, ldexp, Real, sub, toNumber } from '../real.js';
import { type Arithmetic, levelResult, type LevelResult, nystromBlocks } from './level.js';
import { pace } from './matrix.js';
import {
  circleFamily,
  halfLineFamily,
  intervalFamily,
  lineFamily,
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
 * Three nested resolutions m/4, m/2, m are computed; with d1 = |V_m - V_(m/4)| and d2 = |V_m -
 * V_(m/2)| the discretisation error of V_m is estimated as d2 * min(1, d2 / d1) (exponential
 * convergence squares the error per doubling; the estimate stays above that model), plus the
 * working-precision rounding and the truncation of an infinite side (tail of the diagonal). m
 * doubles until every value has opts.digits significant digits; at the point cap the values are
 * returned with their (large) errors and a `note`. It is an estimate, not a proof.
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
  const pts = samplePoints(from, to, evalBits);
  checkSymmetric(rho, pts, evalBits);
  const centre =
    from !== null && to !== null
      ? ldexp(add(from, to, evalBits), -1)
      : from === null && to === null
        ? new Real(0n, 0)
        : null;
  const parity = centre !== null && hasParity(rho, centre, pts, evalBits);
  const target = 10 ** -D;

  // the cut of the infinite sides and the family of rules
  const diag0 = Math.abs(toNumber(rho(centre ?? (from ?? to)!, centre ?? (from ?? to)!)));
  const makeFamily = (tol: number): { family: RuleFamily; tail: () => number } => {
    if (from !== null && to !== null) {
      const family = periodic
        ? circleFamily(from, to, evalBits)
        : intervalFamily(from, to, evalBits);
      return { family, tail: () => 0 };
    }
    if (from === null && to === null) {
      const c = new Real(0n, 0);
      const X = Math.max(windowFor(rho, c, 1, tol, evalBits), windowFor(rho, c, -1, tol, evalBits));
      const Xr = fromNumber(Math.ceil(X));
      return {
        family: lineFamily(Xr, evalBits),
        tail: () =>
          tailMass(rho, c, 1, toNumber(Xr), evalBits) +
          tailMass(rho, c, -1, toNumber(Xr), evalBits),
      };
    }
    const a = (from ?? to)!;
    const dir = from !== null ? 1 : -1;
    const X = Math.ceil(windowFor(rho, a, dir, tol, evalBits));
    return {
      family: halfLineFamily(a, dir, fromNumber(X), tol, evalBits),
      tail: () => tailMass(rho, a, dir, X, evalBits),
    };
  };
  let tol = target * 1e-3 * Math.max(diag0, 1e-300);
  let { family, tail } = makeFamily(tol);

  // provisional pass at the coarsest level: sizes of the Z's choose the working bits and the cut
  let m = opts.resolution ?? initialResolution(D, family);
  let F = bitsFor(D, 32) + 2 * Math.ceil(Math.log2(4 * m + 8));
  let cache = new Map<string, Real>();
  let arithmetic: Arithmetic = 'fixed';
  const run = (mm: number): LevelResult => {
    const rule = family.at(mm);
    const blocks = nystromBlocks(rule, rho, parity, cache, evalBits, F, paceOpts);
    return levelResult(blocks, nMax, fermion, F, arithmetic, paceOpts);
  };
  const probe = run(Math.max(2, m / 4));
  const need = requirements(probe, D, nMax, m * 4);
  // double-double when its 104 bits hold what the values need, relative to the matrix norm
  arithmetic = need.fitsDD ? 'dd' : 'fixed';
  F = arithmetic === 'dd' ? Math.max(F, need.relative + 8) : Math.max(F, need.fixed);
  if (F + 24 > evalBits) {
    evalBits = F + 32;
    rho = guarded(source(evalBits));
    cache = new Map();
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
  for (;;) {
    const l1 = level(m / 4);
    const l2 = level(m / 2);
    const l3 = level(m);
    const out = assemble(l1, l2, l3, tailNow, nMax, fermion, D);
    const done = converged(out, D);
    if (opts.debug) debugLevels(opts.debug, m, [l1, l2, l3], out);
    const nextTooBig = 2 * l3.points > maxPoints;
    if (done || nextTooBig) {
      const rule = family.at(m);
      const blocksText = parity ? `; even and odd blocks of ${l3.blocks.join(' and ')}` : '';
      const result: KernelOutcome = {
        traces: out.traces,
        fredholm: out.fredholm,
        points: [l1.points, l2.points, l3.points],
        parity,
        rule: `${rule.text}${blocksText}; errors from resolutions m/4, m/2, m`,
        workingBits: arithmetic === 'dd' ? 104 : F,
      };
      if (!done) {
        const worst = Math.min(...[...out.traces, ...out.fredholm].map((e) => shownDigits(e, D)));
        result.note = `the discretisation did not converge: ${worst} digits certified at ${l3.points} points`;
      }
      return result;
    }
    m *= 2;
  }
}

/** A first guess of the finest resolution for D digits (refinement corrects it). */
function initialResolution(D: number, family: RuleFamily): number {
  const m = Math.ceil((D * (family.nested ? 4.5 : 2.2)) / 4) * 4;
  return Math.max(8, m);
}

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
): { fitsDD: boolean; relative: number; fixed: number; tail: number } {
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
  return {
    fitsDD: bitsFor(D, 8) + lgn + lost <= DD_BITS,
    relative,
    fixed: Math.max(relative, Math.ceil(small) + 8),
    tail,
  };
}

interface Assembled {
  traces: Estimate[];
  fredholm: Estimate[];
  floors: { traces: number[]; fredholm: number[] };
}

/** Values of the finest level with discretisation + rounding + truncation error estimates. */
function assemble(
  l1: LevelResult,
  l2: LevelResult,
  l3: LevelResult,
  tail: number,
  nMax: number,
  fermion: boolean,
  D: number,
): Assembled {
  const disc = (a: Real, b: Real, c: Real): number => {
    const d1 = Math.abs(toNumber(sub(c, a, 200)));
    const d2 = Math.abs(toNumber(sub(c, b, 200)));
    if (d2 === 0) return 0;
    return d1 > 0 ? d2 * Math.min(1, d2 / d1) : d2;
  };
  const traces = l3.traces.map((v, i) => {
    const L = i + 1;
    const trunc = L * tail * Math.max(l3.norm, 0) ** (L - 1);
    const err = disc(l1.traces[i]!, l2.traces[i]!, v) + l3.roundTraces[i]! + trunc;
    return { value: v, error: err };
  });
  const fredholm = l3.fredholm.map((v, N) => {
    if (N === 0) return { value: v, error: 0 };
    const prev = fermion ? l3.absSymmetric[N - 1]! : N * Math.abs(toNumber(l3.fredholm[N - 1]!));
    const err = disc(l1.fredholm[N]!, l2.fredholm[N]!, v) + l3.roundFredholm[N]! + tail * prev;
    return { value: v, error: err };
  });
  return {
    traces,
    fredholm,
    // a value that is zero (finite rank) is noise at the level of the discretisation of its
    // neighbours: below 10^-2D of its natural scale it counts as determined (absolute error)
    floors: {
      traces: l3.roundTraces.map((r, i) => Math.max(2 * r, 10 ** (-2 * D) * l3.norm ** (i + 1))),
      fredholm: l3.roundFredholm.map((r, N) =>
        N === 0 ? 0 : Math.max(2 * r, 10 ** (-2 * D) * l3.absSymmetric[N - 1]! * l3.norm),
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
