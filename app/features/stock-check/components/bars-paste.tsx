import { useId, useState } from 'react';
import { ClipboardPaste } from 'lucide-react';
import type { Unit } from '../../../../shared/schemas/common';
import { Button } from '../../../components/ui/button';
import { inputClass } from '../../../components/ui/field';
import { parseBarsPaste, type PastedRow, type PasteProblem } from '../parse-bars';
import { FilePicker } from '../../../components/ui/file-picker';
import { readBarsFile } from '../api';

const SEPARATOR_WORD = { tab: 'tab', semicolon: 'semicolon', comma: 'comma' } as const;
const SHOWN_PROBLEMS = 12;

/**
 * "Paste from a spreadsheet": rows of id, width, thickness, corner radius. The whole paste is read
 * first; any bad cell refuses all of it, naming its row and column, and the table is left as it was.
 */
export function BarsPaste({ unit, tableIds, onApply }: {
  unit: Unit | null;
  /** Ids already in the table (id → 1-based table row), for "add below". */
  tableIds: ReadonlyMap<string, number>;
  onApply: (rows: PastedRow[], mode: 'replace' | 'append') => void;
}) {
  const id = useId();
  const [text, setText] = useState('');
  const [problems, setProblems] = useState<PasteProblem[]>([]);
  const [done, setDone] = useState<string | null>(null);
  const [fileNote, setFileNote] = useState<string | null>(null);
  const onFile = async (file: File | undefined) => {
    setFileNote(null);
    if (!file) return;
    try {
      const read = await readBarsFile(file);
      setText(read.text);
      setFileNote(`Read ${file.name}${read.sheet ? ` (sheet "${read.sheet}")` : ''} into the box below: check it, then replace the table or add the rows.`);
    } catch (e) {
      setFileNote(e instanceof Error ? e.message : String(e));
    }
  };

  const apply = (mode: 'replace' | 'append') => {
    setDone(null);
    const read = parseBarsPaste(text, unit);
    if (!read.ok) {
      setProblems(read.problems);
      return;
    }
    if (mode === 'append') {
      const clashes: PasteProblem[] = read.rows
        .filter((r) => tableIds.has(r.bar.id))
        .map((r) => ({ row: r.row, column: null, field: 'id', message: `row ${r.row}: bar id "${r.bar.id}" is already on row ${tableIds.get(r.bar.id)} of the table — give each bar its own id, or replace the table` }));
      if (clashes.length > 0) {
        setProblems(clashes);
        return;
      }
    }
    setProblems([]);
    onApply(read.rows, mode);
    setText('');
    const n = read.rows.length;
    const notes = [
      `${SEPARATOR_WORD[read.separator]}-separated`,
      read.header ? 'header row read' : 'no header row (columns taken as id, width, thickness, corner radius)',
      ...(read.ignoredColumns.length > 0 ? [`ignored column${read.ignoredColumns.length === 1 ? '' : 's'} ${read.ignoredColumns.join(', ')}`] : []),
    ];
    setDone(`${mode === 'replace' ? 'Put' : 'Added'} ${n} bar${n === 1 ? '' : 's'} in the table: ${notes.join('; ')}.`);
  };

  return (
    <div className="flex flex-col gap-2">
      <FilePicker label="Or read a CSV or XLSX file of bars" accept=".csv,.xlsx,text/csv,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet" onFile={(f) => void onFile(f)} />
      {fileNote ? <p role="status" className="text-sm text-slate-800">{fileNote}</p> : null}
      <label htmlFor={id} className="text-sm font-semibold text-slate-700">Paste from a spreadsheet</label>
      <p id={`${id}-hint`} className="text-sm text-slate-600">
        Copy the cells — id, width, thickness, corner radius{unit ? `, in ${unit}` : ''} — and paste them here. Cells may be split by tabs, semicolons or commas; a header row is optional.
      </p>
      <textarea
        id={id}
        aria-describedby={`${id}-hint${problems.length ? ` ${id}-problems` : ''}`}
        aria-invalid={problems.length > 0 ? true : undefined}
        rows={5}
        spellCheck={false}
        className={`${inputClass} min-h-28 font-mono`}
        placeholder={'id\twidth\tthickness\tcorner radius\nB1\t1.002\t0.501\t0.020'}
        value={text}
        onChange={(e) => {
          setText(e.target.value);
          setDone(null);
        }}
      />
      {problems.length > 0 ? (
        <div id={`${id}-problems`} role="alert" className="rounded border-l-4 border-danger-700 bg-danger-50 p-3 text-danger-700">
          <p className="font-semibold">Nothing was put in the table: {problems.length === 1 ? 'one cell needs fixing' : `${problems.length} problems need fixing`}.</p>
          <ul className="mt-1 list-disc pl-5 text-slate-900">
            {problems.slice(0, SHOWN_PROBLEMS).map((p, i) => <li key={i}>{p.message}</li>)}
          </ul>
          {problems.length > SHOWN_PROBLEMS ? <p className="mt-1 text-slate-900">…and {problems.length - SHOWN_PROBLEMS} more.</p> : null}
        </div>
      ) : null}
      {done ? <p role="status" className="text-slate-800">{done}</p> : null}
      <div className="flex flex-wrap gap-2">
        <Button variant="secondary" onClick={() => apply('replace')} disabled={text.trim() === ''} className="max-sm:min-h-11">
          <ClipboardPaste aria-hidden className="h-5 w-5" /> Replace the table with these rows
        </Button>
        <Button variant="ghost" onClick={() => apply('append')} disabled={text.trim() === ''} className="max-sm:min-h-11">Add them below</Button>
      </div>
    </div>
  );
}
