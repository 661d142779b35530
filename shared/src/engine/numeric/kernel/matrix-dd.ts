import { ddAdd, ddDiv, ddMul, ddSqrt, R } from './double-double.js';
import { type FixedMatrix, type Pace, pace } from './matrix.js';

/** Double-double numbers or an n x n matrix (row-major): the high and low parts. */
export interface DD {
  hi: Float64Array;
  lo: Float64Array;
}

const dd = (n: number): DD => ({ hi: new Float64Array(n), lo: new Float64Array(n) });

/** A fixed-point matrix (F fractional bits) as the nearest double-double matrix. */
export function fixedToDD(M: FixedMatrix, F: number): DD {
  const out = dd(M.a.length);
  const scale = 2 ** -F;
  for (let i = 0; i < M.a.length; i++) {
    const v = M.a[i]!;
    const hi = Number(v);
    out.hi[i] = hi * scale;
    out.lo[i] = Number(v - BigInt(hi)) * scale;
  }
  return out;
}

/**
 * Householder reduction of a symmetric double-double matrix to tridiagonal form (the same
 * eigenvalues; lower triangle used): the diagonal d (n) and off-diagonal e (n - 1). The
 * floating-point twin of `tridiagonalize` in matrix.ts, whose errors are relative to the norm of
 * the matrix instead of absolute.
 */
export function tridiagonalizeDD(n: number, M: DD, p?: Pace): { d: DD; e: DD } {
  const ah = M.hi.slice();
  const al = M.lo.slice();
  const d = dd(n);
  const e = dd(Math.max(0, n - 1));
  const uh = new Float64Array(n);
  const ul = new Float64Array(n);
  const wh = new Float64Array(n);
  const wl = new Float64Array(n);
  // Dekker splits of u and w (hi parts), shared by the inner loops
  const u1 = new Float64Array(n);
  const u2 = new Float64Array(n);
  const w1 = new Float64Array(n);
  const w2 = new Float64Array(n);
  for (let k = 0; k < n - 2; k++) {
    let sh = 0;
    let sl = 0;
    for (let i = k + 1; i < n; i++) {
      const x = i * n + k;
      ddMul(ah[x]!, al[x]!, ah[x]!, al[x]!);
      ddAdd(sh, sl, R[0], R[1]);
      sh = R[0];
      sl = R[1];
    }
    d.hi[k] = ah[k * n + k]!;
    d.lo[k] = al[k * n + k]!;
    if (sh === 0) continue;
    const x0h = ah[(k + 1) * n + k]!;
    const x0l = al[(k + 1) * n + k]!;
    ddSqrt(sh, sl);
    const alh = x0h > 0 ? -R[0] : R[0];
    const all = x0h > 0 ? -R[1] : R[1];
    e.hi[k] = alh;
    e.lo[k] = all;
    // |v|^2 = 2 (s2 - alpha x0) for v = x - alpha e1
    ddMul(alh, all, x0h, x0l);
    ddAdd(sh, sl, -R[0], -R[1]);
    ddSqrt(2 * R[0], 2 * R[1]);
    ddDiv(1, 0, R[0], R[1]);
    const rh = R[0];
    const rl = R[1];
    for (let i = k + 1; i < n; i++) {
      if (i === k + 1) {
        ddAdd(x0h, x0l, -alh, -all);
        ddMul(R[0], R[1], rh, rl);
      } else ddMul(ah[i * n + k]!, al[i * n + k]!, rh, rl);
      uh[i] = R[0];
      ul[i] = R[1];
    }
    // w = 2 A u, then w - (u.w) u
    splitInto(uh, k + 1, n, u1, u2);
    for (let i = k + 1; i < n; i++) {
      rowDot(ah, al, uh, ul, u1, u2, i, n, k + 1);
      wh[i] = 2 * R[0];
      wl[i] = 2 * R[1];
    }
    let ph = 0;
    let pl = 0;
    for (let i = k + 1; i < n; i++) {
      ddMul(uh[i]!, ul[i]!, wh[i]!, wl[i]!);
      ddAdd(ph, pl, R[0], R[1]);
      ph = R[0];
      pl = R[1];
    }
    for (let i = k + 1; i < n; i++) {
      ddMul(ph, pl, uh[i]!, ul[i]!);
      ddAdd(wh[i]!, wl[i]!, -R[0], -R[1]);
      wh[i] = R[0];
      wl[i] = R[1];
    }
    splitInto(wh, k + 1, n, w1, w2);
    for (let i = k + 1; i < n; i++) rankTwoRow(ah, al, uh, ul, u1, u2, wh, wl, w1, w2, i, n, k + 1);
    pace(p);
  }
  if (n >= 2) {
    d.hi[n - 2] = ah[(n - 2) * n + n - 2]!;
    d.lo[n - 2] = al[(n - 2) * n + n - 2]!;
    e.hi[n - 2] = ah[(n - 1) * n + n - 2]!;
    e.lo[n - 2] = al[(n - 1) * n + n - 2]!;
  }
  if (n >= 1) {
    d.hi[n - 1] = ah[(n - 1) * n + n - 1]!;
    d.lo[n - 1] = al[(n - 1) * n + n - 1]!;
  }
  return { d, e };
}

