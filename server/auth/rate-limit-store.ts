import type { Store, Options, ClientRateLimitInfo } from 'express-rate-limit'
import type pg from 'pg'

/**
 * express-rate-limit store in PostgreSQL (table rate_limits), so every server process on one database counts
 * the same hits. One upsert per hit: a new window starts when the old one has passed.
 */
export class PgRateLimitStore implements Store {
  windowMs = 60_000
  /** Keys of each limiter are kept apart by this prefix. */
  readonly prefix: string
  readonly localKeys = false

  constructor(
    private readonly pool: pg.Pool,
    prefix: string,
  ) {
    this.prefix = prefix
  }

  init(options: Options): void {
    this.windowMs = options.windowMs
  }

  private k(key: string): string {
    return `${this.prefix}:${key}`
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const r = await this.pool.query<{ hits: number; reset_at: Date }>(
      'SELECT hits, reset_at FROM rate_limits WHERE key = $1 AND reset_at > now()',
      [this.k(key)],
    )
    const row = r.rows[0]
    return row ? { totalHits: row.hits, resetTime: row.reset_at } : undefined
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const r = await this.pool.query<{ hits: number; reset_at: Date }>(
      `INSERT INTO rate_limits (key, hits, reset_at)
       VALUES ($1, 1, now() + make_interval(secs => $2::double precision))
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN rate_limits.reset_at <= now() THEN 1 ELSE rate_limits.hits + 1 END,
         reset_at = CASE WHEN rate_limits.reset_at <= now() THEN EXCLUDED.reset_at ELSE rate_limits.reset_at END
       RETURNING hits, reset_at`,
      [this.k(key), this.windowMs / 1000],
    )
    const row = r.rows[0]!
    return { totalHits: row.hits, resetTime: row.reset_at }
  }

  async decrement(key: string): Promise<void> {
    await this.pool.query('UPDATE rate_limits SET hits = greatest(hits - 1, 0) WHERE key = $1', [this.k(key)])
  }

  async resetKey(key: string): Promise<void> {
    await this.pool.query('DELETE FROM rate_limits WHERE key = $1', [this.k(key)])
  }

  /** Old windows are deleted now and then by the limiter's own traffic (see pruneRateLimits). */
}

/** Delete finished windows; called by the outbox worker's loop so the table stays small. */
export async function pruneRateLimits(pool: pg.Pool): Promise<void> {
  await pool.query("DELETE FROM rate_limits WHERE reset_at < now() - interval '1 hour'")
}
