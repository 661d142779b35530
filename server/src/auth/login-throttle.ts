/**
 * Counts failed sign-ins per account + client address in a sliding window. At the limit the
 * caller is refused until the oldest counted failure leaves the window. In memory: one server
 * process, and a restart forgets (acceptable for a throttle, not for an audit).
 */
export class LoginThrottle {
  private readonly failures = new Map<string, number[]>();

  constructor(
    private readonly maxFailures: number,
    private readonly windowMs: number,
    private readonly now: () => number = Date.now,
  ) {}

  /** Seconds until `key` may try again, or 0 when it may try now. */
  retryAfterSeconds(key: string): number {
    const recent = this.recent(key);
    if (recent.length < this.maxFailures) return 0;
    const freeAt = recent[recent.length - this.maxFailures] + this.windowMs;
    return Math.max(1, Math.ceil((freeAt - this.now()) / 1000));
  }

  /** Counts one failure for `key`. */
  recordFailure(key: string): void {
    const recent = this.recent(key);
    recent.push(this.now());
    this.failures.set(key, recent);
    if (this.failures.size > 10_000) this.sweep();
  }

  /** Forgets `key`'s failures (after a successful sign-in). */
  reset(key: string): void {
    this.failures.delete(key);
  }

  private recent(key: string): number[] {
    const since = this.now() - this.windowMs;
    const recent = (this.failures.get(key) ?? []).filter((t) => t > since);
    if (recent.length === 0) this.failures.delete(key);
    return recent;
  }

  private sweep(): void {
    for (const key of [...this.failures.keys()]) this.recent(key);
  }
}
