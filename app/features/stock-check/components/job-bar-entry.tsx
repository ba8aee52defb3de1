import { useState, type FormEvent } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { ScanLine } from 'lucide-react';
import type { JobDetail } from '../../../../shared/schemas/job';
import { Button } from '../../../components/ui/button';
import { ErrorText } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { parseServerTime } from '../../../lib/server-time';
import { jobQuery, useJobStockCheck } from '../../jobs/api';
import { barIssueProblems, barsToCheck, type BarField, type TableProblem } from '../bar-cells';
import { tableIdRows, withPastedRows, type BarRow } from '../bar-rows';
import { rowsOfDraft, useBarsDraft, type DraftState } from '../hooks/use-bars-draft';
import type { PastedRow } from '../parse-bars';
import { BarTable, barCellId } from './bar-table';
import { BarsPaste } from './bars-paste';
import { BarProblems } from './bar-problems';
import { JobCheckAnswer, type JobCheckAnswerData } from './job-check-answer';

/** hh:mm in the reader's clock. */
function clock(at: string): string {
  const d = parseServerTime(at);
  return d ? d.toLocaleTimeString([], { hour: '2-digit', minute: '2-digit', hour12: false }) : at;
}

function DraftLine({ state, onLoad }: { state: DraftState; onLoad: () => void }) {
  const text = state.kind === 'saved' ? `Saved as draft · ${clock(state.at)}${state.by ? `, by ${state.by}` : ''}`
    : state.kind === 'saving' ? 'Saving as draft…'
      : state.kind === 'failed' ? `Not saved — ${state.reason}`
        : 'Bars typed here are kept as a draft on the server until they are checked.';
  return (
    <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
      <p role="status" data-testid="draft-status" data-state={state.kind} className={state.kind === 'failed' ? 'font-semibold text-danger-700' : 'text-slate-700'}>{text}</p>
      {state.kind === 'failed' && state.stale ? <Button variant="secondary" className="max-sm:min-h-11" onClick={onLoad}>Load the bars the server holds</Button> : null}
    </div>
  );
}

/**
 * The operator's bar entry for one job, at the machine: paste or type the measured bars (kept on
 * the server as a draft while typed), then check them against every jaw rail the job uses; the
 * answer, rail by rail, beside the form (below it on a phone).
 */
export function JobBarEntry({ job }: { job: JobDetail }) {
  const [answer, setAnswer] = useState<JobCheckAnswerData | null>(null);
  return (
    <div className="grid grid-cols-1 items-start gap-6 xl:grid-cols-[minmax(0,36rem)_minmax(0,1fr)]">
      <JobBarsForm job={job} onChecked={setAnswer} />
      <section aria-label="Answer" className="flex min-w-0 flex-col gap-4">
        {answer ? <JobCheckAnswer answer={answer} unit={job.unit} /> : (
          <div className="rounded border border-dashed border-slate-400 bg-white p-4 text-slate-800">
            <h2 className="text-lg font-semibold">Which bars go on which setting</h2>
            <p className="mt-1">Press <span className="font-semibold">Check the bars</span>: the target opening of each rail setting and its bars appear here, and stay with the job.</p>
          </div>
        )}
        <p><Link className="text-accent-700 underline" to={`/jobs/${job.id}`}>Open the job</Link> for the chart, bar by bar, the load list and the setup sheet.</p>
      </section>
    </div>
  );
}

/**
 * The form alone: the draft line, the bar table, the paste box and the check button. A screen that
 * shows the job's checks itself (the job page) can hold just this; `onChecked` gets the answer.
 */
export function JobBarsForm({ job, onChecked }: { job: JobDetail; onChecked?: (answer: JobCheckAnswerData) => void }) {
  const qc = useQueryClient();
  const [rows, setRows] = useState<BarRow[]>(() => rowsOfDraft(job.barsDraft));
  const [problems, setProblems] = useState<TableProblem[]>([]);
  const draft = useBarsDraft(job.id, job.barsDraft, rows);
  const check = useJobStockCheck(job.id);
  const unit = job.unit;
  const rails = job.railsUsed;

  const focusCell = (index: number, field: BarField) => {
    const row = rows[index];
    if (row) document.getElementById(barCellId(row.key, field))?.focus();
  };

  const loadServerDraft = async () => {
    const fresh = await qc.fetchQuery({ ...jobQuery(job.id), staleTime: 0 });
    const next = rowsOfDraft(fresh.barsDraft);
    setRows(next);
    setProblems([]);
    draft.adopt(fresh.barsDraft, next);
  };

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    const table = barsToCheck(rows, unit);
    if (!table.ok) {
      setProblems(table.problems);
      focusCell(table.problems[0]!.index, table.problems[0]!.field);
      return;
    }
    setProblems([]);
    // The draft's last save lands before the check, which then clears it in its own transaction.
    await draft.finish();
    check.mutate({ bars: table.bars }, {
      onSuccess: (res) => {
        draft.adopt(null, rows);
        onChecked?.(res);
      },
      onError: (err) => {
        draft.resume();
        if (!(err instanceof ApiError)) return;
        const rowIssues = barIssueProblems(err.issues, table.rowOf);
        if (rowIssues.length > 0) setProblems(rowIssues);
      },
    });
  };

  const applyPaste = (pasted: PastedRow[], mode: 'replace' | 'append') => {
    setRows((rs) => withPastedRows(rs, pasted, mode));
    setProblems([]);
  };

  return (
    <form noValidate onSubmit={(e) => void submit(e)} aria-labelledby="job-bars-title" className="flex min-w-0 flex-col gap-4 rounded border border-slate-300 bg-white p-3 sm:p-4">
      <div>
        <h2 id="job-bars-title" className="text-lg font-semibold">Measured bars <span className="font-normal text-slate-700">— sizes in {unit === 'in' ? 'inches' : 'millimetres'}</span></h2>
        <p className="text-slate-700">
          Checked against {rails.length === 1 ? 'jaw rail' : 'jaw rails'} <span className="font-mono font-semibold">{rails.join(', ') || 'none'}</span> with this job’s carrier, clearance and minimum bite.
        </p>
      </div>
      <DraftLine state={draft.state} onLoad={() => void loadServerDraft()} />
      <BarTable rows={rows} onRowsChange={setRows} unit={unit} problems={problems}
        onCellEdit={(index, field) => setProblems((ps) => (ps.some((p) => p.index === index && p.field === field) ? ps.filter((p) => !(p.index === index && p.field === field)) : ps))} />
      <BarProblems problems={problems} />
      <details className="rounded border border-slate-300 p-3">
        <summary className="flex min-h-11 cursor-pointer items-center font-semibold text-slate-800">Paste a list or read a file of bars</summary>
        <div className="mt-2"><BarsPaste unit={unit} tableIds={tableIdRows(rows)} onApply={applyPaste} /></div>
      </details>
      <div className="sticky bottom-0 flex flex-col gap-2 border-t border-slate-300 bg-white py-3">
        <ErrorText error={check.error} />
        <Button type="submit" disabled={check.isPending || rails.length === 0} className="min-h-12 text-lg">
          <ScanLine aria-hidden className="h-5 w-5" />{check.isPending ? 'Checking…' : rails.length === 1 ? `Check the bars on ${rails[0]}` : `Check the bars on all ${rails.length} rails`}
        </Button>
      </div>
    </form>
  );
}
