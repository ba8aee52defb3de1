import type { BarDraftRow as DraftCells, BarsDraft } from '../../shared/schemas/bars-draft';
import type { Db } from './knex';
import { isoTime } from './dialect';

export interface BarDraftRow { job_id: number; bars: string | null; revision: number; updated_by: number | null; updated_at: string | Date; by_name?: string | null }

/** The draft a row holds, or null when none is kept (never saved, or cleared by a stock check). */
export function draftOf(row: BarDraftRow | undefined): BarsDraft | null {
  if (!row || row.bars === null) return null;
  return { rows: JSON.parse(row.bars) as DraftCells[], revision: Number(row.revision), updatedAt: isoTime(row.updated_at), by: row.by_name ?? null };
}

/**
 * A job's bars draft (one row per job), changed only at the revision the writer read, as the load
 * list is. Clearing keeps the row with `bars` null and the revision one higher.
 */
export function barDraftsRepo(db: Db) {
  return {
    get: (jobId: number, trx: Db = db): Promise<BarDraftRow | undefined> =>
      trx('job_bar_drafts as d').leftJoin('users as u', 'u.id', 'd.updated_by').where('d.job_id', jobId).select('d.*', 'u.name as by_name').first(),
    /**
     * Stores `bars` as revision `current + 1` (a first draft is revision 1). False when another writer
     * changed the row first; on PostgreSQL two first inserts at once break the primary key, which the
     * error handler answers 409.
     */
    async save(trx: Db, jobId: number, current: number | null, bars: string, userId: number): Promise<boolean> {
      if (current === null) {
        await trx('job_bar_drafts').insert({ job_id: jobId, bars, revision: 1, updated_by: userId });
        return true;
      }
      const n = await trx('job_bar_drafts').where({ job_id: jobId, revision: current })
        .update({ bars, revision: current + 1, updated_by: userId, updated_at: trx.fn.now() });
      return n === 1;
    },
    /** The bars were checked: the draft is empty from now on (inside the stock check's transaction). */
    async clear(trx: Db, jobId: number, userId: number) {
      await trx('job_bar_drafts').where({ job_id: jobId }).whereNotNull('bars')
        .update({ bars: null, revision: trx.raw('?? + 1', ['revision']), updated_by: userId, updated_at: trx.fn.now() });
    },
  };
}
export type BarDraftsRepo = ReturnType<typeof barDraftsRepo>;
