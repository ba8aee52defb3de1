import { useEffect, useRef, useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { ScanLine } from 'lucide-react';
import type { ClampModel, Component } from '../../../../shared/schemas/catalog';
import type { Unit } from '../../../../shared/schemas/common';
import { StockCheckRequestSchema, type StockCheckRequestInput } from '../../../../shared/schemas/stock-check';
import { convert, formatNumber } from '../../../../shared/units/units';
import { Button } from '../../../components/ui/button';
import { ErrorText, Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { useStockCheck } from '../api';
import type { CheckRun } from '../check-run';
import { parseDecimal } from '../../../../shared/units/decimal';
import { barIssueProblems, barsToCheck, type BarField, type TableProblem } from '../bar-cells';
import type { PastedRow } from '../parse-bars';
import { SetupFormSchema, convertSetupText, defaultSetupText, type SetupFormText, type SetupFormValues, type SetupLengthField } from '../setup-form';
import { BarTable, barCellId, firstBarRows, tableIdRows, withPastedRows, type BarRow } from './bar-table';
import { BarsPaste } from './bars-paste';
import { BarProblems } from './bar-problems';
import { LengthField, SetupFields } from './setup-fields';
import { BarByBar, StockCheckResults } from './stock-check-results';

type Rail = Component & { clamp: ClampModel };
const hasClamp = (c: Component): c is Rail => c.clamp !== null;


function convertRows(rows: BarRow[], from: Unit, to: Unit): BarRow[] {
  const conv = (t: string) => {
    const v = parseDecimal(t);
    return v === null ? t : formatNumber(convert(v, from, to), to);
  };
  return rows.map((r) => ({ ...r, cells: { ...r.cells, width: conv(r.cells.width), thickness: conv(r.cells.thickness), cornerRadius: conv(r.cells.cornerRadius) } }));
}

/**
 * The stock check at the machine: choose the rail and the job's numbers, enter or paste the measured
 * bars, and read which bars go on which rail setting. `components` is the catalog (the route
 * fetches it); only those with a clamp model can be chosen.
 */
export function StockCheckScreen({ components }: { components: readonly Component[] }) {
  const rails = components.filter(hasClamp);
  const form = useForm<SetupFormText, unknown, SetupFormValues>({ resolver: zodResolver(SetupFormSchema), defaultValues: defaultSetupText('in') });
  const [rows, setRows] = useState<BarRow[]>(firstBarRows);
  const [barProblems, setBarProblems] = useState<TableProblem[]>([]);
  const [otherProblems, setOtherProblems] = useState<string[]>([]);
  const [converted, setConverted] = useState<string | null>(null);
  const [run, setRun] = useState<CheckRun | null>(null);
  const check = useStockCheck();
  const unitRef = useRef<Unit>('in');
  const resultsHeading = useRef<HTMLHeadingElement>(null);

  // eslint-disable-next-line react-hooks/incompatible-library -- the whole form re-renders the live check on every keystroke by design
  const values = form.watch();
  const rail = rails.find((r) => String(r.id) === values.railId) ?? null;
  const unit = rail?.unit ?? null;
  const inputsKey = JSON.stringify([values, rows.map((r) => r.cells)]);

  // After a check, bring its answer into view (and to a screen reader) where the form stacks above it.
  useEffect(() => {
    if (run) resultsHeading.current?.focus({ preventScroll: false });
  }, [run]);

  const onRailChange = (id: string) => {
    const next = rails.find((r) => String(r.id) === id);
    if (!next || next.unit === unitRef.current) return;
    const from = unitRef.current;
    unitRef.current = next.unit;
    const text = convertSetupText(form.getValues(), from, next.unit);
    for (const f of ['nominalOpening', 'carrier', 'clearance', 'minBite', 'settingAccuracy', 'stockWidth', 'stockThickness'] as const satisfies readonly SetupLengthField[]) {
      form.setValue(f, text[f]);
    }
    setRows((rs) => convertRows(rs, from, next.unit));
    setConverted(`${next.code} works in ${next.unit}: the numbers entered were converted from ${from} (1 in = 25.4 mm); check them.`);
  };

  const focusBarCell = (index: number, field: BarField) => {
    const row = rows[index];
    if (row) document.getElementById(barCellId(row.key, field))?.focus();
  };

  /** Read the table; on a problem, list it and put the cursor in the first bad cell. */
  const readBars = (forUnit: Unit | null, focus: boolean) => {
    const table = barsToCheck(rows, forUnit);
    if (!table.ok) {
      setBarProblems(table.problems);
      if (focus) focusBarCell(table.problems[0]!.index, table.problems[0]!.field);
      return null;
    }
    setBarProblems([]);
    return table;
  };

  const onValid = (setup: SetupFormValues) => {
    setOtherProblems([]);
    const chosen = rails.find((r) => r.id === setup.railId);
    if (!chosen) {
      form.setError('railId', { message: 'Choose a jaw rail from the list.' }, { shouldFocus: true });
      return;
    }
    const table = readBars(chosen.unit, true);
    if (!table) return;
    const input: StockCheckRequestInput = {
      unit: chosen.unit, nominalOpening: setup.nominalOpening, clamp: chosen.clamp,
      carrier: setup.carrier, clearance: setup.clearance, minBite: setup.minBite, settingAccuracy: setup.settingAccuracy, bars: table.bars,
    };
    // The same schema the route applies; the table and the form have checked each cell, so this is the last word on the whole.
    const parsed = StockCheckRequestSchema.safeParse(input);
    if (!parsed.success) {
      setOtherProblems(parsed.error.issues.map((i) => i.message));
      return;
    }
    const key = inputsKey;
    const request = parsed.data;
    check.mutate(request, {
      onSuccess: (response) => setRun({ key, rail: { code: chosen.code, name: chosen.name, unit: chosen.unit, clamp: chosen.clamp }, request, response, stock: { width: setup.stockWidth, thickness: setup.stockThickness } }),
      onError: (err) => {
        if (!(err instanceof ApiError)) return;
        const rowIssues = barIssueProblems(err.issues, table.rowOf);
        for (const issue of err.issues) {
          if (['nominalOpening', 'carrier', 'clearance', 'minBite', 'settingAccuracy'].includes(issue.path)) {
            form.setError(issue.path as SetupLengthField, { type: 'server', message: issue.message });
          }
        }
        if (rowIssues.length > 0) setBarProblems(rowIssues);
      },
    });
  };

  // Check the bar table at the same time as the form, so one press shows every problem.
  const onInvalid = () => {
    readBars(unit, false);
    setOtherProblems([]);
  };

  const applyPaste = (pasted: PastedRow[], mode: 'replace' | 'append') => {
    setRows((rs) => withPastedRows(rs, pasted, mode));
    setBarProblems([]);
  };

  const tableIds = tableIdRows(rows);

  return (
    <div className="flex flex-col gap-8">
      <div className="grid grid-cols-1 items-start gap-6 xl:grid-cols-[minmax(0,31rem)_minmax(0,1fr)]">
        <form noValidate onSubmit={form.handleSubmit(onValid, onInvalid)} className="flex flex-col gap-4" aria-label="Stock check inputs">
          {rails.length === 0 ? (
            <Notice tone="info" title="No component in the catalog has a clamp model">A lead adds the clamp model to a jaw rail under Components; then it can be chosen here.</Notice>
          ) : null}
          <SetupFields form={form} rails={rails} rail={rail} onRailChange={onRailChange} />
          {converted ? <p role="status" className="text-slate-800">{converted}</p> : null}

          <section aria-labelledby="bars-title" className="flex flex-col gap-4 rounded border border-slate-300 bg-white p-4">
            <h2 id="bars-title" className="text-lg font-semibold">2 · Measured bars</h2>
            <BarsPaste unit={unit} tableIds={tableIds} onApply={applyPaste} />
            <BarTable rows={rows} onRowsChange={setRows} unit={unit} problems={barProblems}
              onCellEdit={(index, field) => setBarProblems((ps) => (ps.some((p) => p.index === index && p.field === field) ? ps.filter((p) => !(p.index === index && p.field === field)) : ps))} />
            <BarProblems problems={barProblems} />
            <fieldset className="flex flex-col gap-2">
              <legend className="font-semibold">Nominal stock <span className="font-normal text-slate-600">— optional, for the supplier tolerance flag</span></legend>
              <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
                <LengthField form={form} field="stockWidth" unit={unit} hint="the width the bar was bought to" />
                <LengthField form={form} field="stockThickness" unit={unit} hint="the thickness it was bought to" />
              </div>
            </fieldset>
          </section>

          {/* Kept in view while the form scrolls: the one action of the screen. */}
          <div className="sticky bottom-0 flex flex-col gap-2 border-t border-slate-300 bg-slate-50 py-3">
            {otherProblems.map((m) => <ErrorText key={m} error={m} />)}
            <ErrorText error={check.error} />
            <Button type="submit" disabled={check.isPending} className="min-h-12 text-lg">
              <ScanLine aria-hidden className="h-5 w-5" />{check.isPending ? 'Checking…' : 'Check the bars'}
            </Button>
          </div>
        </form>

        <section aria-labelledby={run ? 'results-title' : 'results-empty-title'} className="flex flex-col gap-4">
          {run ? (
            <StockCheckResults ref={resultsHeading} run={run} stale={run.key !== inputsKey} />
          ) : (
            <div className="rounded border border-dashed border-slate-400 bg-white p-6 text-slate-800">
              <h2 id="results-empty-title" className="text-xl font-semibold">Which bars go on which setting</h2>
              <p className="mt-1">Choose the jaw rail, enter the job's carrier, clearance and minimum bite, type or paste the measured bars, and press <span className="font-semibold">Check the bars</span>. The sorting list, the bars that cannot be used, and a chart of every bar against each setting's window appear here.</p>
            </div>
          )}
        </section>
      </div>
      {run ? <BarByBar run={run} stale={run.key !== inputsKey} /> : null}
    </div>
  );
}
