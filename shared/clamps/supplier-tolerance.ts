import type { Unit } from '../schemas/common';
import { displayDecimals } from './rail-settings';

/**
 * Cross-section tolerance of extruded aluminum bar, standard tolerance column: Aluminum
 * Association, "Aluminum Standards and Data", table of cross-sectional dimension tolerances for
 * extruded wire, rod, bar and profiles (metal dimensions), as reproduced in suppliers' published
 * tolerance sheets. The table is in inches; a metric nominal is converted with 1 in = 25.4 mm
 * exactly (NIST SP 811, Appendix B) and the tolerance converted back. Bar bought to a metric
 * standard has its own tables, which this lookup does not hold.
 *
 * Rows are written to three decimals ("0.500–0.749"), so each row holds nominals from its first
 * value up to, not including, the next row's first value: 0.7495 in reads the 0.500–0.749 row.
 * A guard of 1e-9 in keeps a converted nominal (12.7 mm → 0.49999… in) in the row it names.
 *
 * Rows marked fromMemory are not from the table as given to this module's author but from memory
 * of it; they agreed with two supplier reproductions of the table read while writing it. Outside
 * the rows held here the lookup answers "no tolerance row for this size" rather than guess.
 */
export interface ToleranceRow {
  /** The row as the table prints it, in inches. */
  label: string;
  /** First nominal of the row, in. */
  fromIn: number;
  /** First nominal of the next row (not in this row), in. */
  toIn: number;
  /** Allowed deviation, plus and minus, in. */
  plusMinusIn: number;
  fromMemory: boolean;
}

export const AA_EXTRUDED_BAR_TOLERANCE_ROWS: readonly ToleranceRow[] = [
  { label: '0.250–0.499', fromIn: 0.25, toIn: 0.5, plusMinusIn: 0.008, fromMemory: true },
  { label: '0.500–0.749', fromIn: 0.5, toIn: 0.75, plusMinusIn: 0.009, fromMemory: false },
  { label: '0.750–0.999', fromIn: 0.75, toIn: 1.0, plusMinusIn: 0.01, fromMemory: false },
  { label: '1.000–1.499', fromIn: 1.0, toIn: 1.5, plusMinusIn: 0.012, fromMemory: false },
  { label: '1.500–1.999', fromIn: 1.5, toIn: 2.0, plusMinusIn: 0.014, fromMemory: true },
];

export const NO_TOLERANCE_ROW = 'no tolerance row for this size';

const MM_PER_IN = 25.4;
const ROW_GUARD_IN = 1e-9;
/** Slack on the tolerance comparison, in the caller's unit (see CLAMP_EPSILON in clamp-window.ts). */
const TOLERANCE_EPSILON = 1e-9;

export type ToleranceLookup =
  | { row: ToleranceRow; tolerance: number; unit: Unit; fromMemory: boolean }
  | { row: null; tolerance: null; unit: Unit; message: typeof NO_TOLERANCE_ROW };

/** The standard cross-section tolerance (±, in `unit`) for a nominal size, or no row. */
export function lookupBarTolerance(nominal: number, unit: Unit): ToleranceLookup {
  const nominalIn = unit === 'in' ? nominal : nominal / MM_PER_IN;
  const row = Number.isFinite(nominalIn)
    ? AA_EXTRUDED_BAR_TOLERANCE_ROWS.find((r) => nominalIn >= r.fromIn - ROW_GUARD_IN && nominalIn < r.toIn - ROW_GUARD_IN)
    : undefined;
  if (!row) return { row: null, tolerance: null, unit, message: NO_TOLERANCE_ROW };
  return { row, tolerance: unit === 'in' ? row.plusMinusIn : row.plusMinusIn * MM_PER_IN, unit, fromMemory: row.fromMemory };
}

export interface SupplierToleranceCheck {
  nominal: number;
  measured: number;
  unit: Unit;
  /** measured − nominal. */
  deviation: number;
  /** ± allowed, or null when no row holds the nominal. */
  tolerance: number | null;
  /** True when the bar is off nominal by more than the tolerance (a matter for the supplier); null without a row. */
  outside: boolean | null;
  fromMemory: boolean;
  message: string;
}

/**
 * Flag a measured cross-section size (width or thickness) that is off its nominal by more than the
 * standard tolerance. This is a supplier matter, separate from whether the clamp can hold the bar.
 */
export function checkSupplierTolerance(nominal: number, measured: number, unit: Unit): SupplierToleranceCheck {
  const deviation = measured - nominal;
  const found = lookupBarTolerance(nominal, unit);
  const dp = displayDecimals(unit);
  const f = (x: number) => `${x.toFixed(dp)} ${unit}`;
  const offBy =
    deviation === 0
      ? `${f(measured)} is on its ${f(nominal)} nominal`
      : `${f(measured)} is ${f(Math.abs(deviation))} ${deviation > 0 ? 'over' : 'under'} its ${f(nominal)} nominal`;
  if (found.row === null) {
    return { nominal, measured, unit, deviation, tolerance: null, outside: null, fromMemory: false, message: `${offBy}; ${NO_TOLERANCE_ROW}.` };
  }
  const outside = Math.abs(deviation) > found.tolerance + TOLERANCE_EPSILON;
  // A tolerance in mm needs four decimals to read 0.3048 rather than 0.305.
  const tol = `±${found.tolerance.toFixed(unit === 'in' ? 3 : 4)} ${unit}`;
  const rowText = `the standard tolerance for ${found.row.label} in`;
  const memo = found.fromMemory ? ' (tolerance row from memory: confirm against the current Aluminum Standards and Data)' : '';
  const message = outside
    ? `${offBy}, outside ${tol}, ${rowText} — a matter for the supplier${memo}.`
    : `${offBy}, within ${tol}, ${rowText}${memo}.`;
  return { nominal, measured, unit, deviation, tolerance: found.tolerance, outside, fromMemory: found.fromMemory, message };
}
