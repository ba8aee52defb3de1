import type { JobDetail } from '../../../../shared/schemas/job';
import type { LoadList } from '../../../../shared/schemas/load-list';
import { LOAD_LIST_ADVICE } from '../../../../shared/clamps/reason-text';
import { formatServerTime } from '../../../lib/server-time';
import { railSettingWords } from '../job-format';

const cell = 'border border-black px-2 py-1 text-left';
const box = <span aria-hidden className="inline-block h-4 w-4 border border-black align-middle" />;

/**
 * The load list as printed (hidden on screen): the job, its pinned version, the print date, the
 * advice line, each rail's target opening with its room in words, which bar goes in which station
 * with boxes to tick by hand, and lines to sign. Black on white (DESIGN.md, Print).
 */
export function LoadListPrint({ job, list }: { job: JobDetail; list: LoadList }) {
  const check = job.stockChecks[0];
  return (
    <div className="hidden text-black print:block" data-testid="load-list-print">
      <h1 className="text-2xl font-semibold">Load list — {job.name}</h1>
      <p>
        Part <span className="font-mono">{job.partNumber}</span>{job.partRevision ? <> rev <span className="font-mono">{job.partRevision}</span></> : null}
        {' · '}{job.templateName} version {job.version} ({job.versionState})
        {' · '}{list.proposed ? 'proposed by Gridset' : `kept, revision ${list.revision}`}
      </p>
      <p>
        Stock check {check ? `of ${formatServerTime(check.at)}${check.by ? ` by ${check.by}` : ''}` : ''}
        {' · '}Printed {new Date().toLocaleDateString(undefined, { year: 'numeric', month: 'short', day: 'numeric' })}
      </p>
      <p className="mt-2 border border-black p-2 font-semibold" data-testid="load-list-print-advice">
        {LOAD_LIST_ADVICE}
      </p>
      {list.rails.map((r) => {
        const words = railSettingWords(r, job.unit);
        return (
          <section key={r.jawPlacement} className="mt-3 break-inside-avoid">
            <h2 className="text-lg font-semibold">Jaw rail {r.jawPlacement}: set the opening to <span className="font-mono">{words.target}</span> ± <span className="font-mono">{words.room}</span> (setting {r.setting + 1})</h2>
            <p>To set it: {words.shift}; {words.roomWords}.</p>
            <table className="mt-1 w-full table-fixed border-collapse">
              <thead><tr><th className={cell}>Station</th><th className={cell}>Bar</th><th className={cell}>Loaded</th><th className={cell}>Clamped</th></tr></thead>
              <tbody>
                {r.stations.map((s) => (
                  <tr key={s.station} data-testid="load-list-print-row">
                    <td className={`${cell} font-mono`}>{s.station}</td>
                    <td className={`${cell} font-mono`}>{s.bar ?? 'empty: skip'}</td>
                    <td className={cell}>{s.bar ? box : '—'}</td>
                    <td className={cell}>{s.bar ? box : '—'}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </section>
        );
      })}
      <p className="mt-2">Empty stations this cycle: <span className="font-mono">{list.emptyStations.length ? list.emptyStations.join(', ') : 'none'}</span>.</p>
      <div className="mt-6 grid grid-cols-2 gap-x-8 gap-y-6 break-inside-avoid">
        {['Loaded by', 'Date', 'Clamps checked by', 'Date'].map((k, i) => (
          <p key={i} className="flex items-end gap-2">{k}<span className="flex-1 border-b border-black">&nbsp;</span></p>
        ))}
      </div>
    </div>
  );
}
