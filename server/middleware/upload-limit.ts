import type { RequestHandler } from 'express';
import rateLimit from 'express-rate-limit';
import type { Db } from '../db/knex';
import { DbRateLimitStore } from '../db/rate-limit-store';

/** Uploads (multipart requests) one signed-in user may send in 15 minutes: a person at work never nears it; a runaway script does. */
export const UPLOAD_LIMIT = 60;

/** Counts every multipart request per signed-in user, in the database; the 61st in 15 minutes is a 429 with a sentence. */
export function uploadLimit(db: Db, limit = UPLOAD_LIMIT): RequestHandler {
  const limiter = rateLimit({
    windowMs: 15 * 60 * 1000,
    limit,
    keyGenerator: (req) => `user:${(req.user as { id?: number } | undefined)?.id ?? 'none'}`,
    store: new DbRateLimitStore(db, 'upload:'),
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    handler: (_req, res) => {
      res.status(429).json({ error: { code: 'too-many-uploads', message: `You have sent ${limit} files in 15 minutes, the most Gridset takes; wait a few minutes and send the rest.`, details: null } });
    },
  });
  return (req, res, next) => {
    // Signed-out requests are refused by the route's own access check; only multipart bodies count.
    if (!req.user || !req.is('multipart/form-data')) return next();
    return limiter(req, res, next);
  };
}
