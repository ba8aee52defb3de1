import { forwardRef, useMemo, useState } from 'react';
import { Ban, ListOrdered, Truck } from 'lucide-react';
import { STOCK_CHECK_ADVICE, UNPLACEABLE_TEXT } from '../../../../shared/clamps/reason-text';
import { formatLength } from '../../../../shared/units/units';
import { shiftInWords } from '../../../../shared/clamps/shift-words';
import { Notice } from '../../../components/ui/notice';
import { TextField } from '../../../components/ui/field';
import { supplierFlags, type CheckRun, type SupplierFlags } from '../check-run';
import { formatSettingShift, verdictsOf } from '../verdicts';
import { BarResultsTable, type BarResultRow } from './bar-results-table';
import { VerdictBadge } from './verdict-mark';
import { WindowChart } from './window-chart';

const plural = (n: number, word = 'bar') => `${n} ${word}${n === 1 ? '' : 's'}`;

export function resultRows(run: CheckRun, supplier: SupplierFlags): BarResultRow[] {
  const { request, response } = run;
  const sizes = new Map(request.bars.map((b) => [b.id, b]));
  return response.bars.map((b) => {
    const size = sizes.get(b.id)!;
    return {
      id: b.id, unit: request.unit, width: size.width, thickness: size.thickness, cornerRadius: size.cornerRadius,
      reasons: b.reasons, shiftRange: b.shiftRange, slotSlop: request.clamp.slotSlop,
      setting: b.setting === null ? null : b.setting + 1,
      settingShift: b.setting === null ? null : response.settings[b.setting]!.shift,
      supplier: supplier.checked ? supplier.byBar.get(b.id) ?? null : null,
    };
  });
}

/** The inputs the advice was worked out from, named (advice names its inputs). */
function inputsLine(run: CheckRun, clampFrom: string): string {
  const { request, rail } = run;
  const u = request.unit;
  return `rail ${rail.code} and its clamp model from ${clampFrom}, nominal opening ${formatLength(request.nominalOpening, u)}, carrier ${formatLength(request.carrier, u)}, tool clearance ${formatLength(request.clearance, u)}, minimum bite ${formatLength(request.minBite, u)}, ${plural(request.bars.length)} as measured`;
}

