import { describe, expect, it } from 'vitest';

// discretisations take a few seconds on a busy 2-core machine
const SLOW = { timeout: 60_000 };
import { EngineError } from '../../errors.js';
import { cosh, exp, pi } from '../elementary.js';
import { cos } from '../special/trig.js';
import {
  add,
  div,
  fromFraction,
  fromInt,
  mul,
  ONE,
  powInt,
  Real,
  sqrt,
  sub,
  toNumber,
} from '../real.js';
import { compileNumeric } from '../expr/compile.js';
import { compileFast } from '../expr/compile-dd.js';
import { kernelTraces, type KernelSource } from './index.js';

const P = 400;
const line = { from: null, to: null, periodic: false };

/** |value - exact| <= error, and error small enough for `digits` digits. */
function within(e: { value: Real; error: number }, exact: Real, digits: number): void {
  const diff = Math.abs(toNumber(sub(e.value, exact, P)));
  const size = Math.abs(toNumber(exact));
  expect(diff).toBeLessThanOrEqual(e.error + size * 1e-300);
  expect(e.error).toBeLessThanOrEqual(Math.max(0.5 * 10 ** -digits * size, 1e-300));
}

/** Z(1..4) of the line kernel: 1/4, 1/(16 pi), (pi - 3)/(64 pi), (10 - pi^2)/(1024 pi^2) (SOURCES.md). */
function publishedLine(): Real[] {
  const q = pi(P);
  return [
    fromFraction(1n, 4n, P),
    div(ONE, mul(fromInt(16), q, P), P),
    div(sub(q, fromInt(3), P), mul(fromInt(64), q, P), P),
    div(sub(fromInt(10), mul(q, q, P), P), mul(fromInt(1024), mul(q, q, P), P), P),
  ];
}

/** Rank-2 kernel on the line from the first two Hermite functions (orthonormal). */
function hermiteRank2(l0: Real, l1: Real): KernelSource {
  return (bits) => {
    const p = bits + 16;
    const c = div(ONE, sqrt(pi(p), p), p); // phi0^2 normalisation pi^(-1/2)
    return ([x, y]) => {
      const g = exp(div(add(mul(x!, x!, p), mul(y!, y!, p), p), fromInt(-2), p), p);
      const xy2 = mul(fromInt(2), mul(x!, y!, p), p);
      return mul(mul(c, g, p), add(l0, mul(l1, xy2, p), p), p);
    };
  };
}

/** Mehler kernel with eigenvalues t^n (Mehler's formula, DLMF 18.18.28). */
function mehler(t: Real): KernelSource {
  return (bits) => {
    const p = bits + 16;
    const t2 = mul(t, t, p);
    const oneMinus = sub(ONE, t2, p);
    const norm = div(ONE, sqrt(mul(pi(p), oneMinus, p), p), p);
    const onePlus = add(ONE, t2, p);
    return ([x, y]) => {
      const q = sub(
        mul(onePlus, add(mul(x!, x!, p), mul(y!, y!, p), p), p),
        mul(mul(fromInt(4), t, p), mul(x!, y!, p), p),
        p,
      );
      return mul(norm, exp(div(q, mul(fromInt(-2), oneMinus, p), p), p), p);
    };
  };
}

