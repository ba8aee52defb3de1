import { useState } from 'react';
import type { VersionDiffAnswer } from '../../../../shared/schemas/diff';
import { stationValueText } from '../../../../shared/compare/station-values';
import { ArrowRight } from 'lucide-react';
import type { Unit } from '../../../../shared/schemas/common';
import { convert, formatLength, formatNumber } from '../../../../shared/units/units';
import { inputClass } from '../../../components/ui/field';

type Filter = 'all' | 'placements' | 'stations' | 'offset' | 'names';

const delta = (v: number, from: Unit, to: Unit) => {
  const x = convert(v, from, to);
  return `${x > 0 ? '+' : ''}${formatLength(x, to)}`;
};

/** The comparison as tables: placements moved, added and removed; station offsets that change; the shared offset; naming. */
export function ChangeTables({ diff, displayUnit }: { diff: VersionDiffAnswer; displayUnit: Unit }) {
  const [filter, setFilter] = useState<Filter>('all');
  const u = diff.unit;
  const show = (f: Filter) => filter === 'all' || filter === f;
  const th = 'px-3 py-2 text-left font-semibold';
  const td = 'px-3 py-2';
  return (
    <div className="flex flex-col gap-4">
      <label className="flex w-fit flex-col text-sm font-semibold text-slate-700">Show
        <select className={`${inputClass} w-64`} value={filter} onChange={(e) => setFilter(e.target.value as Filter)}>
          <option value="all">every change</option>
          <option value="placements">placements</option>
          <option value="stations">station offsets</option>
          <option value="offset">shared offset</option>
          <option value="names">naming and layout problems</option>
        </select>
      </label>
      {show('placements') ? (
        <section aria-labelledby="placements-changed">
          <h2 id="placements-changed" className="mb-2 text-lg font-semibold">Placements: {diff.placements.moved.length} moved, {diff.placements.added.length} added, {diff.placements.removed.length} removed, {diff.placements.changed.length} changed</h2>
          {diff.placements.moved.length + diff.placements.added.length + diff.placements.removed.length + diff.placements.changed.length ? (
            <table className="stack-sm w-full border-collapse rounded border border-slate-300 bg-white text-[15px]">
              <thead className="bg-slate-100"><tr><th className={th}>Placement</th><th className={th}>Change</th><th className={th}>From</th><th className={th}>To</th><th className={`${th} text-right`}>ΔX</th><th className={`${th} text-right`}>ΔY</th></tr></thead>
              <tbody>
                {diff.placements.moved.map((m) => (
                  <tr key={`m-${m.id}`} className="border-t border-slate-200"><td data-label="Placement" className={`${td} font-mono`}>{m.id}</td><td data-label="Change" className={td}>moved</td>
                    <td data-label="From" className={`${td} font-mono`}>({m.from.hole.col}, {m.from.hole.row}) {m.from.rotation}°</td><td data-label="To" className={`${td} font-mono`}>({m.to.hole.col}, {m.to.hole.row}) {m.to.rotation}°</td>
                    <td data-label="ΔX" className={`${td} num`}>{delta(m.dx, u, displayUnit)}</td><td data-label="ΔY" className={`${td} num`}>{delta(m.dy, u, displayUnit)}</td></tr>
                ))}
                {diff.placements.added.map((p) => (
                  <tr key={`a-${p.id}`} className="border-t border-slate-200"><td data-label="Placement" className={`${td} font-mono`}>{p.id}</td><td data-label="Change" className={td}>added</td><td data-label="From" className={td}>—</td><td data-label="To" className={`${td} font-mono`}>{p.component} on ({p.hole.col}, {p.hole.row}) {p.rotation}°</td><td data-label="ΔX" /><td data-label="ΔY" /></tr>
                ))}
                {diff.placements.removed.map((p) => (
                  <tr key={`r-${p.id}`} className="border-t border-slate-200"><td data-label="Placement" className={`${td} font-mono`}>{p.id}</td><td data-label="Change" className={td}>removed</td><td data-label="From" className={`${td} font-mono`}>{p.component} on ({p.hole.col}, {p.hole.row}) {p.rotation}°</td><td data-label="To" className={td}>—</td><td data-label="ΔX" /><td data-label="ΔY" /></tr>
                ))}
                {diff.placements.changed.map((c) => (
                  <tr key={`c-${c.id}`} className="border-t border-slate-200"><td data-label="Placement" className={`${td} font-mono`}>{c.id}</td><td data-label="Change" className={td}>changed</td>
                    <td data-label="From" className={`${td} font-mono`}>{c.componentFrom}</td><td data-label="To" className={`${td} font-mono`}>{c.componentTo}{c.stopsAdded.length ? ` · stops +${c.stopsAdded.map((s) => s + 1).join(',')}` : ''}{c.stopsRemoved.length ? ` · stops −${c.stopsRemoved.map((s) => s + 1).join(',')}` : ''}</td><td data-label="ΔX" /><td data-label="ΔY" /></tr>
                ))}
              </tbody>
            </table>
          ) : <p className="text-slate-600">No placement changed.</p>}
        </section>
      ) : null}
      {show('stations') ? (
        <section aria-labelledby="stations-changed">
          <h2 id="stations-changed" className="mb-2 text-lg font-semibold">Station offsets: {diff.stations.changed.length} changed, {diff.stations.added.length} added, {diff.stations.removed.length} removed, {diff.stations.renumbered.length} renumbered, {diff.stations.unchanged} unchanged</h2>
          {diff.stations.changed.length + diff.stations.added.length + diff.stations.removed.length + diff.stations.renumbered.length ? (
            <table className="stack-sm w-full border-collapse rounded border border-slate-300 bg-white text-[15px]">
              <thead className="bg-slate-100"><tr><th className={th}>Station</th><th className={th}>Identity</th><th className={th}>Change</th><th className={`${th} text-right`}>ΔX</th><th className={`${th} text-right`}>ΔY</th><th className={`${th} text-right`}>ΔZ</th><th className={`${th} text-right`}>ΔC</th></tr></thead>
              <tbody>
                {diff.stations.changed.map((s) => (
                  <tr key={`c-${s.id}`} className="border-t border-slate-200"><td data-label="Station" className={`${td} num`}>{s.previousNumber !== s.number ? `${s.previousNumber} → ${s.number}` : s.number}</td><td data-label="Identity" className={`${td} font-mono`}>{s.id}</td><td data-label="Change" className={td}>offset changed</td>
                    <td data-label="ΔX" className={`${td} num`}>{delta(s.dx, u, displayUnit)}</td><td data-label="ΔY" className={`${td} num`}>{delta(s.dy, u, displayUnit)}</td><td data-label="ΔZ" className={`${td} num`}>{delta(s.dz, u, displayUnit)}</td><td data-label="ΔC" className={`${td} num`}>{s.dc > 0 ? '+' : ''}{formatNumber(s.dc, 'mm')}°</td></tr>
                ))}
                {diff.stations.renumbered.map((s) => (
                  <tr key={`n-${s.id}`} className="border-t border-slate-200"><td data-label="Station" className={`${td} num`}>{s.from} → {s.to}</td><td data-label="Identity" className={`${td} font-mono`}>{s.id}</td><td data-label="Change" className={td}>renumbered only</td><td data-label="ΔX" /><td data-label="ΔY" /><td data-label="ΔZ" /><td data-label="ΔC" /></tr>
                ))}
                {diff.stations.added.map((s) => (
                  <tr key={`a-${s.id}`} className="border-t border-slate-200"><td data-label="Station" className={`${td} num`}>{s.number}</td><td data-label="Identity" className={`${td} font-mono`}>{s.id}</td><td data-label="Change" className={td}>added at ({formatLength(convert(s.x, u, displayUnit), displayUnit)}, {formatLength(convert(s.y, u, displayUnit), displayUnit)})</td><td data-label="ΔX" /><td data-label="ΔY" /><td data-label="ΔZ" /><td data-label="ΔC" /></tr>
                ))}
                {diff.stations.removed.map((s) => (
                  <tr key={`r-${s.id}`} className="border-t border-slate-200"><td data-label="Station" className={`${td} num`}>{s.number}</td><td data-label="Identity" className={`${td} font-mono`}>{s.id}</td><td data-label="Change" className={td}>removed</td><td data-label="ΔX" /><td data-label="ΔY" /><td data-label="ΔZ" /><td data-label="ΔC" /></tr>
                ))}
              </tbody>
            </table>
          ) : <p className="text-slate-600">No station offset changed.</p>}
          <StationValues diff={diff} displayUnit={displayUnit} />
        </section>
      ) : null}
      {show('offset') ? (
        <section aria-labelledby="offset-changed">
          <h2 id="offset-changed" className="mb-2 text-lg font-semibold">Shared offset</h2>
          <p>{diff.sharedOffset.changed ? <>Moved by ΔX {delta(diff.sharedOffset.dx, u, displayUnit)}, ΔY {delta(diff.sharedOffset.dy, u, displayUnit)}, ΔZ {delta(diff.sharedOffset.dz, u, displayUnit)}: every station's translation changes by the opposite.</> : 'Unchanged.'}</p>
        </section>
      ) : null}
      {show('names') ? (
        <section aria-labelledby="names-changed">
          <h2 id="names-changed" className="mb-2 text-lg font-semibold">Naming and layout problems</h2>
          {[...diff.naming.introduced.map((p) => ['introduced', p.message]), ...diff.naming.resolved.map((p) => ['resolved', p.message]), ...diff.problems.introduced.map((p) => ['introduced', p.message]), ...diff.problems.resolved.map((p) => ['resolved', p.message])].map(([kind, m], i) => (
            <p key={i}><span className={`font-semibold ${kind === 'introduced' ? 'text-danger-700' : 'text-slate-700'}`}>{kind}:</span> {m}</p>
          ))}
          {diff.naming.introduced.length + diff.naming.resolved.length + diff.problems.introduced.length + diff.problems.resolved.length === 0 ? <p className="text-slate-600">None introduced or resolved.</p> : null}
        </section>
      ) : null}
    </div>
  );
}

const FIELD_WORDS = { x: 'X', y: 'Y', z: 'Z', c: 'C', width: 'width held' } as const;

/** Every changed station value before → after, one line each ("width held 1.2500 in → 1.5000 in at station 3"). */
function StationValues({ diff, displayUnit }: { diff: VersionDiffAnswer; displayUnit: Unit }) {
  const values = diff.stationValues;
  if (!values.length) return null;
  return (
    <section aria-labelledby="station-values" className="mt-3">
      <h3 id="station-values" className="mb-1 font-semibold">Station values, before → after ({values.length})</h3>
      <ul className="flex flex-col divide-y divide-slate-200 rounded border border-slate-300 bg-white">
        {values.map((v) => (
          <li key={`${v.id}-${v.field}`} data-testid="station-value" className="flex flex-wrap items-baseline gap-x-2 px-3 py-1.5 sm:grid sm:grid-cols-[6.5rem_9.5rem_1.25rem_9.5rem_minmax(0,1fr)]">
            <span className="font-semibold">{FIELD_WORDS[v.field]}</span>
            <span className="num">{stationValueText(v.field, v.from, diff.unit, displayUnit)}</span>
            <ArrowRight aria-label="to" className="h-4 w-4 self-center" />
            <span className="num font-semibold">{stationValueText(v.field, v.to, diff.unit, displayUnit)}</span>
            <span className="text-slate-700">at station {v.number}{v.previousNumber !== v.number ? ` (was ${v.previousNumber})` : ''} <span className="font-mono text-sm text-slate-500">{v.id}</span></span>
          </li>
        ))}
      </ul>
    </section>
  );
}
