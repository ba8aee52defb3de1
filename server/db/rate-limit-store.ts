import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit';
import type { Db } from './knex';

/**
 * express-rate-limit's Store (its documented interface: init, get, increment, decrement, resetKey)
 * over the app's own database, so two processes on one database count one client together instead
 * of each allowing the limit. A count starts a window on its first hit; a hit after the window
 * starts a new one. Each increment is one transaction (SQLite serializes writers).
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
    return this.db.transaction(async (trx) => {
      const now = Date.now();
      const row = await trx('rate_limits').where({ key: k }).first();
      if (!row || Number(row.reset_at) <= now) {
        const resetAt = now + this.windowMs;
        await trx('rate_limits').insert({ key: k, hits: 1, reset_at: resetAt }).onConflict('key').merge({ hits: 1, reset_at: resetAt });
        return { totalHits: 1, resetTime: new Date(resetAt) };
      }
      await trx('rate_limits').where({ key: k }).increment('hits', 1);
      return { totalHits: row.hits + 1, resetTime: new Date(Number(row.reset_at)) };
    });
  }

  async decrement(key: string): Promise<void> {
    await this.db('rate_limits').where({ key: this.key(key) }).andWhere('hits', '>', 0).decrement('hits', 1);
  }

  async resetKey(key: string): Promise<void> {
    await this.db('rate_limits').where({ key: this.key(key) }).del();
  }
}
