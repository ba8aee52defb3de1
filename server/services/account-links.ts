import { createHash, randomBytes } from 'node:crypto';
import type { InviteUserInput, SetPasswordInput, User } from '../../shared/schemas/auth';
import type { Db } from '../db/knex';
import type { UsersRepo } from '../db/users-repo';
import type { AuditRepo } from '../db/audit-repo';
import type { TokenPurpose, UserTokensRepo } from '../db/user-tokens-repo';
import type { Mailer } from '../mail/mailer';
import { HttpError, conflict } from '../middleware/errors';
import { hashPassword } from './passwords';
import { deleteSessionsOfUser, isUniqueViolation } from '../db/dialect';

/** How long a link works: a week to accept an invitation, an hour to reset a password. */
export const LINK_LIFETIME_MS: Record<TokenPurpose, number> = {
  invite: 7 * 24 * 60 * 60 * 1000,
  reset: 60 * 60 * 1000,
};

export const LINK_SPENT_MESSAGE = 'This link has expired or was already used; ask for a new one.';
export const FORGOT_PASSWORD_ANSWER = { ok: true, message: 'If that address has an account, a link is on its way.' } as const;

/** 32 random bytes (256 bits) as base64url; only its SHA-256 is stored. */
export const newLinkToken = () => randomBytes(32).toString('base64url');
export const hashLinkToken = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex');

interface Deps {
  db: Db;
  users: UsersRepo;
  tokens: UserTokensRepo;
  audit: AuditRepo;
  mailer: Mailer;
  publicUrl: string;
  /** Where a failed background mail is reported (never with the link in it). */
  log: (err: unknown) => void;
}

const spent = () => new HttpError(400, 'link-spent', LINK_SPENT_MESSAGE);

