import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit';
import { Op, QueryTypes } from 'sequelize';
import { RateLimitModel } from '../models';

type Row = { hits: number; reset_at: Date };

function database() {
  const sequelize = RateLimitModel.sequelize;
  if (!sequelize) throw new Error('RateLimitModel is not initialised');
  return sequelize;
}

/**
 * An express-rate-limit store over the rate_limits table, so every server instance counts the
 * same tries. Counting is one atomic upsert: a window that has ended starts again at 1, and
 * times come from the database's clock, so instances with drifting clocks still agree.
 */
export class PostgresRateLimitStore implements Store {
  readonly localKeys = false;
  private windowMs = 60_000;
  private lastSweepMs = 0;

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const row = await RateLimitModel.findOne({
      where: { key, resetAt: { [Op.gt]: database().fn('now') } },
    });
    return row ? { totalHits: row.hits, resetTime: row.resetAt } : undefined;
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    await this.sweep();
    const [row] = await database().query<Row>(
      `INSERT INTO rate_limits (key, hits, reset_at)
       VALUES (:key, 1, now() + make_interval(secs => :seconds))
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN rate_limits.reset_at <= now() THEN 1 ELSE rate_limits.hits + 1 END,
         reset_at = CASE WHEN rate_limits.reset_at <= now() THEN EXCLUDED.reset_at
                         ELSE rate_limits.reset_at END
       RETURNING hits, reset_at`,
      { replacements: { key, seconds: this.windowMs / 1000 }, type: QueryTypes.SELECT },
    );
    if (!row) throw new Error('rate limit upsert returned no row');
    return { totalHits: row.hits, resetTime: new Date(row.reset_at) };
  }

  async decrement(key: string): Promise<void> {
    await RateLimitModel.decrement('hits', {
      by: 1,
      where: { key, hits: { [Op.gt]: 0 }, resetAt: { [Op.gt]: database().fn('now') } },
    });
  }

  async resetKey(key: string): Promise<void> {
    await RateLimitModel.destroy({ where: { key } });
  }

  /** Ended windows are deleted at most once per window length by each store. */
  private async sweep(): Promise<void> {
    const now = Date.now();
    if (now - this.lastSweepMs < this.windowMs) return;
    this.lastSweepMs = now;
    await RateLimitModel.destroy({ where: { resetAt: { [Op.lte]: database().fn('now') } } });
  }
}
