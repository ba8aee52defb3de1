import { useMemo, useRef, useState, type FormEvent } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Download, Upload } from 'lucide-react';
import type { JobDetail } from '../../../../shared/schemas/job';
import { PROGRAM_FAMILIES } from '../../../../shared/schemas/part-program';
import { FAMILY_NAMES, setsOffsets } from '../../../../shared/gcode/control-families';
import { readPartProgram } from '../../../../shared/gcode/read-part-program';
import { tablePreview } from '../../../../shared/gcode/program-preview';
import { formatLength, formatNumber } from '../../../../shared/units/units';
import { Button } from '../../../components/ui/button';
import { FilePicker } from '../../../components/ui/file-picker';
import { SelectField, TextField } from '../../../components/ui/field';
import { ErrorText, Notice } from '../../../components/ui/notice';
import { parseDecimal } from '../../../../shared/units/decimal';
import { partProgramTextQuery, tableProgramUrl, useLoadList, useUploadPartProgram } from '../api';

const FAMILY_LABEL: Record<string, string> = { expanded: 'Every coordinate rewritten (one work offset)', ...FAMILY_NAMES };

/**
 * The whole-table program: the programmer uploads one part's posted program (program zero at the
 * part's datum on its station); anyone downloads it written for every station of the job.
 */
