import { useState } from 'react';
import { ClipboardList } from 'lucide-react';
import type { JobDetail } from '../../../../shared/schemas/job';
import type { LoadList } from '../../../../shared/schemas/load-list';
import { formatLength } from '../../../../shared/units/units';
import { shiftInWords } from '../../../../shared/clamps/shift-words';
import { STOCK_CHECK_ADVICE } from '../../../../shared/clamps/reason-text';
import { Button } from '../../../components/ui/button';
import { ErrorText, Notice } from '../../../components/ui/notice';
import { inputClass } from '../../../components/ui/field';
import { useLoadList, useSaveLoadList } from '../api';

type Rails = LoadList['rails'];

/**
 * At the machine: which target opening to set on each jaw rail, and which bar goes in which station
 * this cycle. Gridset proposes it from the latest stock check; the operator may change any station
 * to another bar of the same setting, or leave it empty, and keeps the list with the job.
 */
export function LoadListPanel({ job, canEdit }: { job: JobDetail; canEdit: boolean }) {
  const list = useLoadList(job.id, job.stockChecks.length > 0);
  const save = useSaveLoadList(job.id);
  const [rails, setRails] = useState<Rails | null>(null);
  // A fresh load list from the server replaces the edited rails (React docs, "Adjusting some state
  // when a prop changes": set during render, not in an effect).
  const [shown, setShown] = useState<typeof list.data>(undefined);
  if (list.data && list.data !== shown) {
    setShown(list.data);
    setRails(list.data.rails);
  }
  if (!job.stockChecks.length) return null;
  if (list.error) return <ErrorText error={list.error} />;
  if (!list.data || !rails) return <p className="text-slate-700">Loading the load list…</p>;
  const data = list.data;
  const check = job.stockChecks[0]!;
  const barsOf = (jawPlacement: string, setting: number) => check.rails.find((r) => r.jawPlacement === jawPlacement)?.result.settings[setting]?.bars ?? [];
  const setBar = (rail: number, station: number, bar: string | null) =>
    setRails(rails.map((r, i) => (i !== rail ? r : { ...r, stations: r.stations.map((s) => (s.station === station ? { ...s, bar } : s)) })));
  const dirty = JSON.stringify(rails) !== JSON.stringify(data.rails);
  const taken = new Set(rails.flatMap((r) => r.stations.map((s) => s.bar)).filter((b): b is string => !!b));

  return (
    <section aria-labelledby="load-list-title" className="flex flex-col gap-3 rounded border border-slate-300 bg-white p-4">
      <h2 id="load-list-title" className="flex items-center gap-2 text-lg font-semibold"><ClipboardList aria-hidden className="h-5 w-5" />Load list for this cycle</h2>
      <p className="text-slate-700">
        {data.proposed ? 'Proposed by Gridset from the latest stock check; change a station and keep the list.' : `Kept (revision ${data.revision}).`}{' '}
        Empty stations: <span className="num font-semibold">{data.emptyStations.length ? data.emptyStations.join(', ') : 'none'}</span>.
      </p>
      {rails.map((r, i) => (
        <div key={r.jawPlacement} className="flex flex-col gap-2 border-t border-slate-200 pt-2">
          <p className="text-lg" data-testid="load-list-setting">
            <span className="font-semibold">Set {r.jawPlacement}</span> to <span className="num font-semibold">{formatLength(r.targetOpening, job.unit)}</span> ± <span className="num">{formatLength(r.room, job.unit)}</span> (setting {r.setting + 1})
          </p>
          <p className="text-slate-800" data-testid="load-list-shift-words">To set it: {shiftInWords(r.shift, job.unit)}.</p>
          <ul aria-label={`Stations on ${r.jawPlacement}`} className="grid grid-cols-1 gap-2 sm:grid-cols-2">
            {r.stations.map((s) => (
              <li key={s.station} className="flex items-center justify-between gap-3">
                <label htmlFor={`load-${r.jawPlacement}-${s.station}`} className="font-semibold">Station {s.station}</label>
                <select
                  id={`load-${r.jawPlacement}-${s.station}`}
                  className={`${inputClass} min-h-11 w-40`}
                  disabled={!canEdit}
                  value={s.bar ?? ''}
                  onChange={(e) => setBar(i, s.station, e.target.value || null)}
                >
                  <option value="">empty</option>
                  {barsOf(r.jawPlacement, r.setting).filter((b) => b === s.bar || !taken.has(b)).map((b) => <option key={b} value={b}>{b}</option>)}
                </select>
              </li>
            ))}
          </ul>
        </div>
      ))}
      {canEdit ? (
        <div className="flex flex-wrap items-center gap-3">
          <Button onClick={() => save.mutate({ revision: data.revision, rails: rails.map(({ jawPlacement, setting, stations }) => ({ jawPlacement, setting, stations })) })} disabled={save.isPending || (!dirty && !data.proposed)}>
            {save.isPending ? 'Keeping…' : 'Keep this load list'}
          </Button>
          {save.isSuccess && !dirty ? <span className="text-slate-700">Kept.</span> : null}
        </div>
      ) : null}
      <ErrorText error={save.error} />
      <Notice tone="caution" title="Advice, not a go-ahead">
        <p>{STOCK_CHECK_ADVICE}</p>
      </Notice>
    </section>
  );
}
