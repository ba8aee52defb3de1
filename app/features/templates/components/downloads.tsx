import { useState } from 'react';
import { Download } from 'lucide-react';
import type { TemplateVersion } from '../../../../shared/schemas/template-api';
import { FAMILY_LABELS, G10_FAMILIES, OFFSET_FAMILIES, type OffsetFamily } from '../../../../shared/gcode/offsets';
import { inputClass } from '../../../components/ui/field';
import { versionFileUrl } from '../api';

const linkClass = 'inline-flex min-h-10 items-center gap-2 rounded border border-slate-400 bg-white px-3 font-semibold text-slate-900 hover:bg-slate-100';
const NUM = /^\s*-?\d+(\.\d+)?\s*$/;

/** The files a programmer takes to CAM and to the control; each carries the version's content hash. */
export function Downloads({ templateId, version, dirty }: { templateId: number; version: TemplateVersion; dirty: boolean }) {
  const [base, setBase] = useState({ x: '', y: '', z: '' });
  const [first, setFirst] = useState('');
  const [family, setFamily] = useState<OffsetFamily>('ngc-g52');
  const [refusal, setRefusal] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const n = version.version;
  const needsBase = G10_FAMILIES.includes(family);
  const baseOk = [base.x, base.y, base.z].every((v) => NUM.test(v));
  const params = new URLSearchParams({ family });
  if (needsBase) params.set('base', `${base.x.trim()},${base.y.trim()},${base.z.trim()}`);
  if (needsBase && first.trim()) params.set('first', first.trim());
  const offsets = `${versionFileUrl(templateId, n, 'offsets.nc')}?${params}`;

  /** Fetches the file so a refusal's sentence shows here, beside the controls. */
  async function download() {
    setBusy(true);
    setRefusal(null);
    try {
      const res = await fetch(offsets, { credentials: 'same-origin' });
      if (!res.ok) {
        const body = await res.json().catch(() => null);
        setRefusal(body?.error?.message ?? `The server refused the file (${res.status}).`);
        return;
      }
      const blob = await res.blob();
      const name = /filename="?([^";]+)"?/.exec(res.headers.get('content-disposition') ?? '')?.[1] ?? `offsets-${family}.nc`;
      const a = document.createElement('a');
      a.href = URL.createObjectURL(blob);
      a.download = name;
      a.click();
      URL.revokeObjectURL(a.href);
    } finally {
      setBusy(false);
    }
  }

  const field = (axis: 'x' | 'y' | 'z') => (
    <label key={axis} className="flex flex-col text-sm font-semibold text-slate-700">Base {axis.toUpperCase()} ({version.unit})
      <input className={`${inputClass} num w-28 text-left`} inputMode="decimal" value={base[axis]} onChange={(e) => { setBase({ ...base, [axis]: e.target.value }); setRefusal(null); }} />
    </label>
  );
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
        <label className="flex flex-col text-sm font-semibold text-slate-700">Control family
          <select className={`${inputClass} w-72`} value={family} onChange={(e) => { setFamily(e.target.value as OffsetFamily); setRefusal(null); }}>
            {OFFSET_FAMILIES.map((f) => <option key={f} value={f}>{f}: {FAMILY_LABELS[f]}</option>)}
          </select>
        </label>
        {needsBase ? (
          <>
            {field('x')}{field('y')}{field('z')}
            <label className="flex flex-col text-sm font-semibold text-slate-700">First register (optional)
              <input className={`${inputClass} num w-28 text-left`} inputMode="numeric" value={first} onChange={(e) => { setFirst(e.target.value); setRefusal(null); }} />
            </label>
          </>
        ) : null}
        {!needsBase || baseOk
          ? <button type="button" className={linkClass} onClick={download} disabled={busy}><Download aria-hidden className="h-4 w-4" />offsets.nc</button>
          : <span className="text-slate-600">Enter the machine position of the shared offset (X, Y, Z) to write G10 blocks.</span>}
      </fieldset>
      {refusal ? <p role="alert" className="text-danger-700 font-semibold">{refusal}</p> : null}
      <p className="text-sm text-slate-600">Check every offset file against your control's programming manual before running it. Content hash <span className="font-mono">{version.contentHash.slice(0, 16)}…</span></p>
    </section>
  );
}