export function accountLinksService(deps: Deps) {
  const { db, users, tokens, audit, mailer, log } = deps;
  const base = deps.publicUrl.replace(/\/+$/, '');
  const linkFor = (token: string) => `${base}/set-password?token=${encodeURIComponent(token)}`;
  const inFlight = new Set<Promise<void>>();

  async function issue(userId: number, purpose: TokenPurpose, trx: Db = db): Promise<{ id: number; token: string; expiresAt: string }> {
    const token = newLinkToken();
    const expiresAt = new Date(Date.now() + LINK_LIFETIME_MS[purpose]).toISOString();
    const id = await tokens.insert({ userId, purpose, tokenHash: hashLinkToken(token), expiresAt }, trx);
    return { id, token, expiresAt };
  }

  function inviteMail(inviter: User, user: User, link: string) {
    return {
      to: user.email,
      subject: `${inviter.name} invited you to Gridset`,
      text: [
        `Hello ${user.name},`,
        '',
        `${inviter.name} made you a Gridset account with the role "${user.role}". Choose your password here:`,
        '',
        link,
        '',
        `The link works once, within 7 days. You will sign in with ${user.email}.`,
        'If you did not expect this mail, ignore it: nothing happens until the link is used.',
      ].join('\n'),
      secrets: [link],
    };
  }

  function resetMail(email: string, link: string) {
    return {
      to: email,
      subject: 'Reset your Gridset password',
      text: [
        `Someone asked to reset the Gridset password of ${email}. Choose a new password here:`,
        '',
        link,
        '',
        'The link works once, within 1 hour.',
        'If it was not you, ignore this mail: your password stays as it is.',
      ].join('\n'),
      secrets: [link],
    };
  }

  async function sendReset(email: string): Promise<void> {
    const user = await users.findWithHashByEmail(email);
    if (!user || !user.active) return;
    const { id, token } = await audit.audited((trx) => issue(user.id, 'reset', trx), () => ({ userId: null, action: 'user.reset-requested', objectType: 'user', objectId: user.id, summary: `A password reset link was mailed to ${user.email}` }));
    try {
      await mailer.send(resetMail(user.email, linkFor(token)));
    } catch (err) {
      await tokens.remove(id);
      throw err;
    }
  }

  return {
    /**
     * Adds an inactive user without a password and mails a link to choose one (201). Inviting an
     * address that is still waiting on its invitation sends a new link, ends the old ones and takes
     * the name and role given (200). If the mail cannot be sent, nothing is kept.
     */
    async invite(actor: User, input: InviteUserInput): Promise<{ user: User; resent: boolean }> {
      const existing = await users.findWithHashByEmail(input.email);
      if (existing && (existing.passwordHash !== null || existing.active)) {
        throw conflict(`A user with the address ${input.email} already exists.`);
      }
      const now = new Date().toISOString();
      let created: { user: User; tokenId: number; token: string };
      try {
        created = await db.transaction(async (trx) => {
          // An invited user stays inactive, without a password, until the link is used.
          const user = existing
            ? (await users.update(existing.id, { name: input.name, role: input.role }, trx))!
            : await users.insert({ email: input.email, name: input.name, role: input.role, passwordHash: null, active: false }, trx);
          const { id, token } = await issue(user.id, 'invite', trx);
          await audit.record({ userId: actor.id, action: 'user.invite', objectType: 'user', objectId: user.id, summary: `${existing ? 'Invited again' : 'Invited'} ${user.email} as ${user.role}`, after: { email: user.email, role: user.role } }, trx);
          return { user, tokenId: id, token };
        });
      } catch (err) {
        if (isUniqueViolation(err)) throw conflict(`A user with the address ${input.email} already exists.`);
        throw err;
      }
      try {
        await mailer.send(inviteMail(actor, created.user, linkFor(created.token)));
      } catch (err) {
        // Undo, so the admin can simply try again once mail works.
        await audit.audited(async (trx) => {
          if (existing) {
            await tokens.remove(created.tokenId, trx);
            await users.update(existing.id, { name: existing.name, role: existing.role }, trx);
          } else {
            await users.remove(created.user.id, trx);
          }
        }, () => ({ userId: actor.id, action: 'user.invite-withdrawn', objectType: 'user', objectId: created.user.id, summary: `The invitation to ${created.user.email} could not be mailed and was withdrawn` }));
        throw new HttpError(502, 'mail-failed', `The invitation could not be mailed (${err instanceof Error ? err.message : String(err)}); nothing was saved. Check the mail settings (SMTP_URL) and invite again.`);
      }
      if (existing) await tokens.revokeUnused(existing.id, now, db, created.tokenId);
      return { user: created.user, resent: !!existing };
    },

    /** Sets the password from a link; an invitation also activates the account. Ends the user's other links and sessions. */
    /**
     * The first admin of a new database, made from the command line on the server (no one can sign
     * in yet to invite them): an invited admin and the link to choose a password, for the person at
     * the console to open. Refused once any admin exists.
     */
    async firstAdmin(input: { email: string; name: string }): Promise<{ user: User; link: string }> {
      if ((await users.countActiveAdmins()) > 0) throw conflict('This Gridset already has an admin; that admin invites everyone else from the Users page.');
      const existing = await users.findWithHashByEmail(input.email);
      if (existing && (existing.passwordHash !== null || existing.active)) throw conflict(`A user with the address ${input.email} already exists.`);
      const made = await db.transaction(async (trx) => {
        const user = existing
          ? (await users.update(existing.id, { name: input.name, role: 'admin' }, trx))!
          : await users.insert({ email: input.email, name: input.name, role: 'admin', passwordHash: null, active: false }, trx);
        const { token } = await issue(user.id, 'invite', trx);
        await audit.record({ userId: null, action: 'user.invite', objectType: 'user', objectId: user.id, summary: `Invited ${user.email} as the first admin (from the server's command line)`, after: { email: user.email, role: 'admin' } }, trx);
        return { user, token };
      });
      return { user: made.user, link: linkFor(made.token) };
    },
    async setPassword(input: SetPasswordInput): Promise<{ email: string }> {
      const tokenHash = hashLinkToken(input.token);
      // Checked before the slow password hash, so made-up tokens cost next to nothing.
      const found = await tokens.findByHash(tokenHash);
      const usable = (t: typeof found, now: string) =>
        !!t && t.usedAt === null && t.expiresAt > now && (t.purpose === 'invite' ? !t.userHasPassword : t.userActive);
      if (!usable(found, new Date().toISOString())) throw spent();
      const passwordHash = await hashPassword(input.password);
      const now = new Date().toISOString();
      await db.transaction(async (trx) => {
        const t = await tokens.findByHash(tokenHash, trx);
        if (!usable(t, now) || !(await tokens.claim(t!.id, now, trx))) throw spent();
        await users.update(t!.userId, t!.purpose === 'invite' ? { passwordHash, active: true } : { passwordHash }, trx);
        await tokens.revokeUnused(t!.userId, now, trx);
        const how = t!.purpose === 'invite' ? 'accepted the invitation and chose a password' : 'set a new password from a reset link';
        await audit.record({ userId: t!.userId, action: t!.purpose === 'invite' ? 'user.invite-accepted' : 'user.password-reset', objectType: 'user', objectId: t!.userId, summary: `${found!.email} ${how}` }, trx);
        // A new password ends every session of the account (OWASP Forgot Password Cheat Sheet).
        await deleteSessionsOfUser(trx, t!.userId);
      });
      return { email: found!.email };
    },

    /**
     * Mails a reset link when the address belongs to an active user. The work runs after the answer
     * is sent, so neither the answer nor its timing tells whether the address exists.
     */
    forgotPassword(email: string): void {
      const work: Promise<void> = sendReset(email)
        .catch((err) => log(new Error(`A password reset mail was not sent: ${err instanceof Error ? err.message : String(err)}`)))
        .finally(() => inFlight.delete(work));
      inFlight.add(work);
    },

    /** Resolves once every mail started after an answer has been sent (tests, shutdown). */
    async whenIdle(): Promise<void> {
      while (inFlight.size) await Promise.all([...inFlight]);
    },
  };
}
export type AccountLinksService = ReturnType<typeof accountLinksService>;
