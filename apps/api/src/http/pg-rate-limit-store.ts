import type { Store, Options, ClientRateLimitInfo } from 'express-rate-limit';
import { QueryTypes, type Sequelize } from 'sequelize';

/**
 * express-rate-limit store kept in PostgreSQL, so every API process behind a load balancer counts the same
 * attempts (a memory store would give each process its own allowance).
 */
export class PgRateLimitStore implements Store {
  private windowMs = 60_000;
  readonly localKeys = false;

  constructor(
    private readonly sequelize: Sequelize,
    readonly prefix = 'rl:',
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const [row] = await this.sequelize.query<{ hits: number; reset_at: Date }>(
      `INSERT INTO rate_limit_hits AS r (key, hits, reset_at)
       VALUES (:key, 1, now() + make_interval(secs => :seconds))
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN r.reset_at <= now() THEN 1 ELSE r.hits + 1 END,
         reset_at = CASE WHEN r.reset_at <= now() THEN now() + make_interval(secs => :seconds) ELSE r.reset_at END
       RETURNING hits, reset_at`,
      { replacements: { key: this.prefix + key, seconds: this.windowMs / 1000 }, type: QueryTypes.SELECT },
    );
    return { totalHits: row!.hits, resetTime: new Date(row!.reset_at) };
  }

  async decrement(key: string): Promise<void> {
    await this.sequelize.query(`UPDATE rate_limit_hits SET hits = greatest(hits - 1, 0) WHERE key = :key`, {
      replacements: { key: this.prefix + key },
    });
  }

  async resetKey(key: string): Promise<void> {
    await this.sequelize.query(`DELETE FROM rate_limit_hits WHERE key = :key`, {
      replacements: { key: this.prefix + key },
    });
  }
}