export function PartProgramPanel({ job, canEdit }: { job: JobDetail; canEdit: boolean }) {
  const p = job.partProgram;
  const u = job.unit;
  const [family, setFamily] = useState<string>('expanded');
  const [order, setOrder] = useState<'station' | 'tool'>('tool');
  const [skip, setSkip] = useState<number[]>([]);
  // Stations the load list leaves without a bar are skipped unless the programmer changes it.
  const loadList = useLoadList(job.id, job.stockChecks.length > 0);
  const [skipTouched, setSkipTouched] = useState(false);
  // Set during render when the load list or the stations change (React docs, "Adjusting some state
  // when a prop changes"), not in an effect.
  const [seen, setSeen] = useState<{ list: unknown; used: unknown }>({ list: undefined, used: undefined });
  if (!skipTouched && loadList.data && (loadList.data !== seen.list || job.stationsUsed !== seen.used)) {
    setSeen({ list: loadList.data, used: job.stationsUsed });
    setSkip(loadList.data.emptyStations.filter((n) => job.stationsUsed.includes(n)));
  }
  const [safeZ, setSafeZ] = useState('');
  const [base, setBase] = useState('');
  const needsBase = setsOffsets(family);
  const numbers = useMemo(() => [...job.stationsUsed].sort((a, b) => a - b), [job.stationsUsed]);
  const safeValue = safeZ.trim() === '' ? null : parseDecimal(safeZ);
  const safeProblem = safeZ.trim() !== '' && safeValue === null ? `Safe Z "${safeZ}" is not a number: write it with a decimal point, e.g. 1.25.`
    : p && safeValue !== null && safeValue < p.minimumSafeZ ? `Safe Z must be at least ${formatLength(p.minimumSafeZ, u)} for this job (stock top or tallest clamp plus a clearance).`
    : skip.length === numbers.length ? 'Every station is skipped; leave at least one.'
    : needsBase && base.trim() === '' ? 'This family sets a work offset per station: give the machine position of the shared offset as x,y,z.' : null;
  const toggle = (n: number) => {
    setSkipTouched(true);
    setSkip((s) => (s.includes(n) ? s.filter((v) => v !== n) : [...s, n].sort((a, b) => a - b)));
  };
  // Station order changes every tool at every station; tool order once per tool segment.
  const running = numbers.length - skip.length;
  const perStation = (p?.toolChanges.length ?? 0) * running;
  const perTool = p?.toolChanges.length ?? 0;

  return (
    <section aria-labelledby="program-title" className="flex flex-col gap-4 border-t border-slate-300 pt-4">
      <div>
        <h2 id="program-title" className="text-xl font-semibold">Whole-table program</h2>
        <p className="text-slate-700">One part’s program, posted with program zero at the part’s datum on its station (Z0 at the station’s Z), written for every station of this job from the shared work offset.</p>
      </div>
      {canEdit ? <ProgramUpload job={job} /> : null}
      {p ? (
        <div className="grid grid-cols-1 items-start gap-6 xl:grid-cols-[minmax(0,26rem)_minmax(0,1fr)]">
          <div className="flex flex-col gap-4 rounded border border-slate-300 bg-white p-4">
            <h3 className="text-lg font-semibold">What was read</h3>
            <dl className="grid grid-cols-[minmax(0,1fr)_auto] gap-x-4 gap-y-1">
              {([
                ['File', p.name],
                ['Lines', p.lines.toLocaleString('en-US')],
                ['Tools in order', p.toolChanges.map((t) => `T${t.tool}`).join(' → ') || 'none (tool in spindle)'],
                ['Feed moves, arcs, holes', `${p.feedMoves}, ${p.arcs}, ${p.holes}`],
                ['Work offset', p.workOffset ?? 'not selected'],
                ['Unit', `${p.unit}${p.unitDeclared ? '' : ' (no G20/G21: the job’s unit)'}`],
                ['Extents X', p.extents ? `${formatNumber(p.extents.min.x, u)} … ${formatLength(p.extents.max.x, u)}` : '—'],
                ['Extents Y', p.extents ? `${formatNumber(p.extents.min.y, u)} … ${formatLength(p.extents.max.y, u)}` : '—'],
                ['Extents Z', p.extents ? `${formatNumber(p.extents.min.z, u)} … ${formatLength(p.extents.max.z, u)}` : '—'],
                ['Lowest safe Z', formatLength(p.minimumSafeZ, u)],
              ] as const).map(([k, v]) => (
                <div key={k} className="contents"><dt className="text-slate-700">{k}</dt><dd className="num text-right">{v}</dd></div>
              ))}
              <dt className="text-slate-700">SHA-256</dt><dd className="truncate font-mono text-sm" title={p.sha256}>{p.sha256.slice(0, 16)}…</dd>
            </dl>
            <SelectField label="Control family" value={family} onChange={(e) => setFamily(e.target.value)} options={PROGRAM_FAMILIES.map((f) => ({ value: f, label: FAMILY_LABEL[f] ?? f }))} />
            {needsBase ? <TextField label="Shared offset at machine x,y,z" unit={u} className="num" value={base} placeholder="-20.5,-12.25,-14.0" onChange={(e) => setBase(e.target.value)} hint="the G10 blocks at the top set each station's offset from it" /> : null}
            <fieldset className="flex flex-col gap-1">
              <legend className="text-sm font-semibold text-slate-700">Order</legend>
              <label className="flex min-h-10 items-center gap-2"><input type="radio" name="program-order" checked={order === 'tool'} onChange={() => setOrder('tool')} />By tool: each tool once, over every station</label>
              <label className="flex min-h-10 items-center gap-2"><input type="radio" name="program-order" checked={order === 'station'} onChange={() => setOrder('station')} />By station: each station whole in turn</label>
              {perTool > 1 && running > 1 ? (
                <p className="text-sm text-slate-700" data-testid="tool-changes">Tool changes a cycle: <span className="num">{perTool}</span> by tool, <span className="num">{perStation}</span> by station — tool order saves <span className="num font-semibold">{perStation - perTool}</span>.</p>
              ) : null}
            </fieldset>
            <fieldset className="flex flex-col gap-1">
              <legend className="text-sm font-semibold text-slate-700">Stations to skip (empty nests; only the stations this job uses are written){loadList.data && !skipTouched ? ' — from the load list' : ''}</legend>
              <div className="flex flex-wrap gap-1">
                {numbers.map((n) => (
                  <label key={n} className={`flex min-h-10 min-w-12 items-center justify-center gap-1 rounded border px-2 font-mono ${skip.includes(n) ? 'border-slate-900 bg-slate-200' : 'border-slate-400 bg-white'}`}>
                    <input type="checkbox" className="sr-only" checked={skip.includes(n)} onChange={() => toggle(n)} aria-label={`Skip station ${n}`} />
                    {skip.includes(n) ? <s>{n}</s> : n}
                  </label>
                ))}
              </div>
            </fieldset>
            <TextField label="Safe Z above the shared offset’s Z0" unit={u} inputMode="decimal" className="num" value={safeZ} placeholder={formatNumber(p.minimumSafeZ, u)}
              onChange={(e) => setSafeZ(e.target.value)} hint={`empty: ${formatLength(p.minimumSafeZ, u)}; the tool rises here before every station change and tool change`} />
            {safeProblem ? <ErrorText error={safeProblem} /> : (
              <a className="inline-flex min-h-10 items-center justify-center gap-2 rounded bg-accent-700 px-4 font-semibold text-white hover:bg-accent-800"
                href={tableProgramUrl(job.id, { family, order, skip, safeZ, base: needsBase ? base : undefined })} download>
                <Download aria-hidden className="h-4 w-4" />Download the whole-table program
              </a>
            )}
            <Notice tone="caution" title="Advice from the entered data, not a go-ahead">
              The file is computed from the template’s stations and the uploaded program. Prove it out without stock first; the operator checks every clamp before cycle start and follows the machine builder’s instructions.
            </Notice>
          </div>
          <ProgramPreview job={job} skip={skip} />
        </div>
      ) : <p className="text-slate-800">No part program yet{canEdit ? ': upload the one the CAM system posted for one part.' : '.'}</p>}
    </section>
  );
}

