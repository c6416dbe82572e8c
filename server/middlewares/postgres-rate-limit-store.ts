import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit';
import type { DataSource } from 'typeorm';

/** Every this many increments, a store removes counters whose window ended over an hour ago. */
const PRUNE_EVERY = 200;

interface HitRow {
  hits: number;
  reset_at: Date;
}

/**
 * express-rate-limit counters in PostgreSQL (table rate_limit_hit), so every server instance
 * counts the same hits. One row per limiter and key; an increment is one upsert that starts a
 * new window when the old one has ended, so concurrent requests on any instance never lose a hit.
 */
export class PostgresRateLimitStore implements Store {
  readonly localKeys = false;
  private windowMs = 60_000;
  private increments = 0;

  /** `prefix` names the counter set (e.g. "sign-in"): the `limiter` column of its rows. */
  constructor(
    private readonly dataSource: DataSource,
    readonly prefix: string,
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const rows = (await this.dataSource.query(
      'SELECT hits, reset_at FROM rate_limit_hit WHERE limiter = $1 AND key = $2 AND reset_at > now()',
      [this.prefix, key],
    )) as HitRow[];
    return rows[0] ? { totalHits: rows[0].hits, resetTime: rows[0].reset_at } : undefined;
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const rows = (await this.dataSource.query(
      `INSERT INTO rate_limit_hit AS r (limiter, key, hits, reset_at)
       VALUES ($1, $2, 1, now() + $3 * interval '1 millisecond')
       ON CONFLICT (limiter, key) DO UPDATE SET
         hits = CASE WHEN r.reset_at <= now() THEN 1 ELSE r.hits + 1 END,
         reset_at = CASE WHEN r.reset_at <= now() THEN EXCLUDED.reset_at ELSE r.reset_at END
       RETURNING hits, reset_at`,
      [this.prefix, key, this.windowMs],
    )) as HitRow[];
    this.increments += 1;
    if (this.increments % PRUNE_EVERY === 0) {
      await this.dataSource.query(`DELETE FROM rate_limit_hit WHERE reset_at < now() - interval '1 hour'`);
    }
    return { totalHits: rows[0].hits, resetTime: rows[0].reset_at };
  }

  async decrement(key: string): Promise<void> {
    await this.dataSource.query(
      'UPDATE rate_limit_hit SET hits = GREATEST(hits - 1, 0) WHERE limiter = $1 AND key = $2 AND reset_at > now()',
      [this.prefix, key],
    );
  }

  async resetKey(key: string): Promise<void> {
    await this.dataSource.query('DELETE FROM rate_limit_hit WHERE limiter = $1 AND key = $2', [this.prefix, key]);
  }

  async resetAll(): Promise<void> {
    await this.dataSource.query('DELETE FROM rate_limit_hit WHERE limiter = $1', [this.prefix]);
  }
}
