import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit';
import type { Db } from './knex';

/**
 * express-rate-limit's Store (its documented interface: init, get, increment, decrement, resetKey)
 * over the app's own database, so two processes on one database count one client together instead
 * of each allowing the limit. A count starts a window on its first hit; a hit after the window
 * starts a new one. Each increment is one atomic statement.
 */
export class DbRateLimitStore implements Store {
  windowMs = 15 * 60 * 1000;
  localKeys = false;

  constructor(private readonly db: Db, readonly prefix: string) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  private key(k: string) {
    return `${this.prefix}${k}`.slice(0, 300);
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const row = await this.db('rate_limits').where({ key: this.key(key) }).first();
    if (!row || Number(row.reset_at) <= Date.now()) return undefined;
    return { totalHits: row.hits, resetTime: new Date(Number(row.reset_at)) };
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const k = this.key(key);
    const now = Date.now();
    const resetAt = now + this.windowMs;
    // One atomic upsert (INSERT … ON CONFLICT DO UPDATE … RETURNING, on SQLite 3.35+ and PostgreSQL):
    // a first hit or a hit after the window starts a new count, any other adds one. Two processes
    // hitting at once each add theirs; a read-then-write could lose one under PostgreSQL's READ COMMITTED.
    const expired = this.db.raw('rate_limits.reset_at <= ?', [now]);
    const [row] = (await this.db('rate_limits')
      .insert({ key: k, hits: 1, reset_at: resetAt })
      .onConflict('key')
      .merge({
        hits: this.db.raw('CASE WHEN ? THEN 1 ELSE rate_limits.hits + 1 END', [expired]),
        reset_at: this.db.raw('CASE WHEN ? THEN ? ELSE rate_limits.reset_at END', [expired, resetAt]),
      })
      .returning(['hits', 'reset_at'])) as { hits: number | string; reset_at: number | string }[];
    return { totalHits: Number(row!.hits), resetTime: new Date(Number(row!.reset_at)) };
  }

  async decrement(key: string): Promise<void> {
    await this.db('rate_limits').where({ key: this.key(key) }).andWhere('hits', '>', 0).decrement('hits', 1);
  }

  async resetKey(key: string): Promise<void> {
    await this.db('rate_limits').where({ key: this.key(key) }).del();
  }
}
