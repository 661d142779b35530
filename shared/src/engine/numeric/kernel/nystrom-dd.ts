import type { FastCompiled } from '../expr/compile-dd.js';
import { abs, magnitude, Real, sub } from '../real.js';
import { ddAdd, ddFromReal, ddMul, ddSqrt, ddToReal, R } from './double-double.js';
import type { DD } from './matrix-dd.js';
import { pace, type Pace } from './matrix.js';
import type { Rule } from './quadrature.js';
import type { KernelAt } from './sampling.js';

/** A double-double Nystrom block; `unit` bounds the error of each entry (absolute). */
export interface DDMatrix extends DD {
  n: number;
  unit: number;
}

/**
 * rho in double-double at a point given in double-double (x = xh + xl, y = yh + yl) into R; a
 * value the fast evaluator cannot give (NaN: a pole or domain error) is asked of the Real
 * evaluator, which names the fault.
 */
export type FastAt = (xh: number, xl: number, yh: number, yl: number) => void;

export function fastKernel(fast: FastCompiled, rho: KernelAt): FastAt {
  const v = new Float64Array(4);
  const out = new Float64Array(2);
  return (xh, xl, yh, yl) => {
    v[0] = xh;
    v[1] = xl;
    v[2] = yh;
    v[3] = yl;
    fast.evaluate(v, out);
    if (Number.isNaN(out[0]) || !Number.isFinite(out[0]!)) {
      ddFromReal(rho(ddToReal(xh, xl), ddToReal(yh, yl)));
      return;
    }
    R[0] = out[0]!;
    R[1] = out[1]!;
  };
}

/** A Real as a double-double pair. */
function pair(x: Real): [number, number] {
  ddFromReal(x);
  return [R[0]!, R[1]!];
}

/**
 * Whether the fast evaluator agrees with the Real one to `bits` (relative to the largest value)
 * on the sample points: the fast path is used only when it does.
 */
export function fastAgrees(
  fast: FastCompiled,
  rho: KernelAt,
  pts: readonly Real[],
  bits: number,
): boolean {
  const at = fastKernel(fast, rho);
  let scale = -Infinity;
  const diffs: number[] = [];
  for (const x of pts)
    for (const y of pts) {
      const ref = rho(x, y);
      const [xh, xl] = pair(x);
      const [yh, yl] = pair(y);
      at(xh, xl, yh, yl);
      const d = abs(sub(ddToReal(R[0], R[1]), ref, 240));
      scale = Math.max(scale, magnitude(ref));
      diffs.push(d.m === 0n ? -Infinity : magnitude(d));
    }
  return diffs.every((d) => d <= scale - bits);
}

/**
 * The Nystrom blocks of rho on the rule in double-double (see nystromBlocks in level.ts for the
 * layout and the parity split): A_ij = sqrt(w_i) rho(x_i, x_j) sqrt(w_j).
 */
export function nystromBlocksDD(
  rule: Rule,
  at: FastAt,
  parity: boolean,
  entryBits: number,
  p?: Pace,
): DDMatrix[] {
  const n = rule.nodes.length;
  const swh = new Float64Array(n);
  const swl = new Float64Array(n);
  const xh = new Float64Array(n);
  const xl = new Float64Array(n);
  // sqrt(w_i) in double-double (one Newton step: within a few units of 2^-104, far below the
  // entries' own 2^-entryBits)
  rule.weights.forEach((w, i) => {
    const [h, l] = pair(w);
    ddSqrt(h, l);
    swh[i] = R[0];
    swl[i] = R[1];
    [xh[i], xl[i]] = pair(rule.nodes[i]!);
  });
  const node = (i: number, j: number): void => at(xh[i]!, xl[i]!, xh[j]!, xl[j]!);
  // entry = sw_i sw_j f rho into R
  const entry = (i: number, j: number, vh: number, vl: number, f: number): void => {
    ddMul(swh[i]!, swl[i]!, swh[j]!, swl[j]!);
    ddMul(R[0], R[1], vh, vl);
    if (f !== 1) ddMul(R[0], R[1], f === 0.5 ? 0.5 : Math.SQRT1_2, f === 0.5 ? 0 : ROOT_HALF_LO);
  };
  if (!parity || !rule.mirror) {
    const M = block(n);
    for (let i = 0; i < n; i++) {
      for (let j = i; j < n; j++) {
        node(i, j);
        entry(i, j, R[0], R[1], 1);
        set(M, i, j);
      }
      pace(p);
    }
    return withUnits([M], entryBits);
  }
  const mirror = rule.mirror;
  const reps: number[] = [];
  for (let i = 0; i < n; i++) if (mirror[i]! >= i) reps.push(i);
  const pairs = reps.filter((i) => mirror[i] !== i);
  const oddIndex = new Map(pairs.map((r, k) => [r, k]));
  const even = block(reps.length);
  const odd = block(pairs.length);
  for (let a = 0; a < reps.length; a++) {
    const i = reps[a]!;
    for (let b = a; b < reps.length; b++) {
      const j = reps[b]!;
      node(i, j);
      const sh = R[0];
      const sl = R[1];
      const fi = mirror[i] === i;
      const fj = mirror[j] === j;
      if (fi || fj) {
        entry(i, j, 2 * sh, 2 * sl, fi && fj ? 0.5 : Math.SQRT1_2);
        set(even, a, b);
        continue;
      }
      node(i, mirror[j]!);
      const th = R[0];
      const tl = R[1];
      ddAdd(sh, sl, th, tl);
      entry(i, j, R[0], R[1], 1);
      set(even, a, b);
      ddAdd(sh, sl, -th, -tl);
      entry(i, j, R[0], R[1], 1);
      set(odd, oddIndex.get(i)!, oddIndex.get(j)!);
    }
    pace(p);
  }
  return withUnits([even, odd], entryBits);
}

/** Each entry is good to 2^-entryBits of the largest one (what fastAgrees checked). */
function withUnits(blocks: DDMatrix[], entryBits: number): DDMatrix[] {
  let max = 0;
  // indexed loops: an iterator over n^2 entries allocates a result per entry until optimised
  for (const B of blocks) {
    const hi = B.hi;
    for (let i = 0; i < hi.length; i++) max = Math.max(max, Math.abs(hi[i]!));
  }
  for (const B of blocks) B.unit = max * 2 ** -entryBits;
  return blocks;
}

// sqrt(1/2) = Math.SQRT1_2 + ROOT_HALF_LO (the next 53 bits; common practice)
const ROOT_HALF_LO = -4.833646656726457e-17;

function block(n: number): DDMatrix {
  return { n, hi: new Float64Array(n * n), lo: new Float64Array(n * n), unit: 0 };
}

/** M_ij = M_ji = (H, L). */
function set(M: DDMatrix, i: number, j: number): void {
  M.hi[i * M.n + j] = M.hi[j * M.n + i] = R[0];
  M.lo[i * M.n + j] = M.lo[j * M.n + i] = R[1];
}
