import { useState } from 'react';
import { Download } from 'lucide-react';
import type { TemplateVersion } from '../../../../shared/schemas/template-api';
import { CONTROL_FAMILIES, FAMILIES, FAMILY_NAMES, type ControlFamily } from '../../../../shared/gcode/control-families';
import { inputClass } from '../../../components/ui/field';
import { Button } from '../../../components/ui/button';
import { ErrorText, Notice } from '../../../components/ui/notice';
import { isReleased } from '../../../../shared/interchange/draft-mark';
import { downloadFile } from '../../../lib/api-client';
import { versionFileUrl } from '../api';

const linkClass = 'inline-flex min-h-10 items-center gap-2 rounded border border-slate-400 bg-white px-3 font-semibold text-slate-900 hover:bg-slate-100';


/** What each family leaves set on the control, in a sentence. */
const FAMILY_NOTES: Record<ControlFamily, string> = {
  'ngc-g10': 'Sets one work offset per station (G10 L2 P X Y Z R, R0 included); the offsets stay set after the program ends.',
  'ngc-g52': 'Shifts from the shared work offset station by station (G52) and clears the shift at the end; it cannot turn a station.',
  'ext-l20': 'Sets one extended work offset per station (G10 L20 P X Y Z), selected by G54.1 P; no rotation. Check the register count of your control.',
  'shift-rotate': 'Per station: cancels rotation (G69), shifts (G52), turns about the station datum (G68 X0 Y0 R); all cleared at the end.',
};

const threeNumbers = /^\s*-?\d+(\.\d+)?\s*,\s*-?\d+(\.\d+)?\s*,\s*-?\d+(\.\d+)?\s*$/;

/** The files a programmer takes to CAM and to the control; each carries the version's content hash. */
export function Downloads({ templateId, version, dirty }: { templateId: number; version: TemplateVersion; dirty: boolean }) {
  const [family, setFamily] = useState<ControlFamily | ''>('');
  const [base, setBase] = useState('');
  const [first, setFirst] = useState('');
  const [error, setError] = useState<unknown>(null);
  const [busy, setBusy] = useState(false);
  const n = version.version;
  const rules = family ? FAMILIES[family] : null;
  const baseOk = threeNumbers.test(base);
  const ready = !!family && (!rules?.setsOffsets || baseOk);
  const query = new URLSearchParams({ family });
  if (rules?.setsOffsets) query.set('base', base.replace(/\s+/g, ''));
  if (rules?.registers !== 'none' && first.trim()) query.set('first', first.trim());

  async function fetchFile(url: string, name: string) {
    setError(null);
    setBusy(true);
    try {
      await downloadFile(url, name);
    } catch (e) {
      setError(e);
    } finally {
      setBusy(false);
    }
  }
  const download = () => fetchFile(`${versionFileUrl(templateId, n, 'offsets.nc')}?${query}`, `offsets-${family}.nc`);

  return (
    <section className="flex flex-col gap-3 rounded border border-slate-300 bg-white p-4" aria-labelledby="downloads-title">
      <h2 id="downloads-title" className="text-lg font-semibold">Files of version {n}</h2>
      {dirty ? <p className="text-warning-700 font-semibold">Unsaved changes: files are written from the saved version.</p> : null}
      {!isReleased(version) ? (
        <Notice tone="caution" title={`Version ${n} is ${version.state}, not released`}>Every file below starts with a NOT RELEASED line naming its state and content hash; use files of a released version on the machine.</Notice>
      ) : null}
      <div className="flex flex-wrap gap-2">
        <a className={linkClass} href={versionFileUrl(templateId, n, 'stations.csv')} download><Download aria-hidden className="h-4 w-4" />Stations CSV</a>
        <a className={linkClass} href={versionFileUrl(templateId, n, 'stations.xlsx')} download><Download aria-hidden className="h-4 w-4" />Stations XLSX</a>
        <a className={linkClass} href={versionFileUrl(templateId, n, 'template.json')} download><Download aria-hidden className="h-4 w-4" />template.json</a>
        {/* Fetched rather than linked: the server refuses the DXF, in words, while a layer name breaks the naming convention. */}
        <Button type="button" variant="secondary" disabled={busy} onClick={() => void fetchFile(versionFileUrl(templateId, n, 'drawing.dxf'), 'drawing.dxf')}><Download aria-hidden className="h-4 w-4" />Drawing DXF</Button>
        <a className={linkClass} href={versionFileUrl(templateId, n, 'drawing.svg')} download><Download aria-hidden className="h-4 w-4" />Drawing SVG</a>
      </div>
      <fieldset className="flex flex-wrap items-end gap-3">
        <legend className="mb-1 text-sm font-semibold text-slate-700">G-code offsets for your control</legend>
        <label className="flex flex-col text-sm font-semibold text-slate-700">Control family
          <select className={`${inputClass} w-80 max-w-full`} value={family} onChange={(e) => { setFamily(e.target.value as ControlFamily | ''); setError(null); }}>
            <option value="">Choose the family your control reads…</option>
            {CONTROL_FAMILIES.map((f) => <option key={f} value={f}>{FAMILY_NAMES[f]}</option>)}
          </select>
        </label>
        {rules?.setsOffsets ? (
          <label className="flex flex-col text-sm font-semibold text-slate-700">Machine position of the shared offset (x,y,z in {version.unit})
            <input className={`${inputClass} num w-72 max-w-full text-left`} placeholder="-20.5,-12.25,-14.0" value={base} onChange={(e) => setBase(e.target.value)} />
          </label>
        ) : null}
        {rules && rules.registers !== 'none' ? (
          <label className="flex flex-col text-sm font-semibold text-slate-700">Register of station 1 (optional)
            <input className={`${inputClass} num w-40 text-left`} inputMode="numeric" placeholder={rules.registers === 'standard' ? 'next free' : '1'} value={first} onChange={(e) => setFirst(e.target.value)} />
          </label>
        ) : null}
        <Button type="button" variant="secondary" disabled={!ready || busy} onClick={download}><Download aria-hidden className="h-4 w-4" />offsets.nc</Button>
      </fieldset>
      {family && rules?.setsOffsets && !baseOk ? <p className="text-sm text-slate-600">Enter x,y,z: the machine position of the shared offset, entered or probed once.</p> : null}
      {family ? <p className="text-sm text-slate-700">{FAMILY_NOTES[family]}</p> : null}
      <ErrorText error={error} />
      <p className="text-sm text-slate-600">Advice only: check every block against your control's programming manual and prove the file out without stock. Content hash <span className="font-mono">{version.contentHash.slice(0, 16)}…</span></p>
    </section>
  );
}
