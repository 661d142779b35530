import { magnitude, Real, toNumber } from './real.js';

/** Ai(0) and Ai'(0) (DLMF 9.2.3, 9.2.4). */
const AI0 = 0.3550280538878172;
const AIP0 = -0.2588194037928068;
const LOG_2_SQRT_PI = Math.log(2 * Math.sqrt(Math.PI));
/** From here up the asymptotic series is good to ~1e-16 (its smallest term is about e^(-2 zeta)). */
const X_ASYMPTOTIC = 10;
/** Up to here the Maclaurin series loses under a factor 12 to cancellation. */
const X_SERIES = 1.5;

/** log Ai(x) and its derivative Ai'(x)/Ai(x); NaN where Ai(x) <= 0 (x at or below its first zero). */
export interface LogAiry {
  logAi: number;
  dlogAi: number;
}

/** Ai, Ai' by the Maclaurin series (DLMF 9.4.1), for |x| of a few units. */
function maclaurin(x: number): [number, number] {
  const z3 = x * x * x;
  let f = 1;
  let t = 1; // x^(3k) terms of f
  let fd = 0;
  let td = (x * x) / 2; // terms of f'
  let g = x;
  let s = x; // terms of g
  let gd = 1;
  let sd = 1; // terms of g'
  for (let k = 1; k < 80; k++) {
    t *= z3 / (3 * k * (3 * k - 1));
    s *= z3 / ((3 * k + 1) * 3 * k);
    if (k > 1) td *= z3 / ((3 * k - 3) * (3 * k - 1));
    sd *= z3 / (3 * k * (3 * k - 2));
    f += t;
    g += s;
    fd += td;
    gd += sd;
    if (
      Math.abs(t) + Math.abs(s) + Math.abs(td) + Math.abs(sd) <
      1e-18 * (Math.abs(f) + Math.abs(g))
    )
      break;
  }
  return [AI0 * f + AIP0 * g, AI0 * fd + AIP0 * gd];
}

/** log Ai and Ai'/Ai for x >= X_ASYMPTOTIC (DLMF 9.7.5, 9.7.6; u_k, v_k of DLMF 9.7.2). */
function asymptotic(x: number): LogAiry {
  const zeta = (2 / 3) * x * Math.sqrt(x);
  let u = 1;
  let su = 1;
  let sv = 1;
  let last = Infinity;
  for (let k = 1; k < 200; k++) {
    u *= ((6 * k - 5) * (6 * k - 3) * (6 * k - 1)) / ((2 * k - 1) * 216 * k * zeta);
    const v = (-(6 * k + 1) / (6 * k - 1)) * u;
    if (Math.abs(u) >= last || Math.abs(u) < 1e-18) break; // stop at the smallest term
    last = Math.abs(u);
    const sg = k % 2 === 0 ? 1 : -1;
    su += sg * u;
    sv += sg * v;
  }
  return {
    logAi: -zeta - LOG_2_SQRT_PI - 0.25 * Math.log(x) + Math.log(su),
    dlogAi: (-Math.sqrt(x) * sv) / su,
  };
}

/** Integrate y'' = x y by Taylor steps from a (y, y') to b; stable towards smaller x for Ai. */
function taylorSteps(a: number, y: number, yp: number, b: number): [number, number] {
  const steps = Math.ceil(Math.abs(b - a) / 0.5);
  const h = (b - a) / steps;
  for (let s = 0; s < steps; s++) {
    // y(a + h) = sum c_n h^n with c_(n+2) = (a c_n + c_(n-1)) / ((n+1)(n+2))
    let cPrev = 0;
    let c0 = y;
    let c1 = yp;
    let hn = h; // h^n for c1
    let sumY = y + yp * h;
    let sumD = yp;
    for (let n = 0; n < 60; n++) {
      const c2 = (a * c0 + cPrev) / ((n + 1) * (n + 2));
      sumD += (n + 2) * c2 * hn;
      hn *= h;
      const term = c2 * hn;
      sumY += term;
      cPrev = c0;
      c0 = c1;
      c1 = c2;
      if (n > 4 && Math.abs(term) < 1e-19 * Math.abs(sumY)) break;
    }
    y = sumY;
    yp = sumD;
    a += h;
  }
  return [y, yp];
}

