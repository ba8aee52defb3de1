import { useEffect, useRef, type KeyboardEvent } from 'react';
import { Plus, Trash2 } from 'lucide-react';
import type { Unit } from '../../../../shared/schemas/common';
import { Button } from '../../../components/ui/button';
import { inputClass } from '../../../components/ui/field';
import { BAR_FIELDS, BAR_FIELD_LABEL, isBlankRow, type BarCells, type BarField, type TableProblem } from '../bar-cells';
import type { PastedRow } from '../parse-bars';

export interface BarRow {
  /** Stable React key; never shown. */
  key: number;
  cells: BarCells;
  /** True while the id is the one the table filled in, so a row with no sizes counts as blank. */
  autoId: boolean;
}

/**
 * Focus a cell without letting it hide under the sticky "Check the bars" bar at the bottom of the
 * form: bring it to the middle when it is near an edge.
 */
function focusInView(el: HTMLInputElement) {
  el.focus({ preventScroll: true });
  el.select();
  const r = el.getBoundingClientRect();
  if (r.top < 80 || r.bottom > window.innerHeight - 120) el.scrollIntoView({ block: 'center' });
}

let keySeq = 0;
export function makeBarRow(cells: Partial<BarCells> = {}, autoId = false): BarRow {
  keySeq += 1;
  return { key: keySeq, cells: { id: '', width: '', thickness: '', cornerRadius: '', ...cells }, autoId };
}

/** The three numbered empty rows a new bar table starts with. */
export const firstBarRows = (): BarRow[] => [makeBarRow({ id: 'B1' }, true), makeBarRow({ id: 'B2' }, true), makeBarRow({ id: 'B3' }, true)];

/** Pasted rows into the table: they replace it, or follow its rows minus the untouched automatic ones. */
export function withPastedRows(rows: readonly BarRow[], pasted: readonly PastedRow[], mode: 'replace' | 'append'): BarRow[] {
  const fresh = pasted.map((p) => makeBarRow(p.cells));
  return mode === 'replace' ? fresh : [...rows.filter((r) => !(r.autoId && isBlankRow(r.cells, true))), ...fresh];
}

/** Each bar id in the table → its 1-based row, for "add below" to refuse ids already there. */
export function tableIdRows(rows: readonly BarRow[]): Map<string, number> {
  const ids = new Map<string, number>();
  rows.forEach((r, i) => {
    const id = r.cells.id.trim();
    if (id && !(r.autoId && isBlankRow(r.cells, true)) && !ids.has(id)) ids.set(id, i + 1);
  });
  return ids;
}

/** The next free id of the form B<n>, so typed rows need only their sizes. */
export function nextBarId(rows: readonly BarRow[]): string {
  let n = 0;
  for (const r of rows) {
    const m = /^B(\d+)$/i.exec(r.cells.id.trim());
    if (m) n = Math.max(n, Number(m[1]));
  }
  return `B${Math.max(n, 0) + 1}`;
}

export const barCellId = (key: number, field: BarField) => `bar-${key}-${field}`;

/** A table of thousands of inputs is slow to type into; past this many rows the rest are checked but not shown. */
export const SHOWN_ROWS = 500;

const HEADER: Readonly<Record<BarField, string>> = { id: 'Bar id', width: 'Width', thickness: 'Thickness', cornerRadius: 'Corner radius' };

/**
 * The bars typed at the machine. Enter (or ↓) moves to the same column one row down, Shift+Enter
 * (or ↑) one row up; Enter on the last row adds a row. A cell reached by the keyboard is
 * selected, so typing replaces it.
 */
