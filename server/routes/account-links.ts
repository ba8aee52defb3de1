import rateLimit from 'express-rate-limit';
import { CAN, ForgotPasswordInputSchema, InviteUserInputSchema, SetPasswordInputSchema } from '../../shared/schemas/auth';
import { currentUser } from '../middleware/auth';
import { FORGOT_PASSWORD_ANSWER, type AccountLinksService } from '../services/account-links';
import { parseOr400 } from './parse';
import type { RouteDef } from './route-table';
import type { Db } from '../db/knex';
import { DbRateLimitStore } from '../db/rate-limit-store';

const RESET_REQUEST_LIMIT = 5;
const RESET_REQUEST_WINDOW_MS = 15 * 60 * 1000;

/** Invitations (admin) and the two public pages a mailed link leads to. */
export function accountLinkRoutes(links: AccountLinksService, db: Db): RouteDef[] {
  // Counted per address, like failed sign-ins, so nobody can fill one person's mailbox or the outbox.
  // Unknown addresses count the same, so a 429 says nothing about whether an account exists.
  const resetRequests = rateLimit({
    windowMs: RESET_REQUEST_WINDOW_MS,
    limit: RESET_REQUEST_LIMIT,
    keyGenerator: (req) => `reset:${String(req.body?.email ?? '').trim().toLowerCase()}`,
    store: new DbRateLimitStore(db, 'reset:'),
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    handler: (_req, res) => {
      res.status(429).json({
        error: { code: 'too-many-requests', message: 'Too many reset requests for this address; wait 15 minutes, or ask an admin to invite you again.', details: null },
      });
    },
  });

  return [
    {
      method: 'post',
      path: '/users/invite',
      access: CAN.manageUsers,
      handler: async (req, res) => {
        const input = parseOr400(InviteUserInputSchema, req.body, 'invitation');
        const { user, resent } = await links.invite(currentUser(req), input);
        res.status(resent ? 200 : 201).json(user);
      },
    },
    {
      method: 'post',
      path: '/auth/set-password',
      access: 'public',
      handler: async (req, res) => {
        const input = parseOr400(SetPasswordInputSchema, req.body, 'new password');
        res.json({ ok: true, ...(await links.setPassword(input)) });
      },
    },
    {
      method: 'post',
      path: '/auth/forgot-password',
      access: 'public',
      before: [resetRequests],
      handler: (req, res) => {
        const { email } = parseOr400(ForgotPasswordInputSchema, req.body, 'request');
        links.forgotPassword(email);
        res.json(FORGOT_PASSWORD_ANSWER);
      },
    },
  ];
}
