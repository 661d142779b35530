import type { RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit, type RateLimitExceededEventHandler } from 'express-rate-limit';
import type { DataSource } from 'typeorm';
import { AppError } from '../http/app-error.js';
import { SqliteRateLimitStore } from './rate-limit-store.js';

/** How sign-in is bounded (see docs/operations.md). */
export interface SignInLimits {
  /** Failed sign-ins one address may make per window. */
  perAddress: number;
  /** Sign-in attempts everyone together may make per minute. */
  globalPerMinute: number;
  /** Failures of one account before backoff starts; then 1 s, 2 s, 4 s ... up to `maxBackoffSeconds`. */
  freeFailures: number;
  maxBackoffSeconds: number;
  windowMs: number;
  /** Password hashes computed at once; more wait in line, up to `hashQueue`, then 503. */
  hashConcurrency: number;
  hashQueue: number;
}

/** Defaults: 20 failures per address per 15 min, 300 attempts per minute in all. */
export const DEFAULT_SIGN_IN_LIMITS: SignInLimits = {
  perAddress: 20,
  globalPerMinute: 300,
  freeFailures: 5,
  maxBackoffSeconds: 300,
  windowMs: 15 * 60 * 1000,
  hashConcurrency: 2,
  hashQueue: 32,
};

function tooMany(seconds: number, what: string): AppError {
  const wait = Math.max(1, Math.ceil(seconds));
  return new AppError(
    429,
    'too_many_attempts',
    `Too many ${what}. Try again in ${wait} second(s).`,
    undefined,
    { 'Retry-After': String(wait) },
  );
}

/**
 * Per-account backoff instead of a lockout: after `freeFailures` failures in the window each
 * further attempt waits 2^(k) seconds after the last failure (k = failures beyond the free
 * ones), capped at `maxBackoffSeconds` — slow for a guesser, never a lockout for the owner.
 */
export class AccountBackoff {
  private readonly store: SqliteRateLimitStore;

  constructor(
    dataSource: DataSource,
    private readonly limits: SignInLimits,
    now: () => number = Date.now,
  ) {
    this.store = new SqliteRateLimitStore(dataSource, 'account:', now);
    this.store.windowMs = limits.windowMs;
    this.now = now;
  }

  private readonly now: () => number;

  /** Throws 429 with Retry-After while `email` must wait. */
  async check(email: string): Promise<void> {
    const row = await this.store.read(email.toLowerCase());
    if (!row || row.hits < this.limits.freeFailures) return;
    const delay = Math.min(
      2 ** (row.hits - this.limits.freeFailures),
      this.limits.maxBackoffSeconds,
    );
    const wait = (row.lastAt + delay * 1000 - this.now()) / 1000;
    if (wait > 0) throw tooMany(wait, 'failed sign-ins for this account');
  }

  async fail(email: string): Promise<void> {
    await this.store.increment(email.toLowerCase());
  }

  async succeed(email: string): Promise<void> {
    await this.store.resetKey(email.toLowerCase());
  }
}

/**
 * A cap on password hashes computed at once (scrypt is memory- and CPU-heavy): callers beyond
 * `concurrency` wait in line; beyond `queue` waiting, 503 `busy` with Retry-After.
 */
export class HashGate {
  private running = 0;
  private readonly waiting: Array<() => void> = [];

  constructor(
    private readonly concurrency: number,
    private readonly queue: number,
  ) {}

  async run<T>(work: () => Promise<T>): Promise<T> {
    if (this.running >= this.concurrency) {
      if (this.waiting.length >= this.queue) {
        throw new AppError(
          503,
          'busy',
          'The server is busy signing people in; try again shortly.',
          undefined,
          {
            'Retry-After': '2',
          },
        );
      }
      await new Promise<void>((resolve) => this.waiting.push(resolve));
    } else {
      this.running += 1;
    }
    try {
      return await work();
    } finally {
      const next = this.waiting.shift();
      if (next) next();
      else this.running -= 1;
    }
  }
}

/**
 * The express-rate-limit buckets for the public sign-in routes (sign-in, password reset),
 * counted in the database: failures per address (successes are taken back), and all attempts
 * together per minute (spraying many e-mails from many addresses).
 */
export function signInLimiters(dataSource: DataSource, limits: SignInLimits): RequestHandler[] {
  const handler =
    (what: string): RateLimitExceededEventHandler =>
    (req, _res, next) => {
      const reset = (req as { rateLimit?: { resetTime?: Date } }).rateLimit?.resetTime;
      next(tooMany(reset ? (reset.getTime() - Date.now()) / 1000 : 60, what));
    };
  const perAddress = rateLimit({
    windowMs: limits.windowMs,
    limit: limits.perAddress,
    skipSuccessfulRequests: true,
    standardHeaders: false,
    legacyHeaders: false,
    keyGenerator: (req) => ipKeyGenerator(req.ip ?? 'unknown'),
    store: new SqliteRateLimitStore(dataSource, 'address:'),
    handler: handler('failed sign-ins from this address'),
  });
  const global = rateLimit({
    windowMs: 60_000,
    limit: limits.globalPerMinute,
    standardHeaders: false,
    legacyHeaders: false,
    keyGenerator: () => 'all',
    store: new SqliteRateLimitStore(dataSource, 'global:'),
    handler: handler('sign-in attempts on this server'),
  });
  return [perAddress, global];
}
