import { execFileSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { airyFit, logAbsReal, logAiry } from './airy-fit.js';
import { exp, pi } from './elementary.js';
import { div, fromInt, fromNumber, mul, ONE, Real, sub } from './real.js';

// Ai(x) and Ai'(x)/Ai(x): mpmath 1.3 at 30 digits, independent (Ai(0), Ai(1), Ai(5), Ai(10) also
// DLMF Table 9.9.1 / DLMF 9.2.3)
const AIRY: [x: number, ai: number, dlog: number][] = [
  [-2, 0.22740742820168558, 2.7187283442358037],
  [-1, 0.53556088329235212, -0.01897182455556366],
  [0, 0.3550280538878172, -0.72901113294722698],
  [0.5, 0.23169360648083349, -0.970723949101674],
  [1, 0.1352924163128814, -1.176321967143701],
  [1.5, 0.07174949700810541, -1.3572501118899865],
  [2, 0.034924130423274379, -1.5201633881848286],
  [3, 0.0065911393574607191, -1.8074229749772539],
  [5, 1.083444281360744e-4, -2.283586660845399],
  [8, 4.6922076160992316e-8, -2.8588660341972762],
  [10, 1.104753255289869e-10, -3.1868054335944625],
  [20, 1.6916728686705403e-27, -4.4845500369763472],
];

describe('logAiry (float64, for fitting)', () => {
  it.each(AIRY)('Ai(%d)', (x, ai, dlog) => {
    const r = logAiry(x);
    expect(Math.abs(Math.exp(r.logAi) / ai - 1)).toBeLessThan(1e-14);
    expect(Math.abs(r.dlogAi - dlog)).toBeLessThan(1e-14 * Math.max(1, Math.abs(dlog)));
  });

  it('log Ai(100) = -669.08357542530963 (mpmath 1.3), beyond float64 range of Ai itself', () => {
    expect(Math.abs(logAiry(100).logAi + 669.08357542530963)).toBeLessThan(1e-12);
  });

  it('is NaN at and below the first zero of Ai (-2.33810741..., DLMF Table 9.9.1)', () => {
    expect(logAiry(-2.4).logAi).toBeNaN();
    expect(Number.isFinite(logAiry(-2.33).logAi)).toBe(true);
  });

  it('agrees with mpmath computed now, on a spread of arguments', () => {
    const xs = [-2.2, -0.7, 0.3, 1.49, 1.51, 2.7, 4.4, 6.6, 9.99, 10.01, 15, 42];
    let out: string;
    try {
      const code = `import mpmath as m; m.mp.dps=30; print(' '.join(m.nstr(m.log(m.airyai(x)),20) for x in [${xs.join(',')}]))`;
      out = execFileSync('python3', ['-c', code], { encoding: 'utf8' });
    } catch {
      return; // no python3 with mpmath on this machine: the literal table above still checks
    }
    const ref = out.trim().split(/\s+/).map(Number);
    xs.forEach((x, i) => {
      expect(Math.abs(logAiry(x).logAi - ref[i]!)).toBeLessThan(
        1e-14 * Math.max(1, Math.abs(ref[i]!)),
      );
    });
  });
});

// ABJM k = 1 (SOURCES.md, Marino-Putrov 2012, from memory): C = 2/pi^2, B = 1/24 + 1/3
const C1 = 2 / Math.PI ** 2;
const B1 = 1 / 24 + 1 / 3;
const logZForm = (C: number, B: number, A: number, N: number): number =>
  A - Math.log(C) / 3 + logAiry(C ** (-1 / 3) * (N - B)).logAi;
const row = (N: number, logZ: number, relError: number) => {
  const value = exp(fromNumber(logZ), 80);
  return { N, value, error: relError * Math.exp(logZ) };
};

/** mulberry32, seeded; then Box-Muller */
function gaussian(seed: number): () => number {
  let a = seed;
  const u = (): number => {
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(1 - u())) * Math.cos(2 * Math.PI * u());
}

describe('airyFit', () => {
  const truths = [
    {
      name: 'ABJM k = 1, N = 1..15',
      C: C1,
      B: B1,
      A: -0.4,
      Ns: [...Array(15).keys()].map((i) => i + 1),
    },
    { name: 'large N', C: C1, B: B1, A: 0.7, Ns: [20, 40, 60, 80, 100] },
    // k = 2: C = 1/pi^2, B = 2/24 + 1/6
    {
      name: 'k = 2 form',
      C: 1 / Math.PI ** 2,
      B: 1 / 12 + 1 / 6,
      A: 0.1,
      Ns: [2, 3, 4, 5, 6, 7, 8],
    },
  ];
  it.each(truths)('recovers C, B, A from exact synthetic data: $name', ({ C, B, A, Ns }) => {
    const fit = airyFit(Ns.map((N) => row(N, logZForm(C, B, A, N), 1e-30)))!;
    expect(fit).not.toBeNull();
    expect(fit.uncertaintyFrom).toBe('rowErrors');
    expect(fit.fittedOn).toEqual(Ns);
    for (const [got, want] of [
      [fit.C, C],
      [fit.B, B],
      [fit.A, A],
    ] as const) {
      expect(Math.abs(got.value - want)).toBeLessThan(1e-9);
      expect(Math.abs(got.value - want)).toBeLessThanOrEqual(5 * got.uncertainty + 1e-15);
    }
    for (const r of fit.residuals) expect(Math.abs(r.residual)).toBeLessThan(1e-11);
  });

  it('with noise, the uncertainties cover the truth', () => {
    const sigma = 1e-5;
    let within2 = 0;
    let within5 = 0;
    const trials = 30;
    for (let t = 0; t < trials; t++) {
      const g = gaussian(1000 + t);
      const rows = [...Array(12).keys()].map((i) => {
        const N = i + 1;
        return row(N, logZForm(C1, B1, -0.4, N) + sigma * g(), sigma);
      });
      const fit = airyFit(rows)!;
      for (const [got, want] of [
        [fit.C, C1],
        [fit.B, B1],
        [fit.A, -0.4],
      ] as const) {
        const z = Math.abs(got.value - want) / got.uncertainty;
        if (z <= 2) within2++;
        if (z <= 5) within5++;
      }
      // residuals at the noise level
      const rms = Math.sqrt(fit.residuals.reduce((s, r) => s + r.residual ** 2, 0) / 12);
      expect(rms).toBeLessThan(3 * sigma);
    }
    expect(within5).toBe(3 * trials);
    expect(within2).toBeGreaterThanOrEqual(0.85 * 3 * trials);
  });

  it('fits the published Z(1..4) of the line kernel close to the Fermi-gas constants', () => {
    // Hatsuda-Moriyama-Okuyama 2012 (SOURCES.md): Z(1..4); the form is asymptotic, its misfit at
    // N = 1..4 (non-perturbative corrections) is ~1e-7 in log Z
    const P = 200;
    const p = pi(P);
    const p2 = mul(p, p, P);
    const Z: Real[] = [
      div(ONE, fromInt(4), P),
      div(ONE, mul(fromInt(16), p, P), P),
      div(sub(p, fromInt(3), P), mul(fromInt(64), p, P), P),
      div(sub(fromInt(10), p2, P), mul(fromInt(1024), p2, P), P),
    ];
    const fit = airyFit(Z.map((value, i) => ({ N: i + 1, value, error: 1e-45 })))!;
    expect(fit.uncertaintyFrom).toBe('residuals');
    expect(Math.abs(fit.C.value - C1)).toBeLessThan(1e-5);
    expect(Math.abs(fit.B.value - B1)).toBeLessThan(1e-4);
    // A(1) = log(2)/4 - zeta(3)/(8 pi^2) = 0.158066... (from memory)
    const zeta3 = 1.2020569031595943;
    expect(Math.abs(fit.A.value - (Math.LN2 / 4 - zeta3 / (8 * Math.PI ** 2)))).toBeLessThan(1e-4);
    for (const r of fit.residuals) expect(Math.abs(r.residual)).toBeLessThan(1e-6);
  });

  it('needs at least 4 rows with Z(N) > 0; skips the others', () => {
    const rows = [1, 2, 3, 4, 5].map((N) => row(N, logZForm(C1, B1, 0, N), 1e-20));
    expect(airyFit(rows.slice(0, 3))).toBeNull();
    const withZero = [...rows.slice(0, 3), { N: 9, value: fromInt(0), error: 1e-20 }];
    expect(airyFit(withZero)).toBeNull();
    const withNegative = [...rows, { N: 9, value: fromInt(-1), error: 1e-20 }];
    expect(airyFit(withNegative)!.fittedOn).toEqual([1, 2, 3, 4, 5]);
  });

  it('logAbsReal reads log|x| of values far below float64 range', () => {
    // exp(-2000) underflows float64; its log does not
    expect(Math.abs(logAbsReal(exp(fromInt(-2000), 80)) + 2000)).toBeLessThan(1e-12);
  });
});