/** Spacing of the grid between X_SERIES and X_ASYMPTOTIC where (Ai, Ai') is kept. */
const GRID_STEP = 0.5;
/** (Ai, Ai') at x = X_ASYMPTOTIC - j GRID_STEP, integrated downwards once (a fit asks thousands of x). */
let grid: [number, number][] | null = null;

function airyGrid(): [number, number][] {
  if (grid) return grid;
  const s = asymptotic(X_ASYMPTOTIC);
  const v = Math.exp(s.logAi);
  grid = [[v, v * s.dlogAi]];
  for (let x = X_ASYMPTOTIC; x > X_SERIES; x -= GRID_STEP) {
    const [y, yp] = grid[grid.length - 1]!;
    grid.push(taylorSteps(x, y, yp, x - GRID_STEP));
  }
  return grid;
}

/**
 * Float64 log Ai(x) with d/dx log Ai(x), for fitting (relative accuracy ~1e-14; the engine's
 * high-precision Ai is a separate function). Large x: the asymptotic series DLMF 9.7.5/9.7.6;
 * x <= 1.5: the Maclaurin series DLMF 9.4.1; between them: a Taylor step of Ai'' = x Ai from the
 * grid point just above x, the grid integrated down from x = 10 (the stable direction for the
 * decaying solution). Valid for x above the first zero of Ai (about -2.338); NaN there and below.
 */
export function logAiry(x: number): LogAiry {
  if (!Number.isFinite(x)) return { logAi: NaN, dlogAi: NaN };
  if (x >= X_ASYMPTOTIC) return asymptotic(x);
  let ai: number;
  let aip: number;
  if (x <= X_SERIES) [ai, aip] = maclaurin(x);
  else {
    const j = Math.floor((X_ASYMPTOTIC - x) / GRID_STEP);
    const [y, yp] = airyGrid()[j]!;
    const from = X_ASYMPTOTIC - j * GRID_STEP;
    [ai, aip] = from === x ? [y, yp] : taylorSteps(from, y, yp, x);
  }
  if (!(ai > 0)) return { logAi: NaN, dlogAi: NaN };
  return { logAi: Math.log(ai), dlogAi: aip / ai };
}

/** Natural log of |x| for x != 0, in float64, whatever the exponent of x. */
export function logAbsReal(x: Real): number {
  const mag = magnitude(x);
  return Math.log(Math.abs(toNumber(new Real(x.m, x.e - mag)))) + mag * Math.LN2;
}

export interface AiryFitRow {
  N: number;
  value: Real;
  error: number;
}

export interface AiryFit {
  C: { value: number; uncertainty: number };
  B: { value: number; uncertainty: number };
  A: { value: number; uncertainty: number };
  /** log Z(N) - fit, per row fitted */
  residuals: { N: number; residual: number }[];
  /** the N of the rows fitted (those with Z(N) > 0) */
  fittedOn: number[];
  /**
   * Where the uncertainties come from: 'residuals' (the scatter of the residuals about the form,
   * the usual case: the form is asymptotic) or 'rowErrors' (the residuals are all at the level of
   * the rows' own errors, ~0, so those errors are what the parameters are uncertain by).
   */
  uncertaintyFrom: 'residuals' | 'rowErrors';
}

type Params = [number, number, number]; // A, B, u = log C

/** The model log Z = A - u/3 + log Ai(e^(-u/3) (N - B)) with its gradient in (A, B, u). */
function model(p: Params, N: number): { f: number; grad: Params } {
  const s = Math.exp(-p[2] / 3);
  const x = s * (N - p[1]);
  const { logAi, dlogAi } = logAiry(x);
  return { f: p[0] - p[2] / 3 + logAi, grad: [1, -s * dlogAi, -1 / 3 - (x * dlogAi) / 3] };
}

function cost(p: Params, Ns: number[], ys: number[]): number {
  let c = 0;
  for (let i = 0; i < Ns.length; i++) c += (ys[i]! - model(p, Ns[i]!).f) ** 2;
  return Number.isNaN(c) ? Infinity : c;
}

