import { EngineError } from '../../errors.js';
import type { Real } from '../real.js';
import * as specialModule from '../special/index.js';

/** The special functions the expression language calls, `(x, prec) => Real` (theta: 4 args). */
export interface SpecialFunctions {
  sin(x: Real, prec: number): Real;
  cos(x: Real, prec: number): Real;
  tan(x: Real, prec: number): Real;
  atan(x: Real, prec: number): Real;
  gamma(x: Real, prec: number): Real;
  zeta(x: Real, prec: number): Real;
  airyAi(x: Real, prec: number): Real;
  ellipticK(k: Real, prec: number): Real;
  ellipticE(k: Real, prec: number): Real;
  nomeOfModulus(k: Real, prec: number): Real;
  modulusOfNome(q: Real, prec: number): Real;
  theta(which: 1 | 2 | 3 | 4, z: Real, q: Real, prec: number): Real;
}

/** What the special-function module exports so far (it is being completed). */
const provided = specialModule as unknown as Partial<SpecialFunctions>;

/** Whether the special-function module provides `name` (compiling a call is an error if not). */
export function hasSpecial(name: keyof SpecialFunctions): boolean {
  return typeof provided[name] === 'function';
}

/** The special function `name`, or a clear error when the module does not provide it yet. */
export function special<K extends keyof SpecialFunctions>(
  name: K,
  shown: string,
): SpecialFunctions[K] {
  const f = provided[name];
  if (typeof f !== 'function') {
    throw new EngineError(`function ${shown} is not available yet in numeric mode`);
  }
  return f as SpecialFunctions[K];
}
