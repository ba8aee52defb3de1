import { useState } from 'react';
import { ClipboardList, Printer } from 'lucide-react';
import type { JobDetail } from '../../../../shared/schemas/job';
import type { LoadList, LoadListTick } from '../../../../shared/schemas/load-list';
import { STOCK_CHECK_ADVICE } from '../../../../shared/clamps/reason-text';
import { Button } from '../../../components/ui/button';
import { ErrorText, Notice } from '../../../components/ui/notice';
import { inputClass } from '../../../components/ui/field';
import { useLoadList, useSaveLoadList, useTickLoadList } from '../api';
import { railSettingWords } from '../job-format';
import { LoadListPrint } from './load-list-print';

type Rails = LoadList['rails'];
const NO_TICK = { loaded: false, clamped: false };

/**
 * At the machine: which target opening to set on each jaw rail, and which bar goes in which station
 * this cycle. Gridset proposes it from the latest stock check; the operator may change any station
 * to another bar of the same setting, or leave it empty, and keeps the list with the job. Each
 * station with a bar is ticked loaded, then clamped; the ticks are kept on the server until the
 * list changes (a new check or a kept edit). Printed, the page shows this list alone.
 */
export function LoadListPanel({ job, canEdit }: { job: JobDetail; canEdit: boolean }) {
  const list = useLoadList(job.id, job.stockChecks.length > 0);
  const save = useSaveLoadList(job.id);
  const tick = useTickLoadList(job.id);
  const [rails, setRails] = useState<Rails | null>(null);
  const [pendingTick, setPendingTick] = useState<LoadListTick | null>(null);
  // A fresh load list from the server replaces the edited rails (React docs, "Adjusting some state
  // when a prop changes": set during render, not in an effect). Ticks alone leave an edit in place.
  const [shown, setShown] = useState<typeof list.data>(undefined);
  if (list.data && list.data !== shown) {
    const sameList = shown && shown.revision === list.data.revision && shown.stockCheckId === list.data.stockCheckId;
    setShown(list.data);
    if (!sameList || !rails) setRails(list.data.rails);
  }
  if (!job.stockChecks.length) return null;
  if (list.error) return <section id="load-list" className="print-load-list"><ErrorText error={list.error} /></section>;
  if (!list.data || !rails) return <section id="load-list" className="print-load-list"><p className="text-slate-700">Loading the load list…</p></section>;
  const data = list.data;
  const check = job.stockChecks[0]!;
  const barsOf = (jawPlacement: string, setting: number) => check.rails.find((r) => r.jawPlacement === jawPlacement)?.result.settings[setting]?.bars ?? [];
  const setBar = (rail: number, station: number, bar: string | null) =>
    setRails(rails.map((r, i) => (i !== rail ? r : { ...r, stations: r.stations.map((s) => (s.station === station ? { ...s, bar } : s)) })));
  const dirty = JSON.stringify(rails) !== JSON.stringify(data.rails);
  const taken = new Set(rails.flatMap((r) => r.stations.map((s) => s.bar)).filter((b): b is string => !!b));
  const ticks = new Map(data.ticks.stations.map((t) => [t.station, t]));
  // The tap shows at once while the server keeps it (TanStack Query, "Optimistic updates via the UI"),
  // set in the same event so the checkbox never springs back for a moment.
  if (pendingTick) ticks.set(pendingTick.station, pendingTick);
  const withBar = data.rails.flatMap((r) => r.stations).filter((s) => s.bar);
  const loaded = withBar.filter((s) => ticks.get(s.station)?.loaded).length;
  const clamped = withBar.filter((s) => ticks.get(s.station)?.clamped).length;
  const canTick = canEdit && !dirty && !tick.isPending && !pendingTick;
  const send = (t: LoadListTick) => {
    setPendingTick(t);
    tick.mutate({ revision: data.ticks.revision, stockCheckId: data.stockCheckId, listRevision: data.revision, stations: [t] }, { onSettled: () => setPendingTick(null) });
  };

  return (
    <section id="load-list" aria-labelledby="load-list-title" className="print-load-list flex scroll-mt-4 flex-col gap-3 rounded border border-slate-300 bg-white p-4 max-md:p-3 print:border-0 print:p-0">
      <LoadListPrint job={job} list={data} />
      <div className="flex flex-wrap items-center justify-between gap-2 print:hidden">
        <h2 id="load-list-title" className="flex items-center gap-2 text-lg font-semibold"><ClipboardList aria-hidden className="h-5 w-5" />Load list for this cycle</h2>
        <Button variant="secondary" onClick={() => window.print()} className="min-h-11"><Printer aria-hidden className="h-4 w-4" />Print the load list</Button>
      </div>
      <div className="flex flex-col gap-3 print:hidden">
        <p className="text-slate-700">
          {data.proposed ? 'Proposed by Gridset from the latest stock check; change a station and keep the list.' : `Kept (revision ${data.revision}).`}{' '}
          Empty stations: <span className="num font-semibold">{data.emptyStations.length ? data.emptyStations.join(', ') : 'none'}</span>.
        </p>
        <p className="text-slate-800" aria-live="polite" data-testid="load-list-tick-count">
          <span className="font-semibold">{loaded} of {withBar.length}</span> stations loaded, <span className="font-semibold">{clamped} of {withBar.length}</span> clamped
          {data.ticks.by && data.ticks.at ? <span className="text-slate-700"> · last tick by {data.ticks.by}</span> : null}.
        </p>
        <p className="text-sm text-slate-700">Ticks are kept with the job for everyone to see, and start again empty when this list changes: a new stock check or a kept edit clears them.</p>
        {dirty && canEdit ? <p className="text-sm font-semibold text-slate-800">Keep or undo your change of bars before ticking stations.</p> : null}
        {/* At desk width the rails sit side by side, so a station's line stays short. */}
        <div className="grid grid-cols-1 gap-x-8 gap-y-3 lg:grid-cols-2">
          {rails.map((r, i) => {
            const words = railSettingWords(r, job.unit);
            return (
              <div key={r.jawPlacement} className="flex flex-col gap-2 border-t border-slate-200 pt-2">
                <p className="text-lg" data-testid="load-list-setting">
                  <span className="font-semibold">Set {r.jawPlacement}</span> to <span className="num font-semibold">{words.target}</span> ± <span className="num">{words.room}</span> (setting {r.setting + 1})
                </p>
                <p className="text-slate-800" data-testid="load-list-shift-words">To set it: {words.shift}; {words.roomWords}.</p>
                {/* One line per station, also on a phone: station, bar, then the two ticks under their column names. */}
                <div aria-hidden className="flex items-end gap-2 px-2 text-sm font-semibold text-slate-700">
                  <span className="w-14 shrink-0">Station</span><span className="min-w-0 flex-1">Bar</span>
                  <span className="w-14 text-center">Loaded</span><span className="w-14 text-center">Clamped</span>
                </div>
                <ul aria-label={`Stations on ${r.jawPlacement}`} className="flex flex-col gap-1">
                  {r.stations.map((s) => {
                    const t = ticks.get(s.station) ?? NO_TICK;
                    const kept = data.rails[i]?.stations.find((x) => x.station === s.station)?.bar ?? null;
                    return (
                      <li key={s.station} data-testid="load-list-station" data-station={s.station} data-bar={kept ?? ''}
                        className={`flex items-center gap-2 rounded px-2 py-0.5 ${t.clamped ? 'bg-accent-50' : ''}`}>
                        <label htmlFor={`load-${r.jawPlacement}-${s.station}`} className="num w-14 shrink-0 text-left text-lg font-semibold"><span className="sr-only">Station </span>{s.station}</label>
                        <select
                          id={`load-${r.jawPlacement}-${s.station}`}
                          data-testid="load-list-bar"
                          className={`${inputClass} min-h-11 min-w-0 flex-1 px-2 font-mono`}
                          disabled={!canEdit}
                          value={s.bar ?? ''}
                          onChange={(e) => setBar(i, s.station, e.target.value || null)}
                        >
                          <option value="">empty</option>
                          {barsOf(r.jawPlacement, r.setting).filter((b) => b === s.bar || !taken.has(b)).map((b) => <option key={b} value={b}>{b}</option>)}
                        </select>
                        {kept ? (
                          <>
                            <TickBox label="loaded" station={s.station} checked={t.loaded} disabled={!canTick}
                              onChange={(on) => send({ station: s.station, loaded: on, clamped: on && t.clamped })} />
                            <TickBox label="clamped" station={s.station} checked={t.clamped} disabled={!canTick || !t.loaded}
                              onChange={(on) => send({ station: s.station, loaded: t.loaded, clamped: on })} />
                          </>
                        ) : <span className="w-30 shrink-0 text-center text-sm text-slate-700">empty: skip</span>}
                      </li>
                    );
                  })}
                </ul>
              </div>
            );
          })}
        </div>
        <ErrorText error={tick.error} />
        {canEdit ? (
          <div className="flex flex-wrap items-center gap-3">
            <Button onClick={() => save.mutate({ revision: data.revision, rails: rails.map(({ jawPlacement, setting, stations }) => ({ jawPlacement, setting, stations })) })} disabled={save.isPending || (!dirty && !data.proposed)}>
              {save.isPending ? 'Keeping…' : 'Keep this load list'}
            </Button>
            {dirty ? <Button variant="secondary" onClick={() => setRails(data.rails)}>Undo my change</Button> : null}
            {save.isSuccess && !dirty ? <span className="text-slate-700">Kept; its ticks start again empty.</span> : null}
          </div>
        ) : null}
        <ErrorText error={save.error} />
        <Notice tone="caution" title="Advice, not a go-ahead">
          <p>{STOCK_CHECK_ADVICE}</p>
        </Notice>
      </div>
    </section>
  );
}

/** One tick of a station: a checkbox inside a label 56 × 44 px (WCAG 2.5.5 target size, at least 44 px). */
function TickBox({ label, station, checked, disabled, onChange }: { label: 'loaded' | 'clamped'; station: number; checked: boolean; disabled: boolean; onChange: (on: boolean) => void }) {
  return (
    <label data-testid={`tick-${label}`} className={`inline-flex min-h-11 w-14 shrink-0 items-center justify-center rounded border ${checked ? 'border-accent-700 bg-accent-50' : 'border-slate-400 bg-white'} ${disabled ? 'cursor-not-allowed opacity-60' : 'cursor-pointer'}`}>
      <input type="checkbox" className="h-6 w-6 accent-accent-700" checked={checked} disabled={disabled}
        aria-label={`Station ${station} ${label}`} onChange={(e) => onChange(e.target.checked)} />
    </label>
  );
}
