import { useRef, useState, type FormEvent } from 'react';
import { Upload } from 'lucide-react';
import type { Unit } from '../../../../shared/schemas/common';
import type { JobDetail } from '../../../../shared/schemas/job';
import type { DxfInspection } from '../../../../shared/schemas/dxf-inspection';
import { formatNumber } from '../../../../shared/units/units';
import { Button } from '../../../components/ui/button';
import { FilePicker } from '../../../components/ui/file-picker';
import { SelectField, TextField } from '../../../components/ui/field';
import { ErrorText } from '../../../components/ui/notice';
import { parseDecimal } from '../../../../shared/units/decimal';
import { ApiError } from '../../../lib/api-client';
import { useInspectDxf } from '../../../lib/dxf-inspection';
import { jobFileUrl, useStoreInspectedPartOutline } from '../api';

const kb = (bytes: number) => `${(bytes / 1024).toLocaleString('en-US', { maximumFractionDigits: 1 })} KB`;
const plural = (n: number, word: string) => `${n.toLocaleString('en-US')} ${word}${n === 1 ? '' : 's'}`;

/** What the reading found, in a line: size of the drawing, its unit (said by the file or not) and its extents. */
function InspectionFacts({ inspection, unit }: { inspection: DxfInspection; unit: Unit }) {
  const u = inspection.unit ?? unit;
  const b = inspection.bbox;
  return (
    <div className="flex flex-col gap-1 text-slate-800">
      <p>
        {`${plural(inspection.entities, 'entity')} on ${plural(inspection.layers.length, 'layer')}; `}
        {inspection.unit ? `drawn in ${inspection.unit} (the file says so, $INSUNITS ${inspection.insunits}).` : `the file does not say its unit: read as ${unit}, the unit chosen below.`}
        {b ? <> Extents <span className="num">X {formatNumber(b.minX, u)} … {formatNumber(b.maxX, u)}, Y {formatNumber(b.minY, u)} … {formatNumber(b.maxY, u)} {u}</span>; the datum is given in these coordinates.</> : null}
      </p>
      {inspection.warnings.length ? <ul className="list-disc pl-5 text-warning-700">{inspection.warnings.map((w) => <li key={w}>{w}</li>)}</ul> : null}
    </div>
  );
}

/**
 * The part's outline from its DXF: drawn at every station and written into the job package. The file
 * is sent once, when chosen, to be read (POST /api/dxf/inspect): the server keeps it an hour under its
 * SHA-256, and storing the outline names that hash with the choices made here. The unit chosen here is
 * used only when the file does not say its own ($INSUNITS 0 or missing).
 */
