import type { Unit } from '../../../../shared/schemas/common';
import type { Station } from '../../../../shared/schemas/template';
import { formatLength } from '../../../../shared/units/units';
import { stationRuns } from '../job-format';
import type { JobRail } from '../job-rails';

/** A cell as a line of its rail's card on a phone: the column's name on the left, the value on the right. */
const CARD_CELL = 'max-md:flex max-md:justify-between max-md:gap-4 max-md:py-1 max-md:text-right max-md:before:shrink-0 max-md:before:font-semibold max-md:before:font-sans max-md:before:text-slate-700 max-md:before:content-[attr(data-label)]';

/**
 * Which jaw rail holds which width for which stations, with the choice of the rail whose clamp
 * window the measured bars are checked against. A rail whose component carries no clamp model
 * in the pinned version cannot be chosen, nor can a rail none of whose stations the job uses
 * (its width held does not take the job's stock).
 */
export function PairingTable({ rails, stations, used, unit, selected, onSelect, hasClamp }: {
  rails: readonly JobRail[];
  stations: readonly Station[];
  /** Numbers of the stations the job's stock fits (stationsUsed); the others are marked not used. */
  used: ReadonlySet<number>;
  unit: Unit;
  selected: string | null;
  onSelect: (jawPlacement: string) => void;
  hasClamp: (jawComponent: string) => boolean;
}) {
  const numberOf = new Map(stations.map((s) => [s.id, s.number]));
  return (
    <section aria-labelledby="pairing-title" className="flex flex-col gap-2">
      <h2 id="pairing-title" className="text-lg font-semibold">Jaw rails <span className="font-normal text-slate-600">— which rail holds which width, for which stations</span></h2>
      {rails.length === 0 ? (
        <p className="rounded border border-slate-300 bg-white p-3 text-slate-800">No jaw rail of this template faces a fixed jaw, so there is no clamp window to check bars against.</p>
      ) : (
        <div className="relative overflow-x-auto rounded border border-slate-300 bg-white">
          {/* Below the md breakpoint each rail is a card of label–value lines (as DataTable does), so nothing is cut off on a phone. */}
          <table className="w-full border-collapse text-[15px] max-md:block">
            <caption className="sr-only">Jaw rails of the pinned template, the stations of each the job uses, and the rail whose check is shown</caption>
            <thead className="bg-slate-100 max-md:hidden">
              <tr>
                <th scope="col" className="border-b border-slate-300 px-3 py-2 text-left font-semibold text-slate-700">Check shown</th>
                <th scope="col" className="border-b border-slate-300 px-3 py-2 text-left font-semibold text-slate-700">Jaw rail</th>
                <th scope="col" className="border-b border-slate-300 px-3 py-2 text-left font-semibold text-slate-700">On hole</th>
                <th scope="col" className="border-b border-slate-300 px-3 py-2 text-left font-semibold text-slate-700">Against</th>
                <th scope="col" className="border-b border-slate-300 px-3 py-2 text-right font-semibold text-slate-700">Width held</th>
                <th scope="col" className="border-b border-slate-300 px-3 py-2 text-left font-semibold text-slate-700">Stations</th>
              </tr>
            </thead>
            <tbody className="max-md:block">
              {rails.map((r) => {
                const clamp = hasClamp(r.jawComponent);
                const isSelected = selected === r.jawPlacement;
                const numbers = r.stations.map((id) => numberOf.get(id)).filter((n): n is number => n !== undefined);
                const usedHere = numbers.filter((n) => used.has(n));
                const unusedHere = numbers.filter((n) => !used.has(n));
                const inUse = usedHere.length > 0;
                return (
                  <tr key={r.jawPlacement} data-used={inUse ? 'yes' : 'no'} className={`border-b border-slate-200 last:border-0 max-md:block max-md:py-1 ${isSelected ? 'bg-accent-50' : ''} ${inUse ? '' : 'bg-slate-50 text-slate-600'}`}>
                    <td className="px-3 py-1 max-md:block">
                      <label className={`inline-flex min-h-10 items-center gap-2 font-semibold ${clamp ? 'cursor-pointer' : 'text-slate-500'}`}>
                        <input type="radio" name="check-rail" className="h-5 w-5 accent-accent-700" checked={isSelected} disabled={!clamp || !inUse}
                          onChange={() => onSelect(r.jawPlacement)} aria-label={`Show the check of rail ${r.jawPlacement}`} />
                        {!inUse ? 'not used by this job' : clamp ? (isSelected ? 'shown' : 'show') : 'no clamp model'}
                      </label>
                    </td>
                    <td data-label="Jaw rail" className={`px-3 py-2 ${CARD_CELL}`}><span><span className="font-mono font-semibold">{r.jawPlacement}</span> <span className="font-mono text-slate-700">{r.jawComponent}</span></span></td>
                    <td data-label="On hole" className={`px-3 py-2 font-mono [font-variant-numeric:tabular-nums] ${CARD_CELL}`}>({r.pairings[0]!.jawHole.col}, {r.pairings[0]!.jawHole.row})</td>
                    <td data-label="Against" className={`px-3 py-2 ${CARD_CELL}`}><span>{r.pairings.map((p) => <span key={`${p.fixedPlacement}:${p.fixedFace}`} className="block"><span className="font-mono">{p.fixedPlacement}</span> <span className="font-mono text-slate-700">{p.fixedComponent}</span></span>)}</span></td>
                    <td data-label="Width held" className={`num px-3 py-2 ${CARD_CELL}`}><span>{r.pairings.map((p) => <span key={`${p.fixedPlacement}:${p.fixedFace}`} className="block">{formatLength(p.width, unit)}</span>)}</span></td>
                    <td data-label="Stations" className={`px-3 py-2 ${CARD_CELL}`}><span>
                      <span className="font-mono [font-variant-numeric:tabular-nums]">{stationRuns(usedHere) || '—'}</span> <span className="text-slate-600">({usedHere.length} used)</span>
                      {unusedHere.length ? <span className="block text-slate-600">not used: <span className="font-mono [font-variant-numeric:tabular-nums]">{stationRuns(unusedHere)}</span> ({unusedHere.length})</span> : null}
                    </span></td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
