import type { NamingCheckResult, NamingConvention, NamingTarget } from '../../shared/schemas/naming';
import { checkName } from '../../shared/naming/check-name';
import type { NamingRepo } from '../db/naming-repo';
import { retryUniqueRace } from '../db/dialect';
import type { AuditRepo } from '../db/audit-repo';
import { HttpError } from '../middleware/errors';

export function namingService(repo: NamingRepo, audit: AuditRepo) {
  return {
    current: () => repo.current(),
    history: () => repo.history(),
    /**
     * Saves the rules as the next version. With `revision` (the version the lead edited), a version
     * saved by someone else since is a 409 and nothing is written; without it, two leads saving at
     * once both read the same latest version and the one that loses saves again as the next.
     */
    async save(c: Omit<NamingConvention, 'version'>, userId: number, revision?: number) {
      return retryUniqueRace(() => audit.audited(async (trx) => {
        if (revision !== undefined) {
          // The default convention is version 1 to everyone before any save (repo.current()).
          const now = Math.max(1, await repo.latestVersion(trx));
          if (now !== revision) throw new HttpError(409, 'stale-revision', `Someone saved naming convention version ${now} after you opened version ${revision}; nothing of yours was saved. Reload the rules and make your change again.`, { current: now });
        }
        return repo.save(c, userId, trx);
      }, (saved) => ({ userId, action: 'naming.save', objectType: 'naming', objectId: saved.version, summary: `Saved naming convention version ${saved.version}`, after: saved })));
    },
    async check(target: NamingTarget, name: string): Promise<NamingCheckResult> {
      const convention = await repo.current();
      return checkName(convention[target], name, target);
    },
    /** Refuses a component whose code or layer breaks the convention, with issues on the fields to fix. */
    async requireComponentNames(c: { code: string; layer: string }): Promise<void> {
      const convention = await repo.current();
      const issues: { path: string; message: string }[] = [];
      for (const p of checkName(convention.component, c.code, 'component').problems) issues.push({ path: 'code', message: p.message });
      if (c.layer) for (const p of checkName(convention.layer, c.layer, 'layer').problems) issues.push({ path: 'layer', message: p.message });
      if (issues.length) {
        throw new HttpError(400, 'naming', `The naming convention (version ${convention.version}) refuses this: ${issues[0]!.message}`, { issues });
      }
    },
  };
}
export type NamingService = ReturnType<typeof namingService>;
