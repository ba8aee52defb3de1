import { useState } from 'react';
import type { Unit } from '../../../../shared/schemas/common';
import type { Station } from '../../../../shared/schemas/template';
import { checkProbedStation } from '../../../../shared/stations/work-offsets';
import { convert, formatLength } from '../../../../shared/units/units';
import { parseDecimal } from '../../../../shared/units/decimal';
import { Button } from '../../../components/ui/button';
import { inputClass } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';

interface Entry { station: string; x: string; y: string }

/**
 * "Check a few stations": pinned stations repeat within a few thousandths (common practice), so
 * probing two or three against the table finds a wrong hole or a bad shared offset.
 */
export function ProbeCheck({ stations, unit, displayUnit, tolerance }: { stations: Station[]; unit: Unit; displayUnit: Unit; tolerance: number }) {
  const [entries, setEntries] = useState<Entry[]>([{ station: '', x: '', y: '' }, { station: '', x: '', y: '' }, { station: '', x: '', y: '' }]);
  const set = (i: number, patch: Partial<Entry>) => setEntries((es) => es.map((e, k) => (k === i ? { ...e, ...patch } : e)));
  const results = entries.map((e) => {
    if (!e.station && !e.x && !e.y) return null;
    const st = stations.find((s) => s.number === Number(e.station));
    if (!st) return { error: `There is no station ${e.station || '(blank)'}; enter a station number from the table.` };
    // The one decimal grammar (shared/units/decimal.ts): what a control's DRO shows, no exponents.
    const x = parseDecimal(e.x);
    const y = parseDecimal(e.y);
    if (x === null || y === null) return { error: 'Enter the probed X and Y as numbers.' };
    const computed = { x: convert(st.x, unit, displayUnit), y: convert(st.y, unit, displayUnit) };
    return { check: checkProbedStation(computed, { x, y }, displayUnit, tolerance) };
  });
  return (
    <section className="flex flex-col gap-2 rounded border border-slate-300 bg-white p-4" aria-labelledby="probe-title">
      <h2 id="probe-title" className="text-lg font-semibold">Check a few stations</h2>
      <p className="text-slate-700">Probe a few station datums relative to the shared offset and enter them here; any off by more than {formatLength(tolerance, displayUnit)} is flagged.</p>
      <table className="w-fit">
        <thead><tr className="text-left text-sm text-slate-700"><th className="px-1">Station</th><th className="px-1">Probed X ({displayUnit})</th><th className="px-1">Probed Y ({displayUnit})</th><th className="px-1">Result</th></tr></thead>
        <tbody>
          {entries.map((e, i) => {
            const r = results[i];
            return (
              <tr key={i}>
                <td className="px-1"><input aria-label={`Probe ${i + 1} station number`} inputMode="numeric" className={`${inputClass} num w-24`} value={e.station} onChange={(ev) => set(i, { station: ev.target.value })} /></td>
                <td className="px-1"><input aria-label={`Probe ${i + 1} X`} inputMode="decimal" className={`${inputClass} num w-36`} value={e.x} onChange={(ev) => set(i, { x: ev.target.value })} /></td>
                <td className="px-1"><input aria-label={`Probe ${i + 1} Y`} inputMode="decimal" className={`${inputClass} num w-36`} value={e.y} onChange={(ev) => set(i, { y: ev.target.value })} /></td>
                <td className="px-2">
                  {!r ? null : 'error' in r ? <span className="text-danger-700">{r.error}</span> : r.check!.withinTolerance
                    ? <span className="font-semibold text-safe-700">within tolerance · off {formatLength(r.check!.deviation, displayUnit)}</span>
                    : <span className="font-semibold text-danger-700">off by {formatLength(r.check!.deviation, displayUnit)} — check the hole, the rail seating and the shared offset</span>}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <div><Button variant="secondary" onClick={() => setEntries((es) => [...es, { station: '', x: '', y: '' }])}>Add a row</Button></div>
      <Notice tone="caution" title="Advice, not a go-ahead">
        The check compares your probe readings with the computed table only. Check every clamp before cycle start and follow the machine builder's instructions.
      </Notice>
    </section>
  );
}