const SPLIT = 134217729; // 2^27 + 1

/** Dekker splits x = x1 + x2 (26 + 27 bits) of x[from..to). */
function splitInto(
  x: Float64Array,
  from: number,
  to: number,
  x1: Float64Array,
  x2: Float64Array,
): void {
  for (let j = from; j < to; j++) {
    const v = x[j]!;
    const t = SPLIT * v;
    const a = t - (t - v);
    x1[j] = a;
    x2[j] = v - a;
  }
}

/**
 * sum_j A_ij u_j over j >= from (A symmetric, lower triangle) into R: the double-double products
 * and sums written out (the hot loop of the reduction), u's splits precomputed.
 */
function rowDot(
  ah: Float64Array,
  al: Float64Array,
  uh: Float64Array,
  ul: Float64Array,
  u1: Float64Array,
  u2: Float64Array,
  i: number,
  n: number,
  from: number,
): void {
  let sh = 0;
  let sl = 0;
  for (let j = from; j < n; j++) {
    const idx = j <= i ? i * n + j : j * n + i;
    const xh = ah[idx]!;
    const xl = al[idx]!;
    const yh = uh[j]!;
    const t = SPLIT * xh;
    const x1 = t - (t - xh);
    const x2 = xh - x1;
    const y1 = u1[j]!;
    const y2 = u2[j]!;
    const ph = xh * yh;
    const pl = x1 * y1 - ph + x1 * y2 + x2 * y1 + x2 * y2 + (xh * ul[j]! + xl * yh);
    // (sh, sl) += (ph, pl)
    const s = sh + ph;
    const v = s - sh;
    const e = sh - (s - v) + (ph - v) + sl + pl;
    sh = s + e;
    sl = e - (sh - s);
  }
  R[0] = sh;
  R[1] = sl;
}

/** Row i of A -= u w^T + w u^T over from <= j <= i, written out like rowDot. */
function rankTwoRow(
  ah: Float64Array,
  al: Float64Array,
  uh: Float64Array,
  ul: Float64Array,
  u1: Float64Array,
  u2: Float64Array,
  wh: Float64Array,
  wl: Float64Array,
  w1: Float64Array,
  w2: Float64Array,
  i: number,
  n: number,
  from: number,
): void {
  const ri = i * n;
  const uih = uh[i]!;
  const uil = ul[i]!;
  const ui1 = u1[i]!;
  const ui2 = u2[i]!;
  const wih = wh[i]!;
  const wil = wl[i]!;
  const wi1 = w1[i]!;
  const wi2 = w2[i]!;
  for (let j = from; j <= i; j++) {
    const wjh = wh[j]!;
    const ujh = uh[j]!;
    const p1 = uih * wjh;
    const e1 =
      ui1 * w1[j]! - p1 + ui1 * w2[j]! + ui2 * w1[j]! + ui2 * w2[j]! + (uih * wl[j]! + uil * wjh);
    const p2 = wih * ujh;
    const e2 =
      wi1 * u1[j]! - p2 + wi1 * u2[j]! + wi2 * u1[j]! + wi2 * u2[j]! + (wih * ul[j]! + wil * ujh);
    // t = p1 + p2 + e1 + e2, then a - t
    const s = p1 + p2;
    const v = s - p1;
    const te = p1 - (s - v) + (p2 - v) + e1 + e2;
    const th = s + te;
    const tl = te - (th - s);
    const xh = ah[ri + j]!;
    const z = xh - th;
    const b = z - xh;
    const ze = xh - (z - b) + (-th - b) + al[ri + j]! - tl;
    const hi = z + ze;
    ah[ri + j] = hi;
    al[ri + j] = ze - (hi - z);
  }
}

/**
 * Tr T^L, L = 1..nMax, of the tridiagonal T = (d, e) by banded powers (see matrix.ts): band k
 * holds (T^k)_ij for |j - i| <= k at [i * (2k + 1) + (j - i + k)], and
 * Tr T^L = sum_ij (T^a)_ij (T^b)_ij with a = ceil(L / 2), b = L - a (T symmetric).
 */
