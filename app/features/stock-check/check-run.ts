import type { ClampModel } from '../../../shared/schemas/catalog';
import type { Unit } from '../../../shared/schemas/common';
import type { StockCheckRequest, StockCheckResponse } from '../../../shared/schemas/stock-check';
import { checkSupplierTolerance, lookupBarTolerance, type SupplierToleranceCheck } from '../../../shared/clamps/supplier-tolerance';

/** One finished check: what was sent, what came back, and what the results are labelled with. */
export interface CheckRun {
  /** The inputs as typed when the check ran; a different key now means the results are stale. */
  key: string;
  rail: { code: string; name: string; unit: Unit; clamp: ClampModel };
  request: StockCheckRequest;
  response: StockCheckResponse;
  /** Nominal stock sizes for the supplier flag, when entered. */
  stock: { width?: number; thickness?: number };
}

export interface SupplierFlags {
  /** Per bar id; null fields when that nominal was not entered. */
  byBar: Map<string, { width: SupplierToleranceCheck | null; thickness: SupplierToleranceCheck | null }>;
  /** Bars off a nominal by more than the standard tolerance, in request order. */
  outside: string[];
  /** Nominals entered that no tolerance row holds (so they were not checked). */
  noRow: { which: 'width' | 'thickness'; nominal: number }[];
  /** The tolerance rows used, e.g. "width ±0.012 in (1.000–1.499 in row)". */
  rules: string[];
  checked: boolean;
}

/** The supplier matter, kept apart from the clamp verdicts: bars off their nominal by more than the extrusion tolerance. */
export function supplierFlags(run: CheckRun): SupplierFlags {
  const { unit } = run.request;
  const { width, thickness } = run.stock;
  const byBar: SupplierFlags['byBar'] = new Map();
  const outside: string[] = [];
  for (const bar of run.request.bars) {
    const w = width === undefined ? null : checkSupplierTolerance(width, bar.width, unit);
    const t = thickness === undefined ? null : checkSupplierTolerance(thickness, bar.thickness, unit);
    byBar.set(bar.id, { width: w, thickness: t });
    if (w?.outside || t?.outside) outside.push(bar.id);
  }
  const noRow: SupplierFlags['noRow'] = [];
  const rules: string[] = [];
  for (const [which, nominal] of [['width', width], ['thickness', thickness]] as const) {
    if (nominal === undefined) continue;
    const found = lookupBarTolerance(nominal, unit);
    if (found.row === null) noRow.push({ which, nominal });
    else {
      // A tolerance in mm needs four decimals to read 0.3048 rather than 0.305 (as supplier-tolerance.ts words it).
      const memo = found.fromMemory ? ', row from memory: confirm against the current Aluminum Standards and Data' : '';
      rules.push(`${which} ±${found.tolerance.toFixed(unit === 'in' ? 3 : 4)} ${unit} (the ${found.row.label} in row${memo})`);
    }
  }
  return { byBar, outside, noRow, rules, checked: width !== undefined || thickness !== undefined };
}