describe('kernelTraces: finite-rank kernels', () => {
  // exact: Z_L = l0^L + l1^L, Z(1) = l0 + l1, Z(2) = l0 l1, Z(N >= 3) = 0 (finite rank)
  it('Hermite rank 2 on the line, fermions, 12 digits', SLOW, () => {
    const l0 = fromFraction(1n, 3n, P);
    const l1 = fromFraction(1n, 5n, P);
    const r = kernelTraces(hermiteRank2(l0, l1), line, { digits: 12, nMax: 4, fermion: true });
    expect(r.parity).toBe(true);
    for (let L = 1; L <= 4; L++)
      within(r.traces[L - 1]!, add(powInt(l0, L, P), powInt(l1, L, P), P), 12);
    within(r.fredholm[1]!, add(l0, l1, P), 12);
    within(r.fredholm[2]!, mul(l0, l1, P), 12);
    for (const N of [3, 4])
      expect(Math.abs(toNumber(r.fredholm[N]!.value))).toBeLessThanOrEqual(r.fredholm[N]!.error);
  });

  // exact: rho = (1/(2 pi)) (a + 2 b cos(x - y)) on [-pi, pi) has eigenvalues a, b, b
  it('cosine kernel on a circle, bosons', SLOW, () => {
    const a = fromFraction(1n, 2n, P);
    const b = fromFraction(1n, 4n, P);
    const src: KernelSource = (bits) => (v) => {
      const p = bits + 16;
      const c = cos(sub(v[0]!, v[1]!, p), p);
      return div(add(a, mul(mul(fromInt(2), b, p), c, p), p), mul(fromInt(2), pi(p), p), p);
    };
    const piR = pi(P);
    const r = kernelTraces(
      src,
      { from: sub(ONE, add(ONE, piR, P), P), to: piR, periodic: true },
      {
        digits: 25,
        nMax: 3,
        fermion: false,
      },
    );
    // h_1 = a + 2b, h_2 = a^2 + 3b^2 + 2ab... complete homogeneous of (a, b, b)
    const lams = [a, b, b];
    const h = [ONE, fromInt(0), fromInt(0), fromInt(0)];
    for (const l of lams) for (let k = 1; k <= 3; k++) h[k] = add(h[k]!, mul(l, h[k - 1]!, P), P);
    for (let N = 1; N <= 3; N++) within(r.fredholm[N]!, h[N]!, 15);
    within(r.traces[1]!, add(mul(a, a, P), mul(fromInt(2), mul(b, b, P), P), P), 15);
  });
});

describe('kernelTraces: Mehler kernel (DLMF 18.18.28), eigenvalues t^n', () => {
  it(
    't = 1/2, fermions, 12 digits: Z_L = 1/(1 - t^L), Z(N) = t^(N(N-1)/2) / prod (1 - t^k)',
    SLOW,
    () => {
      const t = fromFraction(1n, 2n, P);
      const r = kernelTraces(mehler(t), line, { digits: 12, nMax: 4, fermion: true });
      let prod = ONE;
      for (let N = 1; N <= 4; N++) {
        within(r.traces[N - 1]!, div(ONE, sub(ONE, powInt(t, N, P), P), P), 12);
        prod = mul(prod, sub(ONE, powInt(t, N, P), P), P);
        within(r.fredholm[N]!, div(powInt(t, (N * (N - 1)) / 2, P), prod, P), 12);
      }
    },
  );
});

describe('kernelTraces: the line kernel (Hatsuda-Moriyama-Okuyama 2012, SOURCES.md)', () => {
  const lineKernel: KernelSource = (bits) => {
    const p = bits + 8;
    const twoPi = mul(fromInt(2), pi(p), p);
    const c2 = (x: Real): Real => mul(fromInt(2), cosh(div(x, fromInt(2), p), p), p);
    return ([x, y]) =>
      div(ONE, mul(mul(twoPi, sqrt(mul(c2(x!), c2(y!), p), p), p), c2(sub(x!, y!, p)), p), bits);
  };
  it(
    'fermions, 15 digits: Tr rho = Z(1) = 1/4, Z(2) = 1/(16 pi), Z(3) = (pi - 3)/(64 pi), Z(4) = (10 - pi^2)/(1024 pi^2)',
    SLOW,
    () => {
      const r = kernelTraces(lineKernel, line, { digits: 15, nMax: 4, fermion: true });
      const exact = publishedLine();
      within(r.traces[0]!, exact[0]!, 15);
      for (let N = 1; N <= 4; N++) within(r.fredholm[N]!, exact[N - 1]!, 15);
      // the trace route through the Newton recursion Z(2) = (Z_1^2 - Z_2) / 2 agrees
      const z2 = div(
        sub(mul(r.traces[0]!.value, r.traces[0]!.value, P), r.traces[1]!.value, P),
        fromInt(2),
        P,
      );
      expect(Math.abs(toNumber(sub(z2, exact[1]!, P)))).toBeLessThanOrEqual(
        r.traces[0]!.error * 0.5 + r.traces[1]!.error,
      );
    },
  );
});