export function PartOutlineUpload({ job }: { job: JobDetail }) {
  const inspect = useInspectDxf();
  const store = useStoreInspectedPartOutline(job.id);
  const input = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<{ name: string; size: number } | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [unit, setUnit] = useState<Unit>(job.unit);
  const [datumX, setDatumX] = useState('');
  const [datumY, setDatumY] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const inspection = file ? inspect.data ?? null : null;

  const pick = (f: File) => {
    setFile({ name: f.name, size: f.size });
    setProblem(null);
    setDone(null);
    store.reset();
    inspect.reset();
    setProgress(0);
    inspect.mutate({ file: f, onProgress: setProgress }, { onSettled: () => setProgress(null) });
  };

  const readDatum = (text: string, axis: string): number | undefined | null => {
    if (text.trim() === '') return undefined;
    const v = parseDecimal(text);
    if (v === null) {
      setProblem(`Datum ${axis} "${text}" is not a number: write it with a decimal point, e.g. 10.5, or leave it empty.`);
      return null;
    }
    return v;
  };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    setProblem(null);
    setDone(null);
    if (!file || !inspection) {
      setProblem(!file ? 'Choose the part’s DXF file first.' : inspect.isPending ? 'Wait until the drawing has been read.' : 'Choose another DXF file: this one could not be read (see above).');
      if (!file) input.current?.focus();
      return;
    }
    const x = readDatum(datumX, 'X');
    const y = readDatum(datumY, 'Y');
    if (x === null || y === null) return;
    if ((x === undefined) !== (y === undefined)) {
      setProblem('Give both datum X and datum Y, or leave both empty for the lower-left corner.');
      return;
    }
    store.mutate({ sha256: inspection.sha256, name: file.name, unit, datumX: x, datumY: y }, {
      onSuccess: (j) => {
        setDone(`${file.name} read: ${plural(j.partOutline?.paths.length ?? 0, 'path')} and ${plural(j.partOutline?.circles.length ?? 0, 'circle')}, in ${j.partFile?.unit ?? unit} as drawn, converted to ${j.unit}. Check the drawing above.`);
        setFile(null);
        inspect.reset();
      },
      onError: (err) => {
        // The server no longer keeps the drawing (kept an hour): it has to be chosen, and sent, again.
        if (err instanceof ApiError && err.status === 410) { setFile(null); inspect.reset(); }
      },
    });
  };

  const pct = progress === null ? null : Math.round(progress * 100);
  return (
    <form noValidate onSubmit={submit} aria-labelledby="part-upload-title" className="flex flex-col gap-3 rounded border border-slate-300 bg-white p-4">
      <h2 id="part-upload-title" className="text-lg font-semibold">Part outline</h2>
      {job.partFile ? (
        <p className="text-slate-800">Now: <span className="font-mono">{job.partFile.name}</span> ({kb(job.partFile.size)}, drawn in {job.partFile.unit}), datum at{' '}
          <span className="num">({formatNumber(job.partFile.datum.x, job.partFile.unit)}, {formatNumber(job.partFile.datum.y, job.partFile.unit)}) {job.partFile.unit}</span> of the drawing.{' '}
          <a href={jobFileUrl(job.id, 'part-file.dxf')} download className="font-semibold text-accent-700 underline">Download the file</a></p>
      ) : <p className="text-slate-800">No outline yet: the drawing shows the template alone.</p>}
      <FilePicker label="DXF file of the part" accept=".dxf,.DXF,application/dxf,image/vnd.dxf" onFile={pick} inputRef={input}
        buttonLabel={file ? 'Choose another DXF file' : 'Choose a DXF file'} chosen={file?.name ?? null} disabled={store.isPending}
        hint="Read when chosen; nothing is stored until you upload the outline." />
      {pct !== null ? (
        <div className="flex flex-col gap-1">
          <progress max={100} value={pct} aria-label={`Uploading ${file?.name ?? 'the file'}`} className="h-3 w-full accent-accent-700" />
          <span role="status" className="text-sm text-slate-700">{pct < 100 ? `Sending… ${pct} %` : 'Sent; reading the drawing…'}</span>
        </div>
      ) : null}
      {file ? <ErrorText error={inspect.error} /> : null}
      {inspection ? <InspectionFacts inspection={inspection} unit={unit} /> : null}
      <div className="grid grid-cols-1 gap-3 sm:grid-cols-3">
        <SelectField label="Drawing unit" value={unit} onChange={(e) => setUnit(e.target.value as Unit)}
          options={[{ value: 'in', label: 'in' }, { value: 'mm', label: 'mm' }]} hint="used only when the file does not say ($INSUNITS)" />
        <TextField label="Datum X" inputMode="decimal" className="num" value={datumX} onChange={(e) => setDatumX(e.target.value)} hint="in the drawing’s unit; empty: lower-left corner" />
        <TextField label="Datum Y" inputMode="decimal" className="num" value={datumY} onChange={(e) => setDatumY(e.target.value)} hint="of the part’s extents when both are empty" />
      </div>
      {problem ? <ErrorText error={problem} /> : <ErrorText error={store.error} />}
      {done ? <p role="status" className="text-slate-800">{done}</p> : null}
      <div>
        <Button type="submit" variant="secondary" disabled={store.isPending || inspect.isPending}><Upload aria-hidden className="h-4 w-4" />{store.isPending ? 'Storing…' : job.partFile ? 'Replace the outline' : 'Upload the outline'}</Button>
      </div>
    </form>
  );
}
