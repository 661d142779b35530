/**
 * Grid compression for the Newton recursion: when every weight has the shape Z_L = t^(cL) U_L(t^g)
 * (all non-zero exponents i of Z_L satisfy i = cL mod g and i >= cL), then Z(N) = t^(cN) V_N(t^g)
 * where V_N is the recursion on the U_L (substitute kappa -> kappa t^c, then t^g -> s). The
 * table is then computed on a g times shorter grid. Example: the harmonic trap in t = q^(1/2),
 * Z_L = t^L / (1 - t^(2L)), has c = 1, g = 2.
 */
import { gcdInt, reduceRow } from '../../integers.js';
import type { NewtonTableInput, NewtonTableResult } from './types.js';

/** The compression (g, c) with the largest g <= 64 that fits the weights, or null (g = 1). */
export function findCompression(input: NewtonTableInput): { g: number; c: number } | null {
  const { weights, nMax, length } = input;
  let g = 0;
  const first: number[] = [];
  for (let L = 1; L <= nMax; L++) {
    const w = weights[L - 1] ?? [];
    let f = -1;
    for (let i = 0; i < Math.min(w.length, length); i++) {
      if (w[i] === 0n) continue;
      if (f < 0) f = i;
      else g = gcdInt(g, i - f);
    }
    first.push(f);
  }
  if (g === 0) g = 64; // every weight a monomial (or zero): any grid fits the differences
  for (let h = Math.min(g, 64); h >= 2; h--) {
    if (g % h !== 0 && g !== 64) continue;
    for (let c = 0; c < h; c++) {
      let ok = true;
      for (let L = 1; L <= nMax && ok; L++) {
        const f = first[L - 1]!;
        if (f < 0) continue;
        ok = f >= c * L && (f - c * L) % h === 0;
      }
      if (ok) return { g: h, c };
    }
  }
  return null;
}

/** The weights U_L on the compressed grid, and the shorter length. */
export function compressInput(input: NewtonTableInput, g: number, c: number): NewtonTableInput {
  const short = Math.ceil(input.length / g);
  const weights = input.weights.slice(0, input.nMax).map((w, t) => {
    const L = t + 1;
    const u = new Array<bigint>(short).fill(0n);
    for (let k = 0; k < short; k++) {
      const i = c * L + g * k;
      if (i < Math.min(w.length, input.length)) u[k] = w[i]!;
    }
    return u;
  });
  const validLengths = Array.from({ length: input.nMax + 1 }, (_, N) =>
    Math.max(0, Math.ceil((input.length - c * N) / g)),
  );
  return { ...input, weights, length: short, validLengths };
}

/**
 * Z(N) on the original grid from V_N: Z(N)[cN + gk] = V_N[k], below the original length, reduced
 * again (entries of V_N beyond that came from cut weights and are dropped).
 */
export function expandResult(
  r: NewtonTableResult,
  g: number,
  c: number,
  length: number,
): NewtonTableResult {
  const den = [...r.den];
  const num = r.num.map((v, N) => {
    const out = new Array<bigint>(length).fill(0n);
    for (let k = 0; k < v.length; k++) {
      const i = c * N + g * k;
      if (i >= length) break;
      out[i] = v[k]!;
    }
    const reduced = reduceRow(out, den[N]!);
    den[N] = reduced.den;
    return reduced.num;
  });
  return { ...r, num, den };
}
