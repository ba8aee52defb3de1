import { Ban, Truck } from 'lucide-react';
import type { Unit } from '../../../../shared/schemas/common';
import type { StockCheckReason } from '../../../../shared/schemas/stock-check';
import type { SupplierToleranceCheck } from '../../../../shared/clamps/supplier-tolerance';
import { formatLength } from '../../../../shared/units/units';
import { DataTable, columnHelperFor } from '../../../components/ui/data-table';
import { VERDICT_WORD, formatSettingShift, formatShiftRange, verdictsOf } from '../verdicts';
import { VerdictBadge } from './verdict-mark';

export interface BarResultRow {
  id: string;
  unit: Unit;
  width: number;
  thickness: number;
  cornerRadius: number;
  reasons: StockCheckReason[];
  shiftRange: [number, number] | null;
  slotSlop: number;
  /** 1-based setting number, or null when no setting takes the bar. */
  setting: number | null;
  settingShift: number | null;
  supplier: { width: SupplierToleranceCheck | null; thickness: SupplierToleranceCheck | null } | null;
}

const col = columnHelperFor<BarResultRow>();
const len = (c: { getValue: () => number; row: { original: BarResultRow } }) => formatLength(c.getValue(), c.row.original.unit);

function supplierWord(s: BarResultRow['supplier']): string {
  if (!s || (!s.width && !s.thickness)) return 'not checked';
  const checks = [s.width, s.thickness].filter((x): x is SupplierToleranceCheck => x !== null);
  if (checks.some((c) => c.outside)) return 'outside tolerance';
  if (checks.every((c) => c.outside === null)) return 'no tolerance row';
  return 'within tolerance';
}

const baseColumns = [
  col.accessor('id', { header: 'Bar', cell: (c) => <span className="font-mono font-semibold">{c.getValue()}</span> }),
  col.accessor('width', { header: 'Width', meta: { numeric: true }, cell: len }),
  col.accessor('thickness', { header: 'Thickness', meta: { numeric: true }, cell: len }),
  col.accessor('cornerRadius', { header: 'Corner radius', meta: { numeric: true }, cell: len }),
  col.accessor((r) => verdictsOf(r.reasons).map((v) => VERDICT_WORD[v]).join('; '), {
    id: 'verdict',
    header: 'Verdict at shift 0',
    cell: (c) => (
      <span className="flex sm:min-w-[13rem] flex-col items-start gap-1">
        {verdictsOf(c.row.original.reasons).map((v) => <VerdictBadge key={v} verdict={v} />)}
      </span>
    ),
  }),
  col.accessor((r) => r.shiftRange?.[0] ?? Number.POSITIVE_INFINITY, {
    id: 'shiftRange',
    header: 'Shifts that hold it',
    meta: { numeric: true },
    cell: (c) => {
      const r = c.row.original;
      return r.shiftRange ? formatShiftRange(r.shiftRange, r.unit) : <span className="font-sans text-slate-700">none within ±{formatLength(r.slotSlop, r.unit)}</span>;
    },
  }),
  col.accessor((r) => r.setting ?? Number.POSITIVE_INFINITY, {
    id: 'setting',
    header: 'Goes on',
    cell: (c) => {
      const r = c.row.original;
      return r.setting === null ? (
        <span className="inline-flex sm:min-w-[9rem] items-center gap-1.5 font-semibold text-slate-900"><Ban aria-hidden className="h-4 w-4 shrink-0" />cannot be used on this rail</span>
      ) : (
        <span className="whitespace-nowrap"><span className="font-semibold">Setting {r.setting}</span> <span className="font-mono">{formatSettingShift(r.settingShift!, r.unit)}</span></span>
      );
    },
  }),
];

const supplierColumn = col.accessor((r) => supplierWord(r.supplier), {
    id: 'supplier',
    header: 'Supplier tolerance',
    cell: (c) => {
      const word = c.getValue();
      const s = c.row.original.supplier;
      const title = s ? [s.width?.message, s.thickness?.message].filter(Boolean).join(' ') : undefined;
      return word === 'outside tolerance' ? (
        <span title={title} className="inline-flex sm:min-w-[8rem] items-center gap-1.5 font-semibold text-slate-900"><Truck aria-hidden className="h-4 w-4 shrink-0" />outside — supplier matter</span>
      ) : (
        <span title={title} className="whitespace-nowrap text-slate-700">{word}</span>
      );
    },
});

// Defined once: the supplier column shows only when nominal stock sizes were entered.
const columns = col.columns(baseColumns);
const columnsWithSupplier = col.columns([...baseColumns, supplierColumn]);

/** Every bar with its verdict at shift 0, the shifts that hold it, and the setting it goes on. */
export function BarResultsTable({ rows, filter, supplierChecked }: { rows: BarResultRow[]; filter: string; supplierChecked: boolean }) {
  return <DataTable caption="Stock check, bar by bar" columns={supplierChecked ? columnsWithSupplier : columns} data={rows} filter={filter} getRowId={(r) => r.id} empty="No bar matches the filter." />;
}
