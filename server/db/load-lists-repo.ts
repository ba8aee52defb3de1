import type { Db } from './knex';

export interface LoadListRow { job_id: number; stock_check_id: number; content: string; revision: number; updated_by: number | null }

/** The load list kept for a job (one per job), changed only at the revision the writer read. */
export function loadListsRepo(db: Db) {
  return {
    get: (jobId: number, trx: Db = db): Promise<LoadListRow | undefined> => trx('job_load_lists').where({ job_id: jobId }).first(),
    /**
     * Keeps a list as revision `current + 1`: inserts the first one, otherwise updates only if the
     * stored revision is still `current`. False when another writer got there first (on PostgreSQL
     * two transactions can both have read `current`; a second first insert breaks the primary key,
     * which answers 409).
     */
    async save(trx: Db, jobId: number, current: number, row: { stockCheckId: number; content: string; userId: number }): Promise<boolean> {
      if (current === 0) {
        await trx('job_load_lists').insert({ job_id: jobId, stock_check_id: row.stockCheckId, content: row.content, revision: 1, updated_by: row.userId });
        return true;
      }
      const n = await trx('job_load_lists').where({ job_id: jobId, revision: current })
        .update({ content: row.content, stock_check_id: row.stockCheckId, revision: current + 1, updated_by: row.userId, updated_at: trx.fn.now() });
      return n === 1;
    },
  };
}
