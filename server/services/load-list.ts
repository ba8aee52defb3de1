import type { User } from '../../shared/schemas/auth';
import type { JobDetail } from '../../shared/schemas/job';
import type { LoadList, LoadListInput, LoadListTicks, LoadListTicksInput } from '../../shared/schemas/load-list';
import { applyTicks, checkLoadList, proposeLoadList, type LoadRail } from '../../shared/clamps/load-list';
import type { Db } from '../db/knex';
import type { AuditRepo } from '../db/audit-repo';
import { loadListsRepo } from '../db/load-lists-repo';
import { loadListTicksRepo, type LoadListTicksRow } from '../db/load-list-ticks-repo';
import { HttpError, conflict } from '../middleware/errors';
import type { JobsService } from './jobs';

/** The used stations of each jaw rail, in numbering order: what a load list fills. */
function railsOf(job: JobDetail): LoadRail[] {
  const used = new Set(job.stationsUsed);
  const numberOf = new Map(job.stationList.map((s) => [s.id, s.number]));
  const rails = new Map<string, number[]>();
  for (const p of job.pairings) {
    const list = rails.get(p.jawPlacement) ?? rails.set(p.jawPlacement, []).get(p.jawPlacement)!;
    for (const id of p.stations) {
      const n = numberOf.get(id);
      if (n !== undefined && used.has(n)) list.push(n);
    }
  }
  return [...rails].filter(([, st]) => st.length).map(([jawPlacement, stations]) => ({ jawPlacement, stations: stations.sort((a, b) => a - b) }));
}

const NO_TICKS: LoadListTicks = { revision: 0, stations: [], at: null, by: null };

/**
 * Load lists: Gridset's proposal from the job's latest stock check until someone keeps one; a kept
 * list holds until the bars are checked again (a new check proposes afresh).
 */
export function loadListService(deps: { db: Db; jobs: JobsService; audit: AuditRepo }) {
  const { db, jobs, audit } = deps;
  const lists = loadListsRepo(db);
  const ticks = loadListTicksRepo(db);

  /** The list as it stands, without its ticks: the kept one if made from the latest check, else the proposal. */
  async function current(jobId: number): Promise<Omit<LoadList, 'ticks'>> {
    const { check, checks, rails } = await basis(jobId);
    const row = await lists.get(jobId);
    if (row && row.stock_check_id === check.id) return { proposed: false, revision: row.revision, stockCheckId: check.id, ...JSON.parse(row.content) };
    return { proposed: true, revision: row?.revision ?? 0, stockCheckId: check.id, ...proposeLoadList(rails, checks) };
  }

  /** The kept ticks if they were made on this very list (same check, same revision); otherwise none. */
  function ticksOf(row: LoadListTicksRow | undefined, list: Pick<LoadList, 'stockCheckId' | 'revision'>): LoadListTicks {
    if (!row || row.stock_check_id !== list.stockCheckId || row.list_revision !== list.revision) return NO_TICKS;
    return { revision: row.revision, stations: JSON.parse(row.content), at: ticks.at(row), by: row.by_name };
  }

  async function basis(jobId: number) {
    const job = await jobs.detail(jobId);
    const check = job.stockChecks[0];
    if (!check) throw new HttpError(409, 'no-stock-check', 'This job has no stock check yet: measure and check the bars first, then Gridset proposes which bar goes in which station.');
    const checks = check.rails.length ? check.rails : [{ jawPlacement: check.jawPlacement, nominalOpening: check.nominalOpening, result: check.result }];
    return { job, check, checks, rails: railsOf(job) };
  }

  return {
    async get(jobId: number): Promise<LoadList> {
      const list = await current(jobId);
      return { ...list, ticks: ticksOf(await ticks.get(jobId), list) };
    },
    /**
     * Ticks stations of the list as it stands (loaded, clamped), at the ticks' revision the operator
     * read; a list changed since (new check, kept edit) or a newer tick answers 409 and keeps nothing.
     */
    async tick(user: User, jobId: number, input: LoadListTicksInput): Promise<LoadList> {
      const list = await current(jobId);
      const changed = () => conflict('This load list changed after you opened it (a new stock check or a kept edit), which clears its ticks; reload it and tick the stations again.');
      if (input.stockCheckId !== list.stockCheckId || input.listRevision !== list.revision) throw changed();
      return db.transaction(async (trx) => {
        // The list was worked out before this transaction: a check or an edit kept in between would
        // leave these ticks on a list no longer shown (kept, but never answered), so it is asked again here.
        const now = await lists.stamp(jobId, trx);
        if (now.revision !== list.revision || now.latestCheckId !== list.stockCheckId) throw changed();
        const row = await ticks.get(jobId, trx);
        const kept = ticksOf(row, list);
        const stale = () => conflict(`Someone ticked this load list after you opened it (ticks revision ${kept.revision}); reload it and tick again.`);
        if (input.revision !== kept.revision) throw stale();
        const applied = applyTicks(list, kept.stations, input.stations);
        if (!applied.ok) throw new HttpError(400, 'load-list-ticks', applied.message);
        const revision = kept.revision + 1;
        if (!(await ticks.save(trx, jobId, row, { stockCheckId: list.stockCheckId, listRevision: list.revision, revision, content: JSON.stringify(applied.ticks), userId: user.id }))) throw stale();
        const said = applied.changed.map((t) => `station ${t.station} ${t.clamped ? 'loaded and clamped' : t.loaded ? 'loaded, not clamped' : 'not loaded'}`).join('; ');
        await audit.record({ userId: user.id, action: 'job.load-list-ticks', objectType: 'job', objectId: jobId, summary: `Ticked the load list (check ${list.stockCheckId}, revision ${list.revision}): ${said || 'no change'}`, before: kept.stations, after: applied.ticks }, trx);
        return { ...list, ticks: { revision, stations: applied.ticks, at: new Date().toISOString(), by: user.name } };
      });
    },
    async put(user: User, jobId: number, input: LoadListInput): Promise<LoadList> {
      const { check, checks, rails } = await basis(jobId);
      const checked = checkLoadList(input, rails, checks);
      if (!checked.ok) throw new HttpError(400, 'load-list', checked.message);
      return db.transaction(async (trx) => {
        const row = await lists.get(jobId, trx);
        const current = row?.revision ?? 0;
        const changed = () => conflict(`Someone saved this load list after you opened it (revision ${current}); reload it and make your change again.`);
        if (input.revision !== undefined && input.revision !== current) throw changed();
        if (!(await lists.save(trx, jobId, current, { stockCheckId: check.id, content: JSON.stringify(checked.list), userId: user.id }))) throw changed();
        await audit.record({ userId: user.id, action: 'job.load-list', objectType: 'job', objectId: jobId, summary: `Kept the load list: ${checked.list.rails.map((r) => `${r.jawPlacement} at setting ${r.setting + 1}`).join(', ')}; empty stations ${checked.list.emptyStations.join(', ') || 'none'}`, after: checked.list }, trx);
        // The new revision is a new list: no row of ticks matches it, so the operator starts afresh.
        return { proposed: false, revision: current + 1, stockCheckId: check.id, ...checked.list, ticks: NO_TICKS };
      });
    },
  };
}
export type LoadListService = ReturnType<typeof loadListService>;
