import type { User } from '../../shared/schemas/auth';
import type { BarDraftRow, BarsDraft } from '../../shared/schemas/bars-draft';
import type { Db } from '../db/knex';
import type { AuditRepo } from '../db/audit-repo';
import { barDraftsRepo, draftOf } from '../db/bar-drafts-repo';
import { isUniqueViolation } from '../db/dialect';
import { conflict } from '../middleware/errors';
import type { JobsService } from './jobs';

const filled = (rows: readonly BarDraftRow[]) => rows.filter((r) => r.width.trim() || r.thickness.trim() || r.cornerRadius.trim()).length;

/**
 * The bars an operator is typing for a job, kept on the server until they are checked, so a reload
 * or a second device finds them. Saved whole at the revision the device last saw (0: it saw none);
 * any other stored revision answers 409 and writes nothing, as the load list does.
 */
export function barsDraftService(deps: { db: Db; jobs: JobsService; audit: AuditRepo }) {
  const { db, jobs, audit } = deps;
  const drafts = barDraftsRepo(db);
  const stale = (detail: { revision: number; checked: boolean }) => conflict(
    detail.checked
      ? 'These bars were checked after this screen loaded them, which cleared the draft; reload the page to see the check before typing more.'
      : `Another screen saved these bars after this one loaded them (draft revision ${detail.revision}); reload the page to see them, then make your change again.`,
    detail,
  );

  return {
    async put(user: User, jobId: number, input: { rows: BarDraftRow[]; revision: number }): Promise<BarsDraft> {
      await jobs.requireJob(jobId);
      try {
        return await db.transaction(async (trx) => {
          const row = await drafts.get(jobId, trx);
          const seen = draftOf(row)?.revision ?? 0;
          const refused = () => stale({ revision: seen, checked: !!row && row.bars === null && input.revision > 0 });
          if (input.revision !== seen) throw refused();
          if (!(await drafts.save(trx, jobId, row ? Number(row.revision) : null, JSON.stringify(input.rows), user.id))) throw refused();
          const saved = draftOf(await drafts.get(jobId, trx))!;
          await audit.record({ userId: user.id, action: 'job.bars-draft', objectType: 'job', objectId: jobId, summary: `Kept ${filled(input.rows)} measured bar${filled(input.rows) === 1 ? '' : 's'} as a draft (revision ${saved.revision})`, after: { rows: input.rows.length, revision: saved.revision } }, trx);
          return saved;
        });
      } catch (err) {
        // Two first saves at once on PostgreSQL: the second insert breaks the primary key.
        if (isUniqueViolation(err)) throw stale({ revision: 1, checked: false });
        throw err;
      }
    },
  };
}
export type BarsDraftService = ReturnType<typeof barsDraftService>;
