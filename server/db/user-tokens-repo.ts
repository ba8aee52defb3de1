import type { Db } from './knex';

export type TokenPurpose = 'invite' | 'reset';

interface UserTokenRow {
  id: number;
  user_id: number;
  purpose: TokenPurpose;
  token_hash: string;
  expires_at: string;
  used_at: string | null;
}

export interface UserToken {
  id: number;
  userId: number;
  purpose: TokenPurpose;
  expiresAt: string;
  usedAt: string | null;
}

/** A token with what its use depends on: whether its user is active and has a password yet. */
export interface UserTokenWithUser extends UserToken {
  email: string;
  userActive: boolean;
  userHasPassword: boolean;
}

const toToken = (r: UserTokenRow): UserToken => ({ id: r.id, userId: r.user_id, purpose: r.purpose, expiresAt: r.expires_at, usedAt: r.used_at });

/** Times are ISO 8601 UTC strings with milliseconds, so they order as text and compare in SQL. */
export function userTokensRepo(db: Db) {
  return {
    async insert(t: { userId: number; purpose: TokenPurpose; tokenHash: string; expiresAt: string }, trx: Db = db): Promise<number> {
      const [row] = await trx('user_tokens')
        .insert({ user_id: t.userId, purpose: t.purpose, token_hash: t.tokenHash, expires_at: t.expiresAt })
        .returning('id');
      return Number(typeof row === 'object' ? (row as { id: number }).id : row);
    },
    async findByHash(tokenHash: string, trx: Db = db): Promise<UserTokenWithUser | undefined> {
      const row = await trx('user_tokens as t')
        .join('users as u', 'u.id', 't.user_id')
        .where('t.token_hash', tokenHash)
        .first<(UserTokenRow & { email: string; active: number | boolean; password_hash: string | null }) | undefined>('t.*', 'u.email', 'u.active', 'u.password_hash');
      return row && { ...toToken(row), email: row.email, userActive: !!row.active, userHasPassword: row.password_hash !== null };
    },
    /** Marks the token used if it still may be; false when another request used it first or it expired. */
    async claim(id: number, now: string, trx: Db = db): Promise<boolean> {
      const n = await trx('user_tokens').where({ id }).whereNull('used_at').where('expires_at', '>', now).update({ used_at: now, updated_at: trx.fn.now() });
      return n === 1;
    },
    /** Ends every unused link of a user (a new password, a deactivation, a fresh invitation). */
    async revokeUnused(userId: number, now: string, trx: Db = db, keepId?: number): Promise<number> {
      const q = trx('user_tokens').where({ user_id: userId }).whereNull('used_at');
      if (keepId !== undefined) q.whereNot({ id: keepId });
      return q.update({ used_at: now, updated_at: trx.fn.now() });
    },
    async remove(id: number, trx: Db = db): Promise<void> {
      await trx('user_tokens').where({ id }).del();
    },
  };
}
export type UserTokensRepo = ReturnType<typeof userTokensRepo>;
