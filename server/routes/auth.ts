import type { Request } from 'express';
import rateLimit, { ipKeyGenerator } from 'express-rate-limit';
import type { Passport } from 'passport';
import { LoginInputSchema, UpdateMeInputSchema, type User } from '../../shared/schemas/auth';
import { HttpError, validationError } from '../middleware/errors';
import { currentUser } from '../middleware/auth';
import type { UsersService } from '../services/users';
import type { RouteDef } from './route-table';
import type { Db } from '../db/knex';
import { DbRateLimitStore } from '../db/rate-limit-store';

/** Failed sign-ins allowed in 15 minutes: per e-mail address (one account guessed at from many machines) and per client address (many accounts from one). */
export const FAILED_SIGN_IN_LIMIT = 5;
export const FAILED_SIGN_IN_PER_IP_LIMIT = 20;
const FAILED_SIGN_IN_WINDOW_MS = 15 * 60 * 1000;

export function authRoutes(deps: { users: UsersService; passport: InstanceType<typeof Passport>; csrfToken: (req: Request, overwrite?: boolean) => string; db: Db }): RouteDef[] {
  // Counts failed sign-ins per address (not per client), so one address cannot be guessed at from many machines.
  const failedSignIns = rateLimit({
    windowMs: FAILED_SIGN_IN_WINDOW_MS,
    limit: FAILED_SIGN_IN_LIMIT,
    skipSuccessfulRequests: true,
    requestWasSuccessful: (_req, res) => res.statusCode < 400,
    keyGenerator: (req) => `email:${String(req.body?.email ?? '').trim().toLowerCase()}`,
    store: new DbRateLimitStore(deps.db, 'sign-in:'),
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    handler: (_req, res) => {
      res.status(429).json({
        error: { code: 'too-many-attempts', message: `Too many failed sign-ins for this address; wait 15 minutes or ask an admin to help.`, details: null },
      });
    },
  });

  const failedSignInsFromIp = rateLimit({
    windowMs: FAILED_SIGN_IN_WINDOW_MS,
    limit: FAILED_SIGN_IN_PER_IP_LIMIT,
    skipSuccessfulRequests: true,
    requestWasSuccessful: (_req, res) => res.statusCode < 400,
    // An IPv6 client is counted by its /56 network (express-rate-limit's ipKeyGenerator), so it cannot hop addresses.
    keyGenerator: (req) => `ip:${ipKeyGenerator(req.ip ?? 'unknown')}`,
    store: new DbRateLimitStore(deps.db, 'sign-in:'),
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    // TRUST_PROXY decides which X-Forwarded-For to believe; the shop sets it, not this limiter.
    validate: { trustProxy: false },
    handler: (_req, res) => {
      res.status(429).json({
        error: { code: 'too-many-attempts', message: 'Too many failed sign-ins from this machine; wait 15 minutes or ask an admin to help.', details: null },
      });
    },
  });

  const signIn = (req: Request, user: User) =>
    new Promise<void>((resolve, reject) => {
      // A fresh session id at sign-in stops session fixation (OWASP Session Management Cheat Sheet).
      req.session.regenerate((err) => {
        if (err) return reject(err);
        req.logIn(user, { session: true }, (e) => (e ? reject(e) : resolve()));
      });
    });

  return [
    {
      method: 'get',
      path: '/auth/csrf',
      access: 'public',
      handler: (req, res) => {
        res.json({ token: deps.csrfToken(req) });
      },
    },
    {
      method: 'post',
      path: '/auth/login',
      access: 'public',
      before: [failedSignInsFromIp, failedSignIns],
      handler: async (req, res) => {
        const parsed = LoginInputSchema.safeParse(req.body);
        if (!parsed.success) throw validationError(parsed.error, 'sign-in');
        req.body = parsed.data;
        // passport-local reads the normalized address and password from the body.
        const user = await new Promise<User | false>((resolve, reject) =>
          deps.passport.authenticate('local', (err: unknown, u: User | false) => (err ? reject(err) : resolve(u)))(req, res, reject),
        );
        if (!user) throw new HttpError(401, 'bad-credentials', 'That e-mail address and password do not match an active account.');
        await signIn(req, user);
        res.json({ user, csrfToken: deps.csrfToken(req, true) });
      },
    },
    {
      method: 'post',
      path: '/auth/logout',
      access: 'public',
      handler: async (req, res) => {
        await new Promise<void>((resolve, reject) => req.logOut((err) => (err ? reject(err) : resolve())));
        await new Promise<void>((resolve) => req.session.regenerate(() => resolve()));
        res.json({ ok: true, csrfToken: deps.csrfToken(req, true) });
      },
    },
    {
      method: 'get',
      path: '/auth/me',
      access: 'signed-in',
      handler: (req, res) => {
        res.json({ user: currentUser(req) });
      },
    },
    {
      method: 'patch',
      path: '/auth/me',
      access: 'signed-in',
      handler: async (req, res) => {
        const parsed = UpdateMeInputSchema.safeParse(req.body);
        if (!parsed.success) throw validationError(parsed.error, 'profile');
        res.json({ user: await deps.users.setDisplayUnit(currentUser(req).id, parsed.data.displayUnit) });
      },
    },
  ];
}
