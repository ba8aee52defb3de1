import type { RequestHandler } from 'express';
import { parse as parseCookies } from 'cookie';
import { unsign } from 'cookie-signature';
import { LRUCache } from 'lru-cache';
import type { SessionStore } from '../db/session-store';
import { keepSessionCatalogStamp } from '../db/session-store';
import { toUser } from '../db/users-repo';

/**
 * A signed-in read (GET or HEAD outside /auth) changes nothing in its session, so it needs neither
 * express-session's load, hash and save checks nor passport's deserializer: this reads the session
 * and its user in the one prepared statement the store uses (hot-reads) and sets `req.user` as
 * passport would. Every other request — a write, an /auth route, no or a badly signed cookie, an
 * expired or unknown session, a deactivated user, a session due its expiry touch — goes through
 * `full` (express-session then passport) exactly as before, so the answers are the same and the
 * user is still read from the database on every request.
 *
 * The cookie is checked as express-session checks it: named `cookieName`, value "s:" + the id
 * signed with HMAC-SHA256 (cookie-signature), tried against each secret.
 */
export function leanSessionReads(opts: { store: SessionStore; cookieName: string; secrets: string[]; full: RequestHandler }): RequestHandler {
  const { store, cookieName, secrets, full } = opts;
  // An HMAC is the same for the same value and secret, so a cookie checked once need not be
  // checked again while it is remembered; bounded, as every other per-process memory.
  const checked = new LRUCache<string, string | false>({ max: 10_000 });
  const unsignOnce = (signed: string): string | false => {
    let sid = checked.get(signed);
    if (sid === undefined) {
      sid = false;
      for (const secret of secrets) {
        sid = unsign(signed, secret);
        if (sid !== false) break;
      }
      checked.set(signed, sid);
    }
    return sid;
  };
  const sessionIdOf = (header: string | undefined): string | undefined => {
    if (!header || !header.includes(cookieName)) return undefined;
    const raw = parseCookies(header)[cookieName];
    if (!raw?.startsWith('s:')) return undefined;
    return unsignOnce(raw.slice(2)) || undefined;
  };
  return (req, res, next) => {
    if ((req.method !== 'GET' && req.method !== 'HEAD') || req.path.startsWith('/auth/')) return full(req, res, next);
    const sid = sessionIdOf(req.headers.cookie);
    if (sid === undefined) return full(req, res, next);
    store.signedInRead(sid).then((found) => {
      const user = found && toUser(found.user);
      if (!found || !user || !user.active) return full(req, res, next);
      req.user = user;
      req.sessionID = sid;
      keepSessionCatalogStamp(req, found.catalogStamp);
      next();
    }, next);
  };
}
