import { ConnectSessionKnexStore } from 'connect-session-knex';
import type { Request } from 'express';
import type { Session, SessionData } from 'express-session';
import type { Db } from './knex';
import { hotReads, type HotReads, type StoredUserRow } from './hot-reads';

const TOUCH_EVERY_MS = 60_000;

// The user row read with the session rides on the session data under a symbol: express-session's
// Session copies only enumerable string keys, and JSON.stringify skips symbols, so it is never stored.
const USER_ROW = Symbol('signed-in user row');
type WithUserRow = SessionData & { [USER_ROW]?: { user: StoredUserRow | null; catalogStamp: number } };
const userRows = new WeakMap<object, StoredUserRow | null>();
const catalogStamps = new WeakMap<object, number>();

/**
 * The catalog's read stamp as read with this request's session (the same statement), or undefined
 * when the request had no stored session: read before anything the request reads afterwards, so it is
 * a stamp a page read after it may be kept under (read-stamps.ts).
 */
export const sessionCatalogStamp = (req: object): number | undefined => catalogStamps.get(req);

/** Keeps the catalog stamp read with a session for this request (see sessionCatalogStamp). */
export const keepSessionCatalogStamp = (req: object, stamp: number): void => void catalogStamps.set(req, stamp);

/**
 * The user row read together with this request's session (the same statement, this request), or
 * undefined when none was read for `id`; null when the session names a user that no longer exists.
 * Taken once: a later call reads afresh.
 */
export function takeSessionUserRow(req: object, id: number): StoredUserRow | null | undefined {
  if (!userRows.has(req)) return undefined;
  const row = userRows.get(req);
  userRows.delete(req);
  if (row && row.id !== id) return undefined;
  return row;
}

/**
 * Sessions kept in the app's own database, in the table its migrations make (never the store's
 * createTable). express-session touches the stored expiry on every request; writing it at most
 * once a minute per session keeps reads from paying a write each (the same idea as connect-mongo's
 * touchAfter). A 12-hour session cannot lapse early for it.
 */
export class SessionStore extends ConnectSessionKnexStore {
  private lastTouch = new Map<string, number>();
  private hot: HotReads;

  constructor(db: Db) {
    super({ knex: db, tableName: 'sessions', createTable: false, cleanupInterval: 15 * 60 * 1000 });
    this.hot = hotReads(db);
  }

  /**
   * The unexpired session with its signed-in user in one prepared read (hot-reads) instead of two
   * query-builder reads; passport's deserializer takes the user row from here (takeSessionUserRow).
   * Errors go to express-session's callback (the request's error, a 503), never thrown on.
   */
  override async get(sid: string, callback: (err: unknown, session?: SessionData | null) => void): Promise<SessionData | null> {
    let session: WithUserRow | null = null;
    try {
      const found = await this.hot.sessionAndUser(sid, new Date());
      if (found) {
        session = (typeof found.sess === 'string' ? JSON.parse(found.sess) : found.sess) as WithUserRow;
        session[USER_ROW] = { user: found.user ?? null, catalogStamp: found.catalogStamp };
      }
    } catch (err) {
      callback?.(err);
      return null;
    }
    callback?.(null, session);
    return session;
  }

  /**
   * For a read that may skip express-session (middleware/lean-session.ts): the user `sid` is signed
   * in as, with the catalog stamp read in the same statement, when the session is unexpired, its
   * user exists, and this process touched its expiry less than a minute ago (a session due a touch
   * goes the whole way, so its expiry moves exactly as before). Undefined otherwise.
   */
  async signedInRead(sid: string): Promise<{ user: StoredUserRow; catalogStamp: number } | undefined> {
    const last = this.lastTouch.get(sid);
    if (last === undefined || Date.now() - last >= TOUCH_EVERY_MS) return undefined;
    const found = await this.hot.sessionAndUser(sid, new Date());
    return found?.user ? { user: found.user, catalogStamp: found.catalogStamp } : undefined;
  }

  override createSession(req: Request, session: SessionData): Session & SessionData {
    const withRow = session as WithUserRow;
    const read = withRow[USER_ROW];
    if (read) {
      userRows.set(req, read.user);
      catalogStamps.set(req, read.catalogStamp);
      delete withRow[USER_ROW];
    }
    return super.createSession(req, session);
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