function ProgramUpload({ job }: { job: JobDetail }) {
  const upload = useUploadPartProgram(job.id);
  const input = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const submit = (e: FormEvent) => {
    e.preventDefault();
    setProblem(null);
    if (!file) { setProblem('Choose the part program file first.'); input.current?.focus(); return; }
    upload.mutate(file, { onSuccess: () => setFile(null) });
  };
  const pct = upload.progress === null ? null : Math.round(upload.progress * 100);
  return (
    <form noValidate onSubmit={submit} aria-label="Upload the part program" className="flex flex-wrap items-end gap-3 rounded border border-slate-300 bg-white p-4">
      <FilePicker label="Part program (G-code, program zero at the part datum)" accept=".nc,.ngc,.tap,.gcode,.txt,text/plain" inputRef={input}
        chosen={file?.name ?? null} onFile={(f) => { setFile(f); setProblem(null); upload.reset(); }} />
      <Button type="submit" variant="secondary" disabled={upload.isPending}><Upload aria-hidden className="h-4 w-4" />{upload.isPending ? 'Reading…' : job.partProgram ? 'Replace the program' : 'Upload the program'}</Button>
      {pct !== null && pct < 100 ? <span role="status" className="text-sm text-slate-700">Sending… {pct} %</span> : null}
      <div className="w-full">{problem ? <ErrorText error={problem} /> : <ErrorText error={upload.error} />}</div>
    </form>
  );
}

/** Each station's cutting path, turned and moved as the file writes it (shared/gcode/program-preview.ts); skipped stations faint. */
function ProgramPreview({ job, skip }: { job: JobDetail; skip: number[] }) {
  const text = useQuery(partProgramTextQuery(job.id, job.partProgram?.sha256 ?? null));
  const preview = useMemo(() => {
    if (!text.data) return null;
    const read = readPartProgram(text.data, job.unit);
    const used = new Set(job.stationsUsed);
    return read.ok ? tablePreview(read.program, job.stationList.filter((s) => used.has(s.number))) : null;
  }, [text.data, job.unit, job.stationList, job.stationsUsed]);
  if (text.error) return <ErrorText error={text.error} />;
  if (!preview?.bounds) return <p className="text-slate-700">{text.isPending ? 'Loading the preview…' : 'Nothing to preview.'}</p>;
  const b = preview.bounds;
  const pad = Math.max(b.maxX - b.minX, b.maxY - b.minY) * 0.07 || 1;
  const w = b.maxX - b.minX + 2 * pad;
  const h = b.maxY - b.minY + 2 * pad;
  const stroke = Math.max(w, h) / 600;
  return (
    <figure className="flex flex-col gap-2 rounded border border-slate-300 bg-white p-2">
      {/* Machine axes seen from above (ISO 841): +X right, +Y away from the operator, so Y is flipped for the screen. */}
      <svg role="img" aria-label={`Tool path at ${preview.stations.length} stations`} viewBox={`${b.minX - pad} ${-b.maxY - pad} ${w} ${h}`} className="h-auto max-h-[32rem] w-full">
        <g transform="scale(1,-1)">
          {preview.stations.map((s) => {
            const off = skip.includes(s.number);
            return (
              <g key={s.number} opacity={off ? 0.2 : 1} className={off ? 'text-slate-400' : 'text-accent-700'}>
                {s.paths.map((path, i) => <polyline key={i} fill="none" stroke="currentColor" strokeWidth={stroke} points={path.map((q) => `${q.x},${q.y}`).join(' ')} />)}
                {s.holes.map((q, i) => <circle key={`h${i}`} cx={q.x} cy={q.y} r={stroke * 3} fill="none" stroke="currentColor" strokeWidth={stroke} />)}
                <path d={`M${s.at.x - stroke * 6},${s.at.y}H${s.at.x + stroke * 6}M${s.at.x},${s.at.y - stroke * 6}V${s.at.y + stroke * 6}`} stroke="#0f172a" strokeWidth={stroke} />
              </g>
            );
          })}
        </g>
        {preview.stations.map((s) => (
          <text key={`n${s.number}`} x={s.at.x + stroke * 8} y={-s.at.y - stroke * 8} fontSize={stroke * 14} className="fill-slate-900 font-mono">{s.number}</text>
        ))}
      </svg>
      <figcaption className="text-sm text-slate-700">Cutting moves and holes of every station from the shared work offset (crosses: station datums). Skipped stations are faint. A sketch for checking, not a simulation.</figcaption>
    </figure>
  );
}
