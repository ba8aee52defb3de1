import { ConnectSessionKnexStore } from 'connect-session-knex';
import type { SessionData } from 'express-session';
import type { Db } from './knex';

const TOUCH_EVERY_MS = 60_000;

/**
 * Sessions kept in the app's own database, in the table its migrations make (never the store's
 * createTable). express-session touches the stored expiry on every request; writing it at most
 * once a minute per session keeps reads from paying a write each (the same idea as connect-mongo's
 * touchAfter). A 12-hour session cannot lapse early for it.
 */
export class SessionStore extends ConnectSessionKnexStore {
  private lastTouch = new Map<string, number>();

  constructor(db: Db) {
    super({ knex: db, tableName: 'sessions', createTable: false, cleanupInterval: 15 * 60 * 1000 });
  }

  override async touch(sid: string, session: SessionData, callback?: () => void): Promise<void> {
    const now = Date.now();
    const last = this.lastTouch.get(sid);
    if (last !== undefined && now - last < TOUCH_EVERY_MS) {
      callback?.();
      return;
    }
    if (this.lastTouch.size > 10_000) this.lastTouch.clear();
    this.lastTouch.set(sid, now);
    // connect-session-knex's touch has no catch: a failed write (disk full, read-only, busy) would be
    // an unhandled rejection that ends the process. Passed to express-session instead, it becomes the
    // request's error, answered 503 by the error handler.
    try {
      await super.touch(sid, session, callback);
    } catch (err) {
      this.lastTouch.delete(sid);
      (callback as ((err?: unknown) => void) | undefined)?.(err);
    }
  }

  override async destroy(sid: string, callback?: (err?: unknown) => void): Promise<number> {
    this.lastTouch.delete(sid);
    return super.destroy(sid, callback);
  }
}