describe('kernelTraces: bad kernels', () => {
  it('refuses a kernel that is not symmetric', SLOW, () => {
    const src: KernelSource =
      (bits) =>
      ([x, y]) =>
        exp(
          sub(
            mul(x!, fromFraction(1n, 3n, bits), bits),
            mul(mul(x!, x!, bits), add(ONE, mul(y!, y!, bits), bits), bits),
            bits,
          ),
          bits,
        );
    expect(() => kernelTraces(src, line, { digits: 10, nMax: 2, fermion: true })).toThrow(
      /not symmetric: rho\(x, y\) != rho\(y, x\) at x = /,
    );
  });
  it('refuses a kernel whose diagonal does not decay', SLOW, () => {
    const src: KernelSource =
      (bits) =>
      ([x, y]) =>
        div(ONE, add(fromInt(2), cos(sub(x!, y!, bits), bits), bits), bits);
    try {
      kernelTraces(src, line, { digits: 10, nMax: 2, fermion: true });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(EngineError);
      expect((e as EngineError).field).toBe('weights.expression');
      expect((e as EngineError).message).toMatch(/does not decay on the infinite side/);
    }
  });
  it('names the point of a pole', SLOW, () => {
    const src: KernelSource =
      (bits) =>
      ([x, y]) =>
        div(ONE, add(x!, y!, bits), bits);
    expect(() => kernelTraces(src, line, { digits: 10, nMax: 2, fermion: true })).toThrow(
      /no finite value at x = -3.1416\d*, y = 3.1416/,
    );
  });
});

describe('kernelTraces: entries in double-double from the expression (the fast path)', () => {
  const compiled =
    (text: string): KernelSource =>
    (bits) =>
      compileNumeric(text, { names: ['x', 'y'], prec: bits, field: 'weights.expression' });
  const LINE = '1/(2*pi) / sqrt(2*cosh(x/2)) / (2*cosh((x-y)/2)) / sqrt(2*cosh(y/2))';

  it(
    'the line kernel at 15 digits: the published Z(1..4) (SOURCES.md), Z(5..8) as the Real path',
    SLOW,
    () => {
      const opts = { digits: 15, nMax: 8, fermion: true };
      const fast = kernelTraces(compiled(LINE), line, {
        ...opts,
        fast: compileFast(LINE, ['x', 'y']),
      });
      const exact = publishedLine();
      for (let N = 1; N <= 4; N++) within(fast.fredholm[N]!, exact[N - 1]!, 15);
      const slow = kernelTraces(compiled(LINE), line, opts);
      for (let N = 5; N <= 8; N++) {
        const a = fast.fredholm[N]!;
        const b = slow.fredholm[N]!;
        expect(Math.abs(toNumber(sub(a.value, b.value, P)))).toBeLessThanOrEqual(a.error + b.error);
      }
    },
  );

  it(
    'a Mehler kernel written as an expression: eigenvalues t^n, t = 1/3 (DLMF 18.18.28)',
    SLOW,
    () => {
      // rho(x, y) = (pi (1 - t^2))^(-1/2) exp(-((1 + t^2)(x^2 + y^2) - 4 t x y) / (2 (1 - t^2)))
      const text = '1/sqrt(pi*(1 - 1/9)) * exp(-((1 + 1/9)*(x^2 + y^2) - 4/3*x*y) / (2*(1 - 1/9)))';
      const r = kernelTraces(compiled(text), line, {
        digits: 14,
        nMax: 4,
        fermion: true,
        fast: compileFast(text, ['x', 'y']),
      });
      // Z(N) = t^(N(N-1)/2) / prod_(k=1..N) (1 - t^k) for eigenvalues t^n (q-binomial theorem)
      const t = fromFraction(1n, 3n, P);
      let prod: Real = ONE;
      for (let N = 1; N <= 4; N++) {
        prod = mul(prod, sub(ONE, powInt(t, N, P), P), P);
        within(r.fredholm[N]!, div(powInt(t, (N * (N - 1)) / 2, P), prod, P), 14);
      }
    },
  );
});