/** Solve the 3x3 system M d = r (Gaussian elimination, partial pivoting); null if singular. */
function solve3(M: number[][], r: number[]): number[] | null {
  const a = M.map((row, i) => [...row, r[i]!]);
  for (let c = 0; c < 3; c++) {
    let piv = c;
    for (let i = c + 1; i < 3; i++) if (Math.abs(a[i]![c]!) > Math.abs(a[piv]![c]!)) piv = i;
    if (!(Math.abs(a[piv]![c]!) > 0)) return null;
    [a[c], a[piv]] = [a[piv]!, a[c]!];
    for (let i = c + 1; i < 3; i++) {
      const f = a[i]![c]! / a[c]![c]!;
      for (let k = c; k < 4; k++) a[i]![k]! -= f * a[c]![k]!;
    }
  }
  const d = [0, 0, 0];
  for (let i = 2; i >= 0; i--) {
    let v = a[i]![3]!;
    for (let k = i + 1; k < 3; k++) v -= a[i]![k]! * d[k]!;
    d[i] = v / a[i]![i]!;
  }
  return d.every(Number.isFinite) ? d : null;
}

function inverse3(M: number[][]): number[][] | null {
  const cols = [0, 1, 2].map((j) =>
    solve3(
      M,
      [0, 1, 2].map((i) => (i === j ? 1 : 0)),
    ),
  );
  if (cols.some((c) => c === null)) return null;
  return [0, 1, 2].map((i) => [0, 1, 2].map((j) => cols[j]![i]!));
}

/**
 * Starting point: a grid over (log C, B), A by its closed-form least-squares value. The model's
 * value at A = 0 is computed as in `model` (the same operations, so the same start) without its
 * gradient: the grid asks some 12,000 values.
 */
function startingPoint(Ns: number[], ys: number[]): Params | null {
  const nMin = Math.min(...Ns);
  const span = Math.max(...Ns) - nMin + 1;
  const m = Ns.length;
  const base = new Float64Array(m);
  let best: Params | null = null;
  let bestCost = Infinity;
  for (let iu = 0; iu <= 40; iu++) {
    const u = Math.log(1e-4) + (iu / 40) * Math.log(1e8);
    const bMax = nMin + 2.2 * Math.exp(u / 3);
    const bMin = nMin - 2 * span - 5;
    const s = Math.exp(-u / 3);
    grid: for (let ib = 0; ib <= 30; ib++) {
      const B = bMin + (ib / 30) * (bMax - bMin);
      for (let i = 0; i < m; i++) {
        const f = 0 - u / 3 + logAiry(s * (Ns[i]! - B)).logAi;
        if (!Number.isFinite(f)) continue grid;
        base[i] = f;
      }
      let sum = 0;
      for (let i = 0; i < m; i++) sum = sum + ys[i]! - base[i]!;
      const A = sum / m;
      let c = 0;
      for (let i = 0; i < m; i++) c = c + (ys[i]! - A - base[i]!) ** 2;
      if (c < bestCost) {
        bestCost = c;
        best = [A, B, u];
      }
    }
  }
  return best;
}

/**
 * The Fermi-gas large-N form Z(N) ~ C^(-1/3) e^A Ai[C^(-1/3) (N - B)] fitted to a canonical table
 * (M. Marino, P. Putrov, "ABJM theory as a Fermi gas", arXiv:1110.4066): least squares on
 * log Z(N) = A - log(C)/3 + log Ai(C^(-1/3) (N - B)) over the rows with Z(N) > 0, by
 * Levenberg-Marquardt from a grid start, in float64 (the fit, not the table, limits what it says).
 * The fit is unweighted: the form is asymptotic, so its misfit, not the rows' tiny errors, is what
 * the residuals show. Uncertainties: residual variance times (J^T J)^-1, or, when the residuals are
 * no larger than the rows' own errors in log Z (floored at float64 rounding), the propagation of
 * those errors, (J^T J)^-1 J^T S J (J^T J)^-1; `uncertaintyFrom` says which. Null with fewer than
 * 4 positive rows or when the fit does not converge.
 */
