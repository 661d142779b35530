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
    for (let i = k + 1; i < n; i++) {
      let s1 = 0;
      let s2 = 0;
      const ri = i * n;
      for (let j = k + 1; j <= i; j++) {
        ddMul(ah[ri + j]!, al[ri + j]!, uh[j]!, ul[j]!);
        ddAdd(s1, s2, R[0], R[1]);
        s1 = R[0];
        s2 = R[1];
      }
      for (let j = i + 1; j < n; j++) {
        ddMul(ah[j * n + i]!, al[j * n + i]!, uh[j]!, ul[j]!);
        ddAdd(s1, s2, R[0], R[1]);
        s1 = R[0];
        s2 = R[1];
      }
      wh[i] = 2 * s1;
      wl[i] = 2 * s2;
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
    for (let i = k + 1; i < n; i++) {
      const ri = i * n;
      const uih = uh[i]!;
      const uil = ul[i]!;
      const wih = wh[i]!;
      const wil = wl[i]!;
      for (let j = k + 1; j <= i; j++) {
        ddMul(uih, uil, wh[j]!, wl[j]!);
        const th = R[0];
        const tl = R[1];
        ddMul(wih, wil, uh[j]!, ul[j]!);
        ddAdd(th, tl, R[0], R[1]);
        ddAdd(ah[ri + j]!, al[ri + j]!, -R[0], -R[1]);
        ah[ri + j] = R[0];
        al[ri + j] = R[1];
      }
    }
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

/** Tr T^L, L = 1..nMax, of the tridiagonal T = (d, e) by banded powers (see matrix.ts). */
export function tridiagonalPowerTracesDD(d: DD, e: DD, nMax: number): DD {
  const n = d.hi.length;
  const K = Math.ceil(nMax / 2);
  const band: DD[] = [dd(0)];
  const get = (k: number, i: number, j: number, part: 'hi' | 'lo'): number => {
    if (j < 0 || j >= n || Math.abs(j - i) > k) return 0;
    return band[k]![part][i * (2 * k + 1) + (j - i + k)]!;
  };
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
  band.push(t1);
  for (let k = 2; k <= K; k++) {
    const w = 2 * k + 1;
    const next = dd(n * w);
    for (let i = 0; i < n; i++) {
      for (let j = Math.max(0, i - k); j <= Math.min(n - 1, i + k); j++) {
        ddMul(get(k - 1, i, j, 'hi'), get(k - 1, i, j, 'lo'), d.hi[j]!, d.lo[j]!);
        let sh = R[0];
        let sl = R[1];
        if (j > 0) {
          ddMul(get(k - 1, i, j - 1, 'hi'), get(k - 1, i, j - 1, 'lo'), e.hi[j - 1]!, e.lo[j - 1]!);
          ddAdd(sh, sl, R[0], R[1]);
          sh = R[0];
          sl = R[1];
        }
        if (j < n - 1) {
          ddMul(get(k - 1, i, j + 1, 'hi'), get(k - 1, i, j + 1, 'lo'), e.hi[j]!, e.lo[j]!);
          ddAdd(sh, sl, R[0], R[1]);
          sh = R[0];
          sl = R[1];
        }
        next.hi[i * w + (j - i + k)] = sh;
        next.lo[i * w + (j - i + k)] = sl;
      }
    }
    band.push(next);
  }
  const out = dd(nMax);
  for (let Lp = 1; Lp <= nMax; Lp++) {
    const a = Math.ceil(Lp / 2);
    const b = Lp - a;
    let sh = 0;
    let sl = 0;
    for (let i = 0; i < n; i++) {
      if (b === 0) {
        ddAdd(sh, sl, d.hi[i]!, d.lo[i]!);
        sh = R[0];
        sl = R[1];
        continue;
      }
      for (let j = Math.max(0, i - b); j <= Math.min(n - 1, i + b); j++) {
        ddMul(get(a, i, j, 'hi'), get(a, i, j, 'lo'), get(b, i, j, 'hi'), get(b, i, j, 'lo'));
        ddAdd(sh, sl, R[0], R[1]);
        sh = R[0];
        sl = R[1];
      }
    }
    out.hi[Lp - 1] = sh;
    out.lo[Lp - 1] = sl;
  }
  return out;
}

/** Coefficients c_0..c_nMax of det(I + kappa T) by the leading-minor recurrence (matrix.ts). */
export function determinantCoefficientsDD(d: DD, e: DD, nMax: number): DD {
  let p0 = dd(nMax + 1);
  let p1 = dd(nMax + 1);
  p0.hi[0] = 1;
  p1.hi[0] = 1;
  for (let k = 0; k < d.hi.length; k++) {
    const next = dd(nMax + 1);
    let e2h = 0;
    let e2l = 0;
    if (k > 0) {
      ddMul(e.hi[k - 1]!, e.lo[k - 1]!, e.hi[k - 1]!, e.lo[k - 1]!);
      e2h = R[0];
      e2l = R[1];
    }
    for (let j = 0; j <= nMax; j++) {
      let sh = p1.hi[j]!;
      let sl = p1.lo[j]!;
      if (j >= 1) {
        ddMul(d.hi[k]!, d.lo[k]!, p1.hi[j - 1]!, p1.lo[j - 1]!);
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
    p0 = p1;
    p1 = next;
  }
  return p1;
}
