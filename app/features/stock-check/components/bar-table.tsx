import { useEffect, useRef, useState, type ClipboardEvent, type KeyboardEvent } from 'react';
import { Plus, Trash2 } from 'lucide-react';
import type { Unit } from '../../../../shared/schemas/common';
import { Button } from '../../../components/ui/button';
import { inputClass } from '../../../components/ui/field';
import { BAR_FIELDS, BAR_FIELD_LABEL, type BarField, type TableProblem } from '../bar-cells';
import { makeBarRow, nextBarId, pasteIntoTable, type BarRow } from '../bar-rows';
import { DRAFT_ID_MAX, DRAFT_SIZE_MAX } from '../../../../shared/schemas/bars-draft';

// The rows themselves are pure (bar-rows.ts); the screens that hold a table import them from here too.
export { firstBarRows, makeBarRow, nextBarId, tableIdRows, withPastedRows, type BarRow } from '../bar-rows';

export const barCellId = (key: number, field: BarField) => `bar-${key}-${field}`;

/** A table of thousands of inputs is slow to type into; past this many rows the rest are checked but not shown. */
export const SHOWN_ROWS = 500;

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

/** Clipboard text that is more than one cell: a tab or a line break (a spreadsheet ends even one copied cell with one). */
const isCellGrid = (text: string) => /[\t\r\n]/.test(text);

const HEADER: Readonly<Record<BarField, string>> = { id: 'Bar id', width: 'Width', thickness: 'Thickness', cornerRadius: 'Corner radius' };

/**
 * The bars typed at the machine. Enter (or ↓) moves to the same column one row down, Shift+Enter
 * (or ↑) one row up; Enter on the last row adds a row. A cell reached by the keyboard is
 * selected, so typing replaces it. Cells copied from a spreadsheet and pasted into any cell fill
 * the table from there on (bar-rows.ts). On a phone each row stacks into a card of labelled fields.
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
  const [pasteNote, setPasteNote] = useState<{ ok: boolean; text: string } | null>(null);
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

  const onPaste = (e: ClipboardEvent<HTMLInputElement>, index: number, field: BarField) => {
    const text = e.clipboardData.getData('text/plain');
    // One plain value goes into the box as any paste does.
    if (!isCellGrid(text)) return;
    e.preventDefault();
    const pasted = pasteIntoTable(rows, { index, field }, text, unit);
    setPasteNote({ ok: pasted.ok, text: pasted.message });
    if (pasted.ok) {
      // The problems marked on the cells pasted over no longer apply (only shown rows carry marks).
      for (let i = index; i < Math.min(pasted.rows.length, SHOWN_ROWS); i++) for (const f of BAR_FIELDS) onCellEdit?.(i, f);
      onRowsChange(pasted.rows);
    }
  };

  const unitNote = unit ? ` (${unit})` : '';
  return (
    <div className="flex flex-col gap-2">
      <div className="relative rounded border border-slate-300 bg-white sm:overflow-x-auto">
        <table className="block w-full border-collapse text-base sm:table">
          <caption className="sr-only">Measured bars: id, width, thickness and corner radius{unitNote}</caption>
          <thead className="hidden bg-slate-100 text-[15px] sm:table-header-group">
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
          <tbody className="block sm:table-row-group">
            {shown.map((row, index) => (
              <tr key={row.key} data-testid="bar-row" className="grid grid-cols-2 gap-x-2 gap-y-1 border-t border-slate-200 p-2 first:border-t-0 sm:table-row sm:p-0 sm:first:border-t">
                <td className="num order-1 self-center px-2 text-slate-600 max-sm:text-left max-sm:font-semibold">
                  <span className="sm:hidden">Row </span>{index + 1}
                </td>
                {BAR_FIELDS.map((f, c) => {
                  const problem = bad.get(`${index}:${f}`);
                  return (
                    <td key={f} className={`block sm:table-cell sm:px-1 sm:py-1 ${['order-3', 'order-4', 'order-5', 'order-6'][c]}`}>
                      <span aria-hidden className="block text-sm text-slate-700 sm:hidden">{HEADER[f]}{f !== 'id' && unit ? ` (${unit})` : ''}</span>
                      <input
                        id={barCellId(row.key, f)}
                        aria-label={`Row ${index + 1} ${BAR_FIELD_LABEL[f]}`}
                        aria-invalid={problem ? true : undefined}
                        title={problem}
                        inputMode={f === 'id' ? 'text' : 'decimal'}
                        autoComplete="off"
                        spellCheck={false}
                        enterKeyHint="next"
                        maxLength={f === 'id' ? DRAFT_ID_MAX : DRAFT_SIZE_MAX}
                        className={`${inputClass} ${f === 'id' ? 'font-mono' : 'num'} min-w-0 px-2 max-sm:min-h-11 sm:min-w-[5.5rem] ${problem ? 'bg-danger-50' : ''}`}
                        value={row.cells[f]}
                        onChange={(e) => setCell(index, f, e.target.value)}
                        onKeyDown={(e) => onKeyDown(e, index, f)}
                        onPaste={(e) => onPaste(e, index, f)}
                      />
                    </td>
                  );
                })}
                <td className="order-2 justify-self-end sm:px-1 sm:py-1">
                  <button type="button" onClick={() => removeRow(index)} aria-label={`Remove row ${index + 1}`} title={`Remove row ${index + 1}`}
                    className="inline-flex h-11 w-11 items-center justify-center rounded text-slate-700 hover:bg-slate-100 hover:text-slate-900 sm:h-10 sm:w-10">
                    <Trash2 aria-hidden className="h-5 w-5" />
                  </button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {pasteNote ? (
        <p role={pasteNote.ok ? 'status' : 'alert'} data-testid="cell-paste-note" className={pasteNote.ok ? 'text-slate-800' : 'font-semibold text-danger-700'}>{pasteNote.text}</p>
      ) : null}
      {rows.length > SHOWN_ROWS ? (
        <p className="text-slate-700">Showing rows 1–{SHOWN_ROWS} of {rows.length.toLocaleString('en-US')}; every row is checked. Edit long lists in the spreadsheet and paste again.</p>
      ) : null}
      <div className="flex flex-wrap items-center gap-2">
        <Button variant="secondary" onClick={() => addRow('width')} disabled={rows.length >= SHOWN_ROWS} className="max-sm:min-h-11">
          <Plus aria-hidden className="h-5 w-5" /> Add a row
        </Button>
        <span className="text-sm text-slate-600">Enter moves down a row; on the last row it adds one. Cells copied from a spreadsheet fill the table from the cell you paste into.</span>
      </div>
    </div>
  );

  function onKeyDown(e: KeyboardEvent<HTMLInputElement>, index: number, field: BarField) {
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
  }
}