/** What a check said: the sorting list first, the caution, the bars no setting takes, the supplier matter and the chart. */
export const StockCheckResults = forwardRef<HTMLHeadingElement, {
  run: CheckRun;
  stale: boolean;
  /** Where the rail's clamp model came from, for the inputs line: "the catalog" here, a template version on a job. */
  clampFrom?: string;
}>(function StockCheckResults({ run, stale, clampFrom = 'the catalog' }, headingRef) {
  const { request, response, rail } = run;
  const unit = request.unit;
  const supplier = useMemo(() => supplierFlags(run), [run]);
  const rows = useMemo(() => resultRows(run, supplier), [run, supplier]);
  const byId = new Map(rows.map((r) => [r.id, r]));

  const placed = response.bars.length - response.unplaceable.length;
  const summary = [
    `${plural(response.bars.length)} checked on ${rail.code}`,
    placed > 0 ? `${plural(placed)} go${placed === 1 ? 'es' : ''} on ${plural(response.settings.length, 'setting')}` : 'no bar can go on this rail',
    ...(response.unplaceable.length > 0 && placed > 0 ? [`${plural(response.unplaceable.length)} cannot be used on this rail`] : []),
  ].join('; ');

  return (
    <div className="flex flex-col gap-5">
      <div>
        <h2 ref={headingRef} tabIndex={-1} id="results-title" className="text-xl font-semibold outline-none focus-visible:ring-2 focus-visible:ring-accent-600">Which bars go on which setting</h2>
        <p className="text-slate-800">{summary}.</p>
      </div>

      {stale ? (
        <Notice tone="caution" title="The inputs changed after this check">
          These results are for the inputs as they were: run the check again before sorting bars.
        </Notice>
      ) : null}

      {response.settings.length > 0 ? (
        <section aria-labelledby="sorting-title" className="rounded border border-slate-300 bg-white p-4">
          <h3 id="sorting-title" className="flex items-center gap-2 text-lg font-semibold"><ListOrdered aria-hidden className="h-5 w-5" />Sorting list</h3>
          <p className="text-slate-700">Set the rail to each target opening in turn (shift + opens the jaw) and load the bars listed; every bar on a setting is accepted there if the rail is set within the ± room shown, beyond the setting accuracy{response.settingAccuracy === undefined ? '' : ` of ±${formatLength(response.settingAccuracy, unit)}`} already allowed for.</p>
          <ol aria-label="Sorting list" className="mt-2 flex flex-col divide-y divide-slate-200">
            {response.settings.map((s, k) => (
              <li key={k} className="py-2 text-lg">
                <p data-testid="setting-line">
                  <span className="font-semibold">Setting {k + 1}:</span> shift <span className="num font-semibold">{formatSettingShift(s.shift, unit)}</span>
                  {' — '}{s.bars.length === 1 ? 'bar' : 'bars'} <span className="font-mono">{s.bars.join(', ')}</span>
                </p>
                <p className="text-base text-slate-700">
                  target opening <span className="num font-semibold">{formatLength(s.targetOpening ?? request.nominalOpening + s.shift, unit)}</span>{s.room === undefined ? '' : <> ± <span className="num">{formatLength(s.room, unit)}</span></>} · {plural(s.bars.length)}
                  {s.shift === 0 ? ' · the nominal setting' : ''}
                </p>
                <p className="text-base text-slate-800" data-testid="setting-words">To set it: {shiftInWords(s.shift, unit)}.</p>
              </li>
            ))}
          </ol>
        </section>
      ) : null}

      {response.warnings.map((w) => (
        <Notice key={w.code} tone="danger" title="Fixed jaw in the tool's path">
          <p>{w.message}</p>
        </Notice>
      ))}

      <Notice tone="caution" title="Advice, not a go-ahead">
        <p>{STOCK_CHECK_ADVICE}</p>
        <p className="mt-1 text-sm">Worked out for: {inputsLine(run, clampFrom)}.</p>
      </Notice>

      {response.unplaceable.length > 0 ? (
        <section aria-labelledby="unusable-title" className="rounded border border-slate-400 bg-white p-4">
          <h3 id="unusable-title" className="flex items-center gap-2 text-lg font-semibold"><Ban aria-hidden className="h-5 w-5" />Cannot be used on this rail: {plural(response.unplaceable.length)}</h3>
          <p className="text-slate-700">Each of these: {UNPLACEABLE_TEXT}. Shown with its refusals at shift 0.</p>
          <ul aria-label="Bars that cannot be used on this rail" className="mt-2 flex flex-col divide-y divide-slate-200">
            {response.unplaceable.map((id) => {
              const b = byId.get(id)!;
              return (
                <li key={id} className="grid grid-cols-[minmax(7rem,auto)_1fr] items-start gap-x-4 py-2">
                  <span className="flex flex-col">
                    <span className="font-mono text-lg font-semibold">{id}</span>
                    <span className="num text-left">{formatLength(b.width, unit)}</span>
                  </span>
                  <span className="flex flex-col items-start gap-1">{verdictsOf(b.reasons).map((v) => <VerdictBadge key={v} verdict={v} detail />)}</span>
                </li>
              );
            })}
          </ul>
        </section>
      ) : null}

      {supplier.checked ? (
        <Notice tone="info" title={supplier.outside.length > 0 ? `Supplier matter: ${plural(supplier.outside.length)} outside the standard extrusion tolerance` : 'Supplier tolerance: every bar checked is within it'}>
          <p className="text-sm">
            Aluminum Association standard tolerance for extruded bar{supplier.rules.length > 0 ? `: ${supplier.rules.join('; ')}` : ''}. A matter for the supplier, apart from whether the clamp holds the bar.
          </p>
          {supplier.outside.length > 0 ? (
            <ul aria-label="Bars outside the supplier tolerance" className="mt-1 flex flex-col gap-0.5">
              {supplier.outside.map((id) => {
                const flags = supplier.byBar.get(id)!;
                const off = (['width', 'thickness'] as const)
                  .flatMap((which) => {
                    const c = flags[which];
                    return c?.outside ? [`${which} ${formatLength(c.measured, unit)} is ${formatLength(Math.abs(c.deviation), unit)} ${c.deviation > 0 ? 'over' : 'under'}`] : [];
                  });
                return (
                  <li key={id} className="flex items-baseline gap-2">
                    <Truck aria-hidden className="h-4 w-4 shrink-0 self-center" />
                    <span className="font-mono font-semibold">{id}</span>
                    <span>{off.join('; ')}</span>
                  </li>
                );
              })}
            </ul>
          ) : null}
          {supplier.noRow.map((n) => (
            <p key={n.which} className="mt-1">The nominal {n.which} {formatLength(n.nominal, unit)} has no tolerance row here, so bar {n.which}s were not checked.</p>
          ))}
        </Notice>
      ) : null}

      <WindowChart input={{ unit, nominalOpening: request.nominalOpening, clamp: request.clamp, bars: rows.map((r) => ({ id: r.id, width: r.width, reasons: r.reasons, setting: r.setting === null ? null : r.setting - 1 })), settings: response.settings }} />
    </div>
  );
});

/** Every bar of the check, full width: the verdict at shift 0, the shifts that hold it, where it goes. */
export function BarByBar({ run, stale }: { run: CheckRun; stale: boolean }) {
  const [filter, setFilter] = useState('');
  const supplier = useMemo(() => supplierFlags(run), [run]);
  const rows = useMemo(() => resultRows(run, supplier), [run, supplier]);
  return (
    <section aria-labelledby="bars-result-title" className="flex flex-col gap-2">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h2 id="bars-result-title" className="text-lg font-semibold">Bar by bar <span className="font-normal text-slate-600">— {plural(rows.length)} on {run.rail.code}</span></h2>
          <p className="text-slate-700">Verdicts are at the nominal setting (shift 0); a bar that goes on a setting is accepted on it. Advice only: check every clamp by hand before cycle start.</p>
        </div>
        <div className="w-full sm:w-64"><TextField label="Find a bar" value={filter} onChange={(e) => setFilter(e.target.value)} className="max-sm:min-h-11" /></div>
      </div>
      {stale ? <Notice tone="caution" title="The inputs changed after this check">This table is for the inputs as they were: run the check again.</Notice> : null}
      <BarResultsTable rows={rows} filter={filter} supplierChecked={supplier.checked} />
    </section>
  );
}
