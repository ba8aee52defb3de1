import type { CreateUserInput, UpdateUserInput, User } from '../../shared/schemas/auth';
import type { UsersRepo } from '../db/users-repo';
import type { AuditRepo } from '../db/audit-repo';
import type { UserTokensRepo } from '../db/user-tokens-repo';
import { HttpError, conflict, notFound } from '../middleware/errors';
import { hashPassword, verifyPassword } from './passwords';

/** With the tokens repository, deactivating a user also ends their unused invitation and reset links. */
export function usersService(repo: UsersRepo, audit: AuditRepo, tokens?: UserTokensRepo) {
  return {
    /** Resolves to the user when the address and password match an active account, else null. */
    async authenticate(email: string, password: string): Promise<User | null> {
      const found = await repo.findWithHashByEmail(email.trim().toLowerCase());
      // Verify even when the address is unknown, so timing does not tell which addresses exist.
      const ok = await verifyPassword(password, found?.passwordHash ?? DUMMY_HASH);
      if (!found || !ok || !found.active) return null;
      const { passwordHash: _omit, ...user } = found;
      return user;
    },
    list: () => repo.list(),
    async create(actor: User, input: CreateUserInput): Promise<User> {
      if (await repo.findWithHashByEmail(input.email)) throw conflict(`A user with the address ${input.email} already exists.`);
      const passwordHash = await hashPassword(input.password);
      return audit.audited((trx) => repo.insert({ email: input.email, name: input.name, role: input.role, passwordHash }, trx), (user) => ({ userId: actor.id, action: 'user.create', objectType: 'user', objectId: user.id, summary: `Added user ${user.email} as ${user.role}`, after: { email: user.email, role: user.role } }));
    },
    async update(actor: User, id: number, input: UpdateUserInput): Promise<User> {
      const target = await repo.findById(id);
      if (!target) throw notFound(`User ${id}`);
      const losesAdmin = target.role === 'admin' && target.active && ((input.role && input.role !== 'admin') || input.active === false);
      const lastAdmin = () => conflict('This is the last active admin; make another user admin first.');
      if (losesAdmin && (await repo.countActiveAdmins()) <= 1) throw lastAdmin();
      if (actor.id === id && input.active === false) throw new HttpError(409, 'conflict', 'You cannot deactivate your own account.');
      // Links first: should the update then fail, the user only has to ask for a new link.
      if (input.active === false && tokens) await tokens.revokeUnused(id, new Date().toISOString());
      const updated = await audit.audited(async (trx) => {
        // Counted again with the admins' rows locked, in the same transaction as the change, so two
        // admins demoting each other at once cannot both succeed.
        if (losesAdmin && (await repo.countActiveAdmins(trx)) <= 1) throw lastAdmin();
        return repo.update(id, input, trx);
      }, () => ({ userId: actor.id, action: 'user.update', objectType: 'user', objectId: id, summary: `Changed user ${target.email}: ${Object.keys(input).join(', ')}`, before: { role: target.role, active: target.active, name: target.name }, after: input }));
      return updated!;
    },
    async setDisplayUnit(id: number, displayUnit: User['displayUnit']): Promise<User> {
      return (await repo.update(id, { displayUnit }))!;
    },
  };
}
export type UsersService = ReturnType<typeof usersService>;

// A fixed hash of a random string, verified against when the address is unknown.
const DUMMY_HASH = 'scrypt$32768$8$1$AAAAAAAAAAAAAAAAAAAAAA==$Gk0wb9b2ZBqFpy1m8Qx4o4uF3kTn5bTzFfMZ4l9c8Ss=';
