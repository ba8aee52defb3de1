import type { Db } from './knex';
import { isoTime } from './dialect';
import type { ReviewAction } from '../../shared/review/lifecycle';

export interface ReviewEntry { action: string; comment: string; at: string; by: string | null; byEmail: string | null }
export interface LastReviewStep extends ReviewEntry { versionId: number }

/** The review trail of template versions: who submitted, approved, sent back or retired, and when. */
export function reviewsRepo(db: Db) {
  return {
    async add(trx: Db, r: { versionId: number; action: ReviewAction; comment: string; userId: number }): Promise<void> {
      await trx('version_reviews').insert({ version_id: r.versionId, action: r.action, comment: r.comment, user_id: r.userId });
    },
    async trail(versionId: number): Promise<ReviewEntry[]> {
      const rows = await db('version_reviews as r').leftJoin('users as u', 'u.id', 'r.user_id').where('r.version_id', versionId)
        .select('r.action', 'r.comment', 'r.created_at', 'u.name', 'u.email').orderBy('r.id');
      return rows.map((r) => ({ action: r.action, comment: r.comment, at: isoTime(r.created_at), by: r.name ?? null, byEmail: r.email ?? null }));
    },
    /** The latest review step of each version given (all versions when none are given), by version id. */
    async lastSteps(versionIds?: number[], trx: Db = db): Promise<Map<number, LastReviewStep>> {
      if (versionIds && !versionIds.length) return new Map();
      const latest = trx('version_reviews').groupBy('version_id').max({ id: 'id' });
      if (versionIds) latest.whereIn('version_id', versionIds);
      const rows = await trx('version_reviews as r').join(latest.as('m'), 'm.id', 'r.id').leftJoin('users as u', 'u.id', 'r.user_id')
        .select('r.version_id', 'r.action', 'r.comment', 'r.created_at', 'u.name', 'u.email');
      return new Map(rows.map((r) => [Number(r.version_id), { versionId: Number(r.version_id), action: r.action, comment: r.comment, at: isoTime(r.created_at), by: r.name ?? null, byEmail: r.email ?? null }]));
    },
  };
}
export type ReviewsRepo = ReturnType<typeof reviewsRepo>;
