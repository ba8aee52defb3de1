import { Link } from 'react-router-dom';
import { Download, FileSpreadsheet, Printer } from 'lucide-react';
import type { JobDetail } from '../../../../shared/schemas/job';
import { formatLength } from '../../../../shared/units/units';
import { Notice } from '../../../components/ui/notice';
import { jobFileUrl } from '../api';
import { formatHoursMinutes, formatMinutes } from '../job-format';
import { compareUrl } from './jobs-table';

const linkClass = 'inline-flex min-h-10 items-center gap-2 rounded border border-slate-400 bg-white px-3 font-semibold text-slate-900 hover:bg-slate-100 max-md:min-h-11 max-md:px-2 max-md:text-sm';

/** Unattended runtime of one load: stations the job uses × cycle + load (common practice, shared/stations/runtime.ts). */
export function RuntimeCard({ job }: { job: JobDetail }) {
  return (
    <section aria-labelledby="runtime-title" className="rounded border border-slate-300 bg-white p-4">
      <h2 id="runtime-title" className="text-lg font-semibold">Runtime of one load</h2>
      <p className="mt-1 flex flex-wrap items-baseline gap-x-3">
        <span className="num text-3xl font-semibold" data-testid="runtime-minutes">{formatMinutes(job.runtimeMinutes)}</span>
        <span className="num text-xl text-slate-800">{formatHoursMinutes(job.runtimeMinutes)} h</span>
      </p>
      <p className="mt-1 font-mono text-slate-700 [font-variant-numeric:tabular-nums]" data-testid="runtime-formula">{job.stationsUsed.length} stations used × {formatMinutes(job.cycleMinutes)} + {formatMinutes(job.loadMinutes)} load</p>
      {job.stationsUsed.length < job.stations ? (
        <p className="mt-1 text-slate-700" data-testid="stations-unused">
          {job.stations - job.stationsUsed.length} of the template’s {job.stations} stations hold a width this stock does not fit and are left out of the runtime, drawing and package.
        </p>
      ) : null}
    </section>
  );
}

/** The job's own numbers, as the stock check and the setup sheet use them. */
export function JobSetupFacts({ job }: { job: JobDetail }) {
  const u = job.unit;
  const rows: [string, string][] = [
    ['Stock width', formatLength(job.stock.width, u)],
    ['Stock thickness', formatLength(job.stock.thickness, u)],
    ['Stock length', formatLength(job.stock.length, u)],
    ['Carrier', formatLength(job.carrier, u)],
    ['Tool clearance', formatLength(job.clearance, u)],
    ['Minimum bite', formatLength(job.minBite, u)],
  ];
  return (
    <section aria-labelledby="setup-facts-title" className="rounded border border-slate-300 bg-white p-4">
      <h2 id="setup-facts-title" className="text-lg font-semibold">Stock and clamping</h2>
      <dl className="mt-1 grid grid-cols-[minmax(0,1fr)_auto] gap-x-4 gap-y-1">
        {rows.map(([k, v]) => (
          <div key={k} className="contents">
            <dt className="text-slate-700">{k}</dt>
            <dd className="num">{v}</dd>
          </div>
        ))}
        <dt className="text-slate-700">Part rotation</dt>
        <dd className="num">{job.partRotation}°</dd>
        <dt className="text-slate-700">Material</dt>
        <dd className="text-right">{job.stock.material || '—'}</dd>
      </dl>
      {job.notes ? <p className="mt-2 whitespace-pre-wrap border-t border-slate-200 pt-2 text-slate-800">{job.notes}</p> : null}
    </section>
  );
}

/** The files that go to the machine: the package, the setup sheet to print, the pinned stations. */
export function JobFiles({ job, stationsCsvUrl }: { job: JobDetail; stationsCsvUrl: string }) {
  return (
    <div className="flex flex-wrap gap-2">
      <a className={linkClass} href={jobFileUrl(job.id, 'package.zip')} download><Download aria-hidden className="h-4 w-4" />Download job package</a>
      <a className={linkClass} href={jobFileUrl(job.id, 'setup-sheet.html')} target="_blank" rel="noreferrer"><Printer aria-hidden className="h-4 w-4" />Print setup sheet</a>
      <a className={linkClass} href={stationsCsvUrl} download><FileSpreadsheet aria-hidden className="h-4 w-4" />Stations CSV (v{job.version})</a>
    </div>
  );
}

/** A later release exists: said in words with the link to what changed; the job does not move by itself. */
export function NewerReleaseNotice({ job, canEdit }: { job: JobDetail; canEdit: boolean }) {
  if (job.newerRelease === null) return null;
  return (
    <Notice tone="info" title={`Version ${job.newerRelease} of ${job.templateName} is released; this job stays pinned to version ${job.version}.`}>
      <p>
        <Link className="font-semibold text-accent-700 underline" to={compareUrl(job)}>Compare v{job.version} with v{job.newerRelease}</Link>
        {canEdit ? ' before moving the job to it with Edit job.' : ' to see what changed; a programmer or lead decides whether the job moves.'}
      </p>
    </Notice>
  );
}

/** The job in one short block at the top of its page: the stock, the stations used and the runtime of a load. */
export function JobFactsLine({ job }: { job: JobDetail }) {
  const u = job.unit;
  const s = job.stock;
  return (
    <dl className="flex flex-wrap gap-x-5 gap-y-1 rounded border border-slate-300 bg-white px-4 py-2 text-slate-800" data-testid="job-facts-line">
      <div className="flex gap-1"><dt className="text-slate-700">Stock</dt><dd className="font-mono [font-variant-numeric:tabular-nums]">{formatLength(s.width, u)} × {formatLength(s.thickness, u)}{s.material ? ` ${s.material}` : ''}</dd></div>
      <div className="flex gap-1"><dt className="text-slate-700">Stations used</dt><dd className="num">{job.stationsUsed.length} of {job.stations}</dd></div>
      <div className="flex gap-1"><dt className="text-slate-700">One load</dt><dd className="num">{formatMinutes(job.runtimeMinutes)}</dd></div>
      <div className="flex gap-1"><dt className="text-slate-700">Checks</dt><dd className="num">{job.stockChecks.length}</dd></div>
    </dl>
  );
}
