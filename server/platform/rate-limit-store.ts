import type pg from "pg";
import type { ClientRateLimitInfo, IncrementResponse, Options, Store } from "express-rate-limit";

/** Roughly one increment in this many also deletes rows whose window ended over an hour ago. */
const PRUNE_ONE_IN = 200;

/**
 * express-rate-limit's Store (v8 `Store` interface: init, increment, decrement, resetKey, get) kept in PostgreSQL, so
 * every app instance on one database counts the same hits. One upsert per hit does the window logic atomically: a
 * row whose window has ended starts again at 1 with a new reset time. Written here rather than taken from npm
 * because the packages for it create their own tables at run time, which the app role may not (DDL is migrations').
 */
export class PgRateLimitStore implements Store {
  private windowMs = 60_000;
  /** Counts are shared, never per process. */
  readonly localKeys = false;

  // No key prefix of its own: the limiter's keyGenerator already starts every key with the limiter's name
  // (auth.limits.ts), and express-rate-limit 8.7.5's double-count check (validations.singleCount) compares
  // `(store.prefix ?? "") + key`, which those names already keep apart.
  constructor(private readonly pool: pg.Pool) {}

  init(options: Options) {
    this.windowMs = options.windowMs;
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const r = await this.pool.query<{ hits: number; reset_at: Date }>(
      "SELECT hits, reset_at FROM rate_limit_hits WHERE key = $1 AND reset_at > now()",
      [key],
    );
    return r.rows[0] ? { totalHits: r.rows[0].hits, resetTime: r.rows[0].reset_at } : undefined;
  }

  async increment(key: string): Promise<IncrementResponse> {
    const r = await this.pool.query<{ hits: number; reset_at: Date }>(
      `INSERT INTO rate_limit_hits AS h (key, hits, reset_at)
       VALUES ($1, 1, now() + make_interval(secs => $2::double precision / 1000))
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN h.reset_at <= now() THEN 1 ELSE h.hits + 1 END,
         reset_at = CASE WHEN h.reset_at <= now() THEN EXCLUDED.reset_at ELSE h.reset_at END
       RETURNING hits, reset_at`,
      [key, this.windowMs],
    );
    if (Math.random() < 1 / PRUNE_ONE_IN) {
      void this.pool.query("DELETE FROM rate_limit_hits WHERE reset_at < now() - interval '1 hour'").catch(() => {});
    }
    return { totalHits: r.rows[0].hits, resetTime: r.rows[0].reset_at };
  }

  async decrement(key: string) {
    await this.pool.query(
      "UPDATE rate_limit_hits SET hits = hits - 1 WHERE key = $1 AND hits > 0 AND reset_at > now()",
      [key],
    );
  }

  async resetKey(key: string) {
    await this.pool.query("DELETE FROM rate_limit_hits WHERE key = $1", [key]);
  }
}
