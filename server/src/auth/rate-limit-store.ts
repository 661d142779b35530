import type { ClientRateLimitInfo, IncrementResponse, Options, Store } from 'express-rate-limit';
import type { DataSource } from 'typeorm';

interface Row {
  hits: number;
  reset_at: number;
  updated_at: number;
}

/** Expired counters are swept after this many increments. */
const SWEEP_EVERY = 200;

/**
 * Counters in the `rate_limit` table: fixed windows per key, one atomic UPSERT per hit, so
 * counts survive a restart and two processes share them. Backs express-rate-limit (through
 * its `Store` interface) and the per-account sign-in backoff.
 */
export class SqliteRateLimitStore implements Store {
  windowMs = 60_000;
  readonly localKeys = false;
  private increments = 0;

  constructor(
    private readonly dataSource: DataSource,
    readonly prefix: string,
    private readonly now: () => number = Date.now,
  ) {}

  /** express-rate-limit hands over its options once: the window length. */
  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  private k(key: string): string {
    return `${this.prefix}${key}`.slice(0, 300);
  }

  /** The counter of `key` with the time of its last hit, or undefined outside a window. */
  async read(key: string): Promise<{ hits: number; resetAt: number; lastAt: number } | undefined> {
    const rows = (await this.dataSource.query(
      `SELECT hits, reset_at, updated_at FROM rate_limit WHERE key = ? AND reset_at > ?`,
      [this.k(key), this.now()],
    )) as Row[];
    const row = rows[0];
    return row && { hits: row.hits, resetAt: row.reset_at, lastAt: row.updated_at };
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const row = await this.read(key);
    return row && { totalHits: row.hits, resetTime: new Date(row.resetAt) };
  }

  async increment(key: string): Promise<IncrementResponse> {
    const now = this.now();
    const rows = (await this.dataSource.query(
      `INSERT INTO rate_limit (key, hits, reset_at, updated_at) VALUES (?, 1, ?, ?)
       ON CONFLICT(key) DO UPDATE SET
         hits = CASE WHEN reset_at <= excluded.updated_at THEN 1 ELSE hits + 1 END,
         reset_at = CASE WHEN reset_at <= excluded.updated_at THEN excluded.reset_at ELSE reset_at END,
         updated_at = excluded.updated_at
       RETURNING hits, reset_at`,
      [this.k(key), now + this.windowMs, now],
    )) as Row[];
    if (++this.increments % SWEEP_EVERY === 0) {
      await this.dataSource.query(`DELETE FROM rate_limit WHERE reset_at <= ?`, [now]);
    }
    return { totalHits: rows[0]!.hits, resetTime: new Date(rows[0]!.reset_at) };
  }

  async decrement(key: string): Promise<void> {
    await this.dataSource.query(`UPDATE rate_limit SET hits = MAX(hits - 1, 0) WHERE key = ?`, [
      this.k(key),
    ]);
  }

  async resetKey(key: string): Promise<void> {
    await this.dataSource.query(`DELETE FROM rate_limit WHERE key = ?`, [this.k(key)]);
  }
}
