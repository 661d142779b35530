/**
 * The one error type the engine throws. `field` names the part of the gas spec (dotted path, e.g.
 * `weights.expression`) the problem comes from, when known; `message` is written for a person.
 */
export class EngineError extends Error {
  readonly field?: string;
  constructor(message: string, field?: string) {
    super(message);
    this.name = 'EngineError';
    if (field !== undefined) this.field = field;
  }
}

/** Raised when a caller's `shouldStop` asks the computation to end early. */
export class EngineCancelled extends EngineError {
  constructor() {
    super('computation cancelled');
    this.name = 'EngineCancelled';
  }
}

/** Re-raise `e` with `field` attached when it is an EngineError without one; wrap anything else. */
export function withField(e: unknown, field: string): EngineError {
  if (e instanceof EngineCancelled) return e;
  if (e instanceof EngineError) {
    return e.field === undefined ? new EngineError(e.message, field) : e;
  }
  const message = e instanceof Error ? e.message : String(e);
  return new EngineError(message, field);
}

/** One-line text for a person: `field: message`. */
export function describeError(e: EngineError): string {
  return e.field ? `${e.field}: ${e.message}` : e.message;
}
