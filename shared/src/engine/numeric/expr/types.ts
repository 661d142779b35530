import type { MathNode } from 'mathjs';
import { EngineError } from '../../errors.js';
import type { Truncation } from '../../expr/evaluate.js';
import type { Real } from '../real.js';

/**
 * A compiled piece of an expression: reads its bound values from `env` (the caller's values
 * first, then one slot per sum/prod index) and returns the value at working precision.
 */
export type Code = (env: (Real | undefined)[]) => Real;

/** A compiled node and the env slots it reads (none: a constant, folded once). */
export interface Compiled {
  code: Code;
  reads: ReadonlySet<number>;
}

/** The slots any of the parts read. */
export function readsOf(...parts: Compiled[]): ReadonlySet<number> {
  const out = new Set<number>();
  for (const p of parts) for (const s of p.reads) out.add(s);
  return out;
}

/** Names visible at a point of the expression, mapped to their env slot. */
export type Scope = ReadonlyMap<string, number>;

/** What the node compilers share while one expression is compiled. */
export interface Compiler {
  /** Caller's precision in bits (the tolerance of infinite sums is 2^-(prec+4)). */
  prec: number;
  /** Working precision (prec plus guard bits). */
  W: number;
  /** Name of every env slot (caller's names, then indices), for messages. */
  slotNames: string[];
  /** Where infinite sums and products record the most terms they used. */
  truncations: Truncation[];
  /** Called now and then inside long loops (progress, cancellation). */
  tick: (() => void) | undefined;
  compile(node: MathNode, scope: Scope): Compiled;
}

/** A compile-time error unless the call has exactly n arguments. */
export function arity(name: string, args: readonly MathNode[], n: number): void {
  if (args.length !== n) {
    throw new EngineError(`${name} takes ${n} argument${n === 1 ? '' : 's'}, got ${args.length}`);
  }
}
