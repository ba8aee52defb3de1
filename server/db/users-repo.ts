import type { Db } from './knex';
import { forUpdate, isoTime, orderByText } from './dialect';
import type { Role, User } from '../../shared/schemas/auth';
import type { Unit } from '../../shared/schemas/common';
import { hotReads, type StoredUserRow } from './hot-reads';

interface UserRow {
  id: number;
  email: string;
  name: string;
  role: Role;
  password_hash: string | null;
  active: number | boolean;
  display_unit: Unit | null;
  created_at: string;
}

/** A users row as the API's user (never its password hash). */
export const toUser = (r: UserRow | StoredUserRow): User => ({
  id: r.id,
  email: r.email,
  name: r.name,
  role: r.role as Role,
  active: !!r.active,
  displayUnit: (r.display_unit as Unit | null) ?? null,
  invited: r.password_hash === null,
  createdAt: isoTime(r.created_at),
});

export function usersRepo(db: Db) {
  const hot = hotReads(db);
  return {
    /**
     * Every signed-in request reads its user here, from the database each time (one primary-key
     * read): another app process may have changed the role or deactivated the user a moment ago,
     * and a copy kept in this process's memory would go on signing their requests. A statement
     * prepared once (hot-reads), so the read costs little.
     */
    async findById(id: number): Promise<User | undefined> {
      const row = await hot.userById(id);
      return row && toUser(row);
    },
    async findWithHashByEmail(email: string): Promise<(User & { passwordHash: string | null }) | undefined> {
      const row = await db<UserRow>('users').where({ email }).first();
      return row && { ...toUser(row), passwordHash: row.password_hash };
    },
    async list(): Promise<User[]> {
      return (await orderByText(db, db('users'), 'email')).map(toUser);
    },
    async insert(u: { email: string; name: string; role: Role; passwordHash: string | null; active?: boolean }, trx: Db = db): Promise<User> {
      const [row] = await trx<UserRow>('users')
        .insert({ email: u.email, name: u.name, role: u.role, password_hash: u.passwordHash, active: u.active ?? true })
        .returning('*');
      return toUser(row as UserRow);
    },
    async update(id: number, patch: { name?: string; role?: Role; active?: boolean; displayUnit?: Unit | null; passwordHash?: string }, trx: Db = db): Promise<User | undefined> {
      const row: Partial<UserRow> & { updated_at: unknown } = { updated_at: db.fn.now() };
      if (patch.name !== undefined) row.name = patch.name;
      if (patch.role !== undefined) row.role = patch.role;
      if (patch.active !== undefined) row.active = patch.active;
      if (patch.displayUnit !== undefined) row.display_unit = patch.displayUnit;
      if (patch.passwordHash !== undefined) row.password_hash = patch.passwordHash;
      await trx('users').where({ id }).update(row);
      // Read back through the same transaction (SQLite's one connection is taken by it).
      const fresh = await trx<UserRow>('users').where({ id }).first();
      return fresh && toUser(fresh);
    },
    /** Deletes a user who never signed in (an invitation that could not be mailed). */
    async remove(id: number, trx: Db = db): Promise<void> {
      await trx('users').where({ id }).del();
    },
    /** Active admins; inside a transaction their rows stay locked until it ends, so two demotions cannot both pass. */
    async countActiveAdmins(trx: Db = db): Promise<number> {
      const rows = await forUpdate(trx, trx('users').where({ role: 'admin', active: true }).select('id'));
      return rows.length;
    },
  };
}
export type UsersRepo = ReturnType<typeof usersRepo>;