export function BarTable({ rows, onRowsChange, unit, problems, onCellEdit }: {
  rows: BarRow[];
  onRowsChange: (rows: BarRow[]) => void;
  unit: Unit | null;
  problems: readonly TableProblem[];
  /** A cell was typed in: its problem, if any, no longer applies. */
  onCellEdit?: (index: number, field: BarField) => void;
}) {
  const pendingFocus = useRef<{ index: number; field: BarField } | null>(null);
  const bad = new Map(problems.map((p) => [`${p.index}:${p.field}`, p.message]));
  const shown = rows.slice(0, SHOWN_ROWS);

  useEffect(() => {
    const p = pendingFocus.current;
    if (!p) return;
    pendingFocus.current = null;
    const row = rows[p.index];
    const el = row ? (document.getElementById(barCellId(row.key, p.field)) as HTMLInputElement | null) : null;
    if (el) focusInView(el);
  }, [rows]);

  const focusCell = (index: number, field: BarField) => {
    const row = rows[index];
    const el = row ? (document.getElementById(barCellId(row.key, field)) as HTMLInputElement | null) : null;
    if (el) focusInView(el);
  };

  const setCell = (index: number, field: BarField, value: string) => {
    onCellEdit?.(index, field);
    onRowsChange(rows.map((r, i) => (i === index ? { ...r, cells: { ...r.cells, [field]: value }, autoId: field === 'id' ? false : r.autoId } : r)));
  };

  const addRow = (focusField: BarField | null) => {
    if (focusField) pendingFocus.current = { index: rows.length, field: focusField };
    onRowsChange([...rows, makeBarRow({ id: nextBarId(rows) }, true)]);
  };

  const removeRow = (index: number) => {
    const left = rows.filter((_, i) => i !== index);
    onRowsChange(left.length > 0 ? left : [makeBarRow({ id: 'B1' }, true)]);
  };

  const onKeyDown = (e: KeyboardEvent<HTMLInputElement>, index: number, field: BarField) => {
    if (e.nativeEvent.isComposing) return;
    const down = (e.key === 'Enter' && !e.shiftKey) || e.key === 'ArrowDown';
    const up = (e.key === 'Enter' && e.shiftKey) || e.key === 'ArrowUp';
    if (!down && !up) return;
    // Enter must not submit the surrounding form from inside the table.
    e.preventDefault();
    if (up) {
      if (index > 0) focusCell(index - 1, field);
    } else if (index + 1 < Math.min(rows.length, SHOWN_ROWS)) focusCell(index + 1, field);
    else if (e.key === 'Enter' && rows.length < SHOWN_ROWS) addRow(field === 'id' ? 'width' : field);
  };

  const unitNote = unit ? ` (${unit})` : '';
  return (
    <div className="flex flex-col gap-2">
      <div className="relative overflow-x-auto rounded border border-slate-300 bg-white">
        <table className="w-full border-collapse text-base">
          <caption className="sr-only">Measured bars: id, width, thickness and corner radius{unitNote}</caption>
          <thead className="bg-slate-100 text-[15px]">
            <tr>
              <th scope="col" className="w-8 px-2 py-2 text-right font-semibold text-slate-700">#</th>
              {BAR_FIELDS.map((f) => (
                <th key={f} scope="col" className={`px-1 py-2 font-semibold text-slate-700 ${f === 'id' ? 'text-left' : 'text-right'}`}>
                  {HEADER[f]}
                  {f !== 'id' && unit ? <span className="block font-normal text-slate-600">({unit})</span> : null}
                </th>
              ))}
              <th scope="col" className="w-11 px-1"><span className="sr-only">Remove</span></th>
            </tr>
          </thead>
          <tbody>
            {shown.map((row, index) => (
              <tr key={row.key} className="border-t border-slate-200">
                <td className="num px-2 text-slate-600">{index + 1}</td>
                {BAR_FIELDS.map((f) => {
                  const problem = bad.get(`${index}:${f}`);
                  return (
                    <td key={f} className="px-1 py-1">
                      <input
                        id={barCellId(row.key, f)}
                        aria-label={`Row ${index + 1} ${BAR_FIELD_LABEL[f]}`}
                        aria-invalid={problem ? true : undefined}
                        title={problem}
                        inputMode={f === 'id' ? 'text' : 'decimal'}
                        autoComplete="off"
                        spellCheck={false}
                        enterKeyHint="next"
                        className={`${inputClass} ${f === 'id' ? 'font-mono' : 'num'} min-w-[5.5rem] px-2 ${problem ? 'bg-danger-50' : ''}`}
                        value={row.cells[f]}
                        onChange={(e) => setCell(index, f, e.target.value)}
                        onKeyDown={(e) => onKeyDown(e, index, f)}
                      />
                    </td>
                  );
                })}
                <td className="px-1 py-1">
                  <button type="button" onClick={() => removeRow(index)} aria-label={`Remove row ${index + 1}`} title={`Remove row ${index + 1}`}
                    className="inline-flex h-10 w-10 items-center justify-center rounded text-slate-700 hover:bg-slate-100 hover:text-slate-900">
                    <Trash2 aria-hidden className="h-5 w-5" />
                  </button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {rows.length > SHOWN_ROWS ? (
        <p className="text-slate-700">Showing rows 1–{SHOWN_ROWS} of {rows.length.toLocaleString('en-US')}; every row is checked. Edit long lists in the spreadsheet and paste again.</p>
      ) : null}
      <div className="flex flex-wrap items-center gap-2">
        <Button variant="secondary" onClick={() => addRow('width')} disabled={rows.length >= SHOWN_ROWS}>
          <Plus aria-hidden className="h-5 w-5" /> Add a row
        </Button>
        <span className="text-sm text-slate-600">Enter moves down a row; on the last row it adds one.</span>
      </div>
    </div>
  );
}