export function airyFit(rows: AiryFitRow[]): AiryFit | null {
  const used = rows.filter((r) => r.value.m > 0n && Number.isFinite(r.N));
  if (used.length < 4) return null;
  const Ns = used.map((r) => r.N);
  const ys = used.map((r) => logAbsReal(r.value));
  const sig = used.map((r, i) =>
    Math.max(
      r.error > 0 ? Math.exp(Math.log(r.error) - ys[i]!) : 0,
      4e-16 * Math.max(1, Math.abs(ys[i]!)),
    ),
  );
  let p = startingPoint(Ns, ys);
  if (!p) return null;
  let c = cost(p, Ns, ys);
  let lambda = 1e-3;
  for (let it = 0; it < 500 && lambda < 1e12; it++) {
    const JTJ = [0, 1, 2].map(() => [0, 0, 0]);
    const JTr = [0, 0, 0];
    for (let i = 0; i < Ns.length; i++) {
      const { f, grad } = model(p, Ns[i]!);
      const r = ys[i]! - f;
      for (let a = 0; a < 3; a++) {
        JTr[a]! += grad[a]! * r;
        for (let b = 0; b < 3; b++) JTJ[a]![b]! += grad[a]! * grad[b]!;
      }
    }
    const M = JTJ.map((row, a) => row.map((v, b) => (a === b ? v * (1 + lambda) : v)));
    const d = solve3(M, JTr);
    if (!d) {
      lambda *= 10;
      continue;
    }
    const q: Params = [p[0] + d[0]!, p[1] + d[1]!, p[2] + d[2]!];
    const cq = cost(q, Ns, ys);
    if (cq <= c) {
      const small = d.every((v, k) => Math.abs(v) <= 1e-13 * (1 + Math.abs(q[k]!)));
      const done = small || c - cq <= 1e-15 * c;
      p = q;
      c = cq;
      lambda = Math.max(lambda / 10, 1e-12);
      if (done) break;
    } else lambda *= 10;
  }
  return finish(p, Ns, ys, sig);
}

function finish(p: Params, Ns: number[], ys: number[], sig: number[]): AiryFit | null {
  const C = Math.exp(p[2]);
  // Jacobian in (A, B, C)
  const J = Ns.map((N) => {
    const g = model(p, N).grad;
    return [g[0], g[1], g[2] / C];
  });
  const residuals = Ns.map((N, i) => ({ N, residual: ys[i]! - model(p, N).f }));
  if (residuals.some((r) => !Number.isFinite(r.residual))) return null;
  const JTJ = [0, 1, 2].map((a) =>
    [0, 1, 2].map((b) => J.reduce((s, row) => s + row[a]! * row[b]!, 0)),
  );
  const inv = inverse3(JTJ);
  if (!inv) return null;
  const m = Ns.length;
  const rss = residuals.reduce((s, r) => s + r.residual ** 2, 0);
  const meanSig2 = sig.reduce((s, v) => s + v * v, 0) / m;
  const fromRows = m === 3 || rss / m <= meanSig2;
  let cov: number[][];
  if (!fromRows) {
    const s2 = rss / (m - 3);
    cov = inv.map((row) => row.map((v) => v * s2));
  } else {
    // (J^T J)^-1 (J^T S J) (J^T J)^-1 with S = diag(sig^2)
    const mid = [0, 1, 2].map((a) =>
      [0, 1, 2].map((b) => J.reduce((s, row, i) => s + row[a]! * row[b]! * sig[i]! ** 2, 0)),
    );
    const t = mul3(inv, mid);
    cov = mul3(t, inv);
  }
  const unc = (k: number): number => Math.sqrt(Math.max(0, cov[k]![k]!));
  return {
    C: { value: C, uncertainty: unc(2) },
    B: { value: p[1], uncertainty: unc(1) },
    A: { value: p[0], uncertainty: unc(0) },
    residuals,
    fittedOn: Ns,
    uncertaintyFrom: fromRows ? 'rowErrors' : 'residuals',
  };
}

function mul3(a: number[][], b: number[][]): number[][] {
  return [0, 1, 2].map((i) =>
    [0, 1, 2].map((j) => a[i]![0]! * b[0]![j]! + a[i]![1]! * b[1]![j]! + a[i]![2]! * b[2]![j]!),
  );
}