export function tridiagonalPowerTracesDD(d: DD, e: DD, nMax: number): DD {
  const n = d.hi.length;
  const K = Math.max(1, Math.ceil(nMax / 2));
  const t1 = dd(3 * n);
  for (let i = 0; i < n; i++) {
    t1.hi[3 * i + 1] = d.hi[i]!;
    t1.lo[3 * i + 1] = d.lo[i]!;
    if (i > 0) {
      t1.hi[3 * i] = e.hi[i - 1]!;
      t1.lo[3 * i] = e.lo[i - 1]!;
    }
    if (i < n - 1) {
      t1.hi[3 * i + 2] = e.hi[i]!;
      t1.lo[3 * i + 2] = e.lo[i]!;
    }
  }
  const band: DD[] = [dd(0), t1];
  for (let k = 2; k <= K; k++) band.push(nextBandPower(band[k - 1]!, k, d, e, n));
  const out = dd(nMax);
  for (let L = 1; L <= nMax; L++) {
    const a = Math.ceil(L / 2);
    const b = L - a;
    let sh = 0;
    let sl = 0;
    if (b === 0) {
      for (let i = 0; i < n; i++) {
        ddAdd(sh, sl, d.hi[i]!, d.lo[i]!);
        sh = R[0];
        sl = R[1];
      }
    } else {
      const A = band[a]!;
      const B = band[b]!;
      const wa = 2 * a + 1;
      const wb = 2 * b + 1;
      for (let i = 0; i < n; i++) {
        // (T^b)_ij vanishes outside |j - i| <= b <= a
        const jLo = Math.max(0, i - b);
        const jHi = Math.min(n - 1, i + b);
        for (let j = jLo; j <= jHi; j++) {
          const x = i * wa + (j - i + a);
          const y = i * wb + (j - i + b);
          ddMul(A.hi[x]!, A.lo[x]!, B.hi[y]!, B.lo[y]!);
          ddAdd(sh, sl, R[0], R[1]);
          sh = R[0];
          sl = R[1];
        }
      }
    }
    out.hi[L - 1] = sh;
    out.lo[L - 1] = sl;
  }
  return out;
}

/**
 * Band k of T^k from band k - 1 (P = T^(k-1)):
 * (P T)_ij = P_ij d_j + P_(i,j-1) e_(j-1) + P_(i,j+1) e_j, a term outside P's band being zero.
 */
function nextBandPower(P: DD, k: number, d: DD, e: DD, n: number): DD {
  const w = 2 * k + 1;
  const pw = w - 2;
  const next = dd(n * w);
  for (let i = 0; i < n; i++) {
    const jLo = Math.max(0, i - k);
    const jHi = Math.min(n - 1, i + k);
    const row = i * pw - i + (k - 1); // P_ij at row + j when |j - i| <= k - 1
    for (let j = jLo; j <= jHi; j++) {
      let sh = 0;
      let sl = 0;
      const dj = j - i;
      if (dj >= 1 - k && dj <= k - 1) {
        ddMul(P.hi[row + j]!, P.lo[row + j]!, d.hi[j]!, d.lo[j]!);
        sh = R[0];
        sl = R[1];
      }
      if (j > 0 && dj - 1 >= 1 - k && dj - 1 <= k - 1) {
        ddMul(P.hi[row + j - 1]!, P.lo[row + j - 1]!, e.hi[j - 1]!, e.lo[j - 1]!);
        ddAdd(sh, sl, R[0], R[1]);
        sh = R[0];
        sl = R[1];
      }
      if (j < n - 1 && dj + 1 >= 1 - k && dj + 1 <= k - 1) {
        ddMul(P.hi[row + j + 1]!, P.lo[row + j + 1]!, e.hi[j]!, e.lo[j]!);
        ddAdd(sh, sl, R[0], R[1]);
        sh = R[0];
        sl = R[1];
      }
      next.hi[i * w + (dj + k)] = sh;
      next.lo[i * w + (dj + k)] = sl;
    }
  }
  return next;
}

/** Coefficients c_0..c_nMax of det(I + kappa T) by the leading-minor recurrence (matrix.ts). */
export function determinantCoefficientsDD(d: DD, e: DD, nMax: number): DD {
  // p_(k-2), p_(k-1) and p_k in three buffers used in turn
  let p0 = dd(nMax + 1);
  let p1 = dd(nMax + 1);
  let next = dd(nMax + 1);
  p0.hi[0] = 1;
  p1.hi[0] = 1;
  for (let k = 0; k < d.hi.length; k++) {
    let e2h = 0;
    let e2l = 0;
    if (k > 0) {
      ddMul(e.hi[k - 1]!, e.lo[k - 1]!, e.hi[k - 1]!, e.lo[k - 1]!);
      e2h = R[0];
      e2l = R[1];
    }
    const dh = d.hi[k]!;
    const dl = d.lo[k]!;
    for (let j = 0; j <= nMax; j++) {
      let sh = p1.hi[j]!;
      let sl = p1.lo[j]!;
      if (j >= 1) {
        ddMul(dh, dl, p1.hi[j - 1]!, p1.lo[j - 1]!);
        ddAdd(sh, sl, R[0], R[1]);
        sh = R[0];
        sl = R[1];
      }
      if (j >= 2 && k > 0) {
        ddMul(e2h, e2l, p0.hi[j - 2]!, p0.lo[j - 2]!);
        ddAdd(sh, sl, -R[0], -R[1]);
        sh = R[0];
        sl = R[1];
      }
      next.hi[j] = sh;
      next.lo[j] = sl;
    }
    const free = p0;
    p0 = p1;
    p1 = next;
    next = free;
  }
  return p1;
}
