/**
 * Test helpers for the special-function specs (a `.test.ts` file: left out of the library build,
 * and not collected as a spec). Independent reference values come from python3 + mpmath; the
 * closeness check works on Real, so no float64 rounding enters.
 */
import { spawnSync } from 'node:child_process';
import { expect } from 'vitest';
import { parseDecimal } from '../decimal.js';
import { abs, bitsFor, magnitude, Real, sub } from '../real.js';

/** Whether python3 with mpmath can be run here (checked once). */
export const hasMpmath: boolean = (() => {
  const r = spawnSync('python3', ['-c', 'import mpmath'], { encoding: 'utf8' });
  return r.status === 0;
})();

/** Message for the skipped cross-checks. */
export const NO_MPMATH = 'python3 with mpmath is not available: the mpmath cross-check is skipped';

/**
 * Evaluate mpmath expressions (Python syntax, `from mpmath import *` in scope) at `dps` digits and
 * return each as a decimal string with `dps` significant digits (mpmath works at workDps,
 * 2 dps + 20 unless told).
 */
export function mpmath(exprs: string[], dps = 50, workDps = 2 * dps + 20): string[] {
  const script = [
    'from mpmath import *',
    `mp.dps = ${workDps}`, // some mpmath routines (jtheta near q = 1) cancel
    'import sys, json',
    'exprs = json.loads(sys.stdin.read())',
    `print(json.dumps([nstr(eval(e), ${dps}, min_fixed=1, max_fixed=0) for e in exprs]))`,
  ].join('\n');
  const r = spawnSync('python3', ['-c', script], {
    input: JSON.stringify(exprs),
    encoding: 'utf8',
  });
  if (r.status !== 0) throw new Error(`mpmath failed: ${r.stderr}`);
  return JSON.parse(r.stdout) as string[];
}

/**
 * Expect |got - want| <= 10^-digits * max(|want|, floor) where want is a decimal text; `floor`
 * (default 0) makes the check absolute next to a zero.
 */
export function expectDigits(got: Real, want: string, digits: number, floor = 0): void {
  const p = bitsFor(digits + 20);
  const w = parseDecimal(want, p);
  const diff = abs(sub(got, w, p));
  const scale = Math.max(magnitude(w), floor === 0 ? -Infinity : Math.log2(floor));
  // allowed error 10^-digits * 2^scale, compared by exponents with one bit of slack
  const allowed = scale - digits * Math.log2(10);
  const ok = diff.m === 0n || magnitude(diff) <= allowed;
  expect(ok, `got ${got.m}*2^${got.e}, want ${want}, |diff| ~ 2^${magnitude(diff)}`).toBe(true);
}

/** Relative difference check between two Reals (for identities). */
export function expectSame(a: Real, b: Real, digits: number): void {
  const p = bitsFor(digits + 20);
  const diff = abs(sub(a, b, p));
  const allowed = magnitude(b) - digits * Math.log2(10);
  expect(diff.m === 0n || magnitude(diff) <= allowed, `differ by 2^${magnitude(diff)}`).toBe(true);
}

/** A Real as an exact mpmath expression. */
export function py(x: Real): string {
  return `ldexp(mpf(${x.m}), ${x.e})`;
}
