import { useCallback, useEffect, useRef, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { BarDraftRow, BarsDraft } from '../../../../shared/schemas/bars-draft';
import type { JobDetail } from '../../../../shared/schemas/job';
import { ApiError } from '../../../lib/api-client';
import { jobKeys } from '../../jobs/api';
import { putBarsDraft } from '../api';
import { firstBarRows, makeBarRow, type BarRow } from '../bar-rows';

/** Quiet time after the last keystroke before the table is saved: long enough not to send every digit. */
export const DRAFT_DEBOUNCE_MS = 1200;
/** After a save the server did not answer (no connection, or a fault of its own), the next try. */
const RETRY_MS = 10_000;

export const draftRowsOf = (rows: readonly BarRow[]): BarDraftRow[] => rows.map((r) => ({ ...r.cells, autoId: r.autoId }));

/** The table a screen opens with: the job's draft as saved, or the three empty numbered rows. */
export const rowsOfDraft = (draft: BarsDraft | null): BarRow[] =>
  draft && draft.rows.length > 0 ? draft.rows.map(({ autoId, ...cells }) => makeBarRow(cells, autoId)) : firstBarRows();

/** What the status line says: nothing kept yet, a save on its way, kept (when), or not kept (why). */
export type DraftState =
  | { kind: 'none' }
  | { kind: 'saving' }
  | { kind: 'saved'; at: string; by: string | null }
  | { kind: 'failed'; reason: string; stale: boolean; retry: boolean };

const NETWORK = 'the server cannot be reached; the bars stay on this screen and are sent again in a few seconds';

/**
 * Keeps a job's bar table on the server while it is typed: a save DRAFT_DEBOUNCE_MS after the last
 * change, one at a time and always at the revision the last save answered, and one more as the page
 * is hidden or left. A 409 (another screen saved, or the bars were checked) stops the saves until
 * the operator loads what the server holds; nothing is overwritten unseen.
 */
export function useBarsDraft(jobId: number, initial: BarsDraft | null, rows: readonly BarRow[]) {
  const qc = useQueryClient();
  const text = JSON.stringify(draftRowsOf(rows));
  const [savedText, setSavedText] = useState(text);
  const [saved, setSaved] = useState<{ at: string; by: string | null } | null>(initial ? { at: initial.updatedAt, by: initial.by } : null);
  const [failure, setFailure] = useState<{ reason: string; stale: boolean; retry: boolean } | null>(null);
  const revision = useRef(initial?.revision ?? 0);
  const lastSent = useRef(text);
  const latest = useRef(text);
  const chain = useRef<Promise<void>>(Promise.resolve());
  const stopped = useRef(false);

  const enqueue = useCallback((body: string, leaving = false) => {
    chain.current = chain.current.then(async () => {
      if (stopped.current || body === lastSent.current) return;
      lastSent.current = body;
      try {
        const draft = await putBarsDraft(jobId, { rows: JSON.parse(body) as BarDraftRow[], revision: revision.current }, leaving);
        revision.current = draft.revision;
        qc.setQueryData<JobDetail>(jobKeys.detail(jobId), (old) => (old ? { ...old, barsDraft: draft } : old));
        setSavedText(body);
        setSaved({ at: draft.updatedAt, by: draft.by });
        setFailure(null);
      } catch (err) {
        const stale = err instanceof ApiError && err.status === 409;
        if (stale) stopped.current = true;
        const answered = err instanceof ApiError && err.status !== 0;
        const retry = !answered || err.status >= 500;
        // Unanswered: the same table is sent again (RETRY_MS). Refused: only a changed table is sent.
        if (retry) lastSent.current = '';
        const reason = answered ? err.message.replace(/\.$/, '') : NETWORK;
        setFailure({ reason, stale, retry });
      }
    });
    return chain.current;
  }, [jobId, qc]);

  const dirty = text !== savedText;
  const blocked = failure?.stale ?? false;

  useEffect(() => {
    latest.current = text;
  }, [text]);

  useEffect(() => {
    if (!dirty || blocked) return;
    const timer = setTimeout(() => void enqueue(text), failure?.retry ? RETRY_MS : DRAFT_DEBOUNCE_MS);
    // A phone locked or a tab switched away: save now, it may never come back.
    const hidden = () => { if (document.visibilityState === 'hidden') void enqueue(text, true); };
    const leaving = () => void enqueue(text, true);
    document.addEventListener('visibilitychange', hidden);
    window.addEventListener('pagehide', leaving);
    return () => {
      clearTimeout(timer);
      document.removeEventListener('visibilitychange', hidden);
      window.removeEventListener('pagehide', leaving);
    };
  }, [text, dirty, blocked, failure, enqueue]);

  // Leaving the screen inside the app with changes not yet sent: send them.
  useEffect(() => () => { if (latest.current !== lastSent.current) void enqueue(latest.current); }, [enqueue]);

  const state: DraftState = failure ? { kind: 'failed', ...failure } : dirty ? { kind: 'saving' } : saved ? { kind: 'saved', ...saved } : { kind: 'none' };

  return {
    state,
    /** Before a stock check: no more saves from this table, and the one on its way has landed. */
    finish: async () => {
      stopped.current = true;
      await chain.current;
    },
    /** The check was refused: saves go on as before. */
    resume: () => {
      stopped.current = false;
      void enqueue(latest.current);
    },
    /** Start again from what the server holds (after a 409): its rows, its revision. */
    adopt: (draft: BarsDraft | null, rowsNow: readonly BarRow[]) => {
      const body = JSON.stringify(draftRowsOf(rowsNow));
      revision.current = draft?.revision ?? 0;
      lastSent.current = body;
      stopped.current = false;
      setSavedText(body);
      setSaved(draft ? { at: draft.updatedAt, by: draft.by } : null);
      setFailure(null);
    },
  };
}
