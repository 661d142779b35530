import { EngineCancelled, EngineError } from '../../errors.js';
import { Real, toNumber } from '../real.js';

/**
 * A failure while a compiled expression is evaluated at one point: a pole, a value outside a
 * function's domain, an overflow, a sum that does not converge. `head` says what happened to the
 * expression ("has a pole"), `detail` why ("division by zero"); the compiled function turns it
 * into an EngineError naming the point.
 */
export class PointFailure extends Error {
  constructor(
    readonly head: string,
    readonly detail: string,
  ) {
    super(`${head}: ${detail}`);
    this.name = 'PointFailure';
  }
}

/** A pole: division by zero, log 0, gamma at a non-positive integer, 0 to a negative power. */
export function pole(detail: string): PointFailure {
  return new PointFailure('has a pole', detail);
}

/** A value outside a function's domain (sqrt or log of a negative number, ...). */
export function notDefined(detail: string): PointFailure {
  return new PointFailure('is not defined', detail);
}

/** A value too large to carry on with. */
export function overflow(detail: string): PointFailure {
  return new PointFailure('overflows', detail);
}

/** A bound value written with a few digits for a message ("0.5", "3", "1.23457e-7"). */
export function formatPointValue(x: Real): string {
  const v = toNumber(x);
  if (Number.isInteger(v) && Math.abs(v) < 1e15) return String(v);
  if (!Number.isFinite(v)) return v > 0 ? 'a huge number' : 'a huge negative number';
  return String(Number(v.toPrecision(6)));
}

/** "x = 0.5, y = 0.5" from the slot names and the values bound at the moment of the failure. */
export function describePoint(
  names: readonly string[],
  env: readonly (Real | undefined)[],
): string {
  const parts: string[] = [];
  names.forEach((name, i) => {
    const v = env[i];
    if (v !== undefined) parts.push(`${name} = ${formatPointValue(v)}`);
  });
  return parts.join(', ');
}

/**
 * The EngineError (carrying `field`) for an error thrown while evaluating at a point: failures of
 * ours, RangeErrors of the Real arithmetic (division by zero, square root of a negative number)
 * and domain errors of the special functions all name the point; cancellation passes through.
 */
export function errorAtPoint(
  e: unknown,
  names: readonly string[],
  env: readonly (Real | undefined)[],
  field: string,
): Error {
  if (e instanceof EngineCancelled) return e;
  let failure: PointFailure;
  if (e instanceof PointFailure) failure = e;
  else if (e instanceof RangeError) {
    failure = /division by zero/.test(e.message) ? pole(e.message) : notDefined(e.message);
  } else if (e instanceof EngineError) failure = notDefined(e.message);
  else return e instanceof Error ? e : new Error(String(e));
  const point = describePoint(names, env);
  return new EngineError(
    point === ''
      ? `${failure.head}: ${failure.detail}`
      : `${failure.head} at ${point}: ${failure.detail}`,
    field,
  );
}
