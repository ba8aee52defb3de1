import { useState } from 'react';
import { Download } from 'lucide-react';
import type { TemplateVersion } from '../../../../shared/schemas/template-api';
import { inputClass } from '../../../components/ui/field';
import { versionFileUrl } from '../api';

const linkClass = 'inline-flex min-h-10 items-center gap-2 rounded border border-slate-400 bg-white px-3 font-semibold text-slate-900 hover:bg-slate-100';

/** The files a programmer takes to CAM and to the control; each carries the version's content hash. */
export function Downloads({ templateId, version, dirty }: { templateId: number; version: TemplateVersion; dirty: boolean }) {
  const [base, setBase] = useState('');
  const [mode, setMode] = useState<'g10' | 'g52'>('g52');
  const n = version.version;
  const offsets = `${versionFileUrl(templateId, n, 'offsets.nc')}?mode=${mode}${mode === 'g10' ? `&base=${encodeURIComponent(base)}&dialect=${version.stations.length > 9 ? 'extended' : 'standard'}` : ''}`;
  const baseOk = /^\s*-?\d+(\.\d+)?\s*,\s*-?\d+(\.\d+)?\s*,\s*-?\d+(\.\d+)?\s*$/.test(base);
  return (
    <section className="flex flex-col gap-3 rounded border border-slate-300 bg-white p-4" aria-labelledby="downloads-title">
      <h2 id="downloads-title" className="text-lg font-semibold">Files of version {n}</h2>
      {dirty ? <p className="text-warning-700 font-semibold">Unsaved changes: files are written from the saved version.</p> : null}
      <div className="flex flex-wrap gap-2">
        <a className={linkClass} href={versionFileUrl(templateId, n, 'stations.csv')} download><Download aria-hidden className="h-4 w-4" />Stations CSV</a>
        <a className={linkClass} href={versionFileUrl(templateId, n, 'stations.xlsx')} download><Download aria-hidden className="h-4 w-4" />Stations XLSX</a>
        <a className={linkClass} href={versionFileUrl(templateId, n, 'template.json')} download><Download aria-hidden className="h-4 w-4" />template.json</a>
      </div>
      <fieldset className="flex flex-wrap items-end gap-3">
        <legend className="mb-1 text-sm font-semibold text-slate-700">G-code offsets</legend>
        <label className="flex flex-col text-sm font-semibold text-slate-700">Mode
          <select className={`${inputClass} w-64`} value={mode} onChange={(e) => setMode(e.target.value as 'g10' | 'g52')}>
            <option value="g52">G52 local shift per station</option>
            <option value="g10">G10 L2, one work offset per station</option>
          </select>
        </label>
        {mode === 'g10' ? (
          <label className="flex flex-col text-sm font-semibold text-slate-700">Machine position of the shared offset (x,y,z in {version.unit})
            <input className={`${inputClass} num w-72 text-left`} placeholder="-20.5,-12.25,-14.0" value={base} onChange={(e) => setBase(e.target.value)} />
          </label>
        ) : null}
        {mode === 'g52' || baseOk ? <a className={linkClass} href={offsets} download><Download aria-hidden className="h-4 w-4" />offsets.nc</a> : <span className="text-slate-600">Enter x,y,z to write G10 blocks.</span>}
      </fieldset>
      <p className="text-sm text-slate-600">Check every offset file against your control's programming manual before running it. Content hash <span className="font-mono">{version.contentHash.slice(0, 16)}…</span></p>
    </section>
  );
}
