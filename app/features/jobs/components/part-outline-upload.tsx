import { useId, useRef, useState, type FormEvent } from 'react';
import { Upload } from 'lucide-react';
import type { Unit } from '../../../../shared/schemas/common';
import type { JobDetail } from '../../../../shared/schemas/job';
import { formatNumber } from '../../../../shared/units/units';
import { Button } from '../../../components/ui/button';
import { SelectField, TextField } from '../../../components/ui/field';
import { ErrorText } from '../../../components/ui/notice';
import { parseDecimal } from '../../../../shared/units/decimal';
import { jobFileUrl, useUploadPartOutline } from '../api';

const kb = (bytes: number) => `${(bytes / 1024).toLocaleString('en-US', { maximumFractionDigits: 1 })} KB`;

/**
 * The part's outline from its DXF: drawn at every station and written into the job package. The
 * unit chosen here is used only when the file does not say its own ($INSUNITS 0 or missing).
 */
export function PartOutlineUpload({ job }: { job: JobDetail }) {
  const upload = useUploadPartOutline(job.id);
  const fileId = useId();
  const input = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [unit, setUnit] = useState<Unit>(job.unit);
  const [datumX, setDatumX] = useState('');
  const [datumY, setDatumY] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);

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
    if (!file) {
      setProblem('Choose the part’s DXF file first.');
      input.current?.focus();
      return;
    }
    const x = readDatum(datumX, 'X');
    const y = readDatum(datumY, 'Y');
    if (x === null || y === null) return;
    if ((x === undefined) !== (y === undefined)) {
      setProblem('Give both datum X and datum Y, or leave both empty for the lower-left corner.');
      return;
    }
    upload.mutate({ file, unit, datumX: x, datumY: y }, {
      onSuccess: (j) => {
        setDone(`${file.name} read: ${j.partOutline?.paths.length ?? 0} path${j.partOutline?.paths.length === 1 ? '' : 's'} and ${j.partOutline?.circles.length ?? 0} circle${j.partOutline?.circles.length === 1 ? '' : 's'}, in ${j.partFile?.unit ?? unit} as drawn, converted to ${j.unit}. Check the drawing above.`);
        setFile(null);
        if (input.current) input.current.value = '';
      },
    });
  };

  const pct = upload.progress === null ? null : Math.round(upload.progress * 100);
  return (
    <form noValidate onSubmit={submit} aria-labelledby="part-upload-title" className="flex flex-col gap-3 rounded border border-slate-300 bg-white p-4">
      <h2 id="part-upload-title" className="text-lg font-semibold">Part outline</h2>
      {job.partFile ? (
        <p className="text-slate-800">Now: <span className="font-mono">{job.partFile.name}</span> ({kb(job.partFile.size)}, drawn in {job.partFile.unit}), datum at{' '}
          <span className="num">({formatNumber(job.partFile.datum.x, job.partFile.unit)}, {formatNumber(job.partFile.datum.y, job.partFile.unit)}) {job.partFile.unit}</span> of the drawing.{' '}
          <a href={jobFileUrl(job.id, 'part-file.dxf')} download className="font-semibold text-accent-700 underline">Download the file</a></p>
      ) : <p className="text-slate-800">No outline yet: the drawing shows the template alone.</p>}
      <div className="flex flex-col gap-1">
        <label htmlFor={fileId} className="text-sm font-semibold text-slate-700">DXF file of the part</label>
        <input ref={input} id={fileId} type="file" accept=".dxf,application/dxf,image/vnd.dxf" className="min-h-10"
          onChange={(e) => { setFile(e.target.files?.[0] ?? null); setProblem(null); setDone(null); upload.reset(); }} />
      </div>
      <div className="grid grid-cols-1 gap-3 sm:grid-cols-3">
        <SelectField label="Drawing unit" value={unit} onChange={(e) => setUnit(e.target.value as Unit)}
          options={[{ value: 'in', label: 'in' }, { value: 'mm', label: 'mm' }]} hint="used only when the file does not say ($INSUNITS)" />
        <TextField label="Datum X" inputMode="decimal" className="num" value={datumX} onChange={(e) => setDatumX(e.target.value)} hint="in the drawing’s unit; empty: lower-left corner" />
        <TextField label="Datum Y" inputMode="decimal" className="num" value={datumY} onChange={(e) => setDatumY(e.target.value)} hint="of the part’s extents when both are empty" />
      </div>
      {pct !== null ? (
        <div className="flex flex-col gap-1">
          <progress max={100} value={pct} aria-label={`Uploading ${file?.name ?? 'the file'}`} className="h-3 w-full accent-accent-700" />
          <span role="status" className="text-sm text-slate-700">{pct < 100 ? `Sending… ${pct} %` : 'Sent; reading the drawing…'}</span>
        </div>
      ) : null}
      {problem ? <ErrorText error={problem} /> : <ErrorText error={upload.error} />}
      {done ? <p role="status" className="text-slate-800">{done}</p> : null}
      <div>
        <Button type="submit" variant="secondary" disabled={upload.isPending}><Upload aria-hidden className="h-4 w-4" />{upload.isPending ? 'Uploading…' : job.partFile ? 'Replace the outline' : 'Upload the outline'}</Button>
      </div>
    </form>
  );
}
