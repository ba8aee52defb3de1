// The HEADER variables Gridset reads: $INSUNITS (unit) and $ACADVER (version).
import type { Unit } from '../../../shared/schemas/common';

/** Chord error allowed when curves become polylines, per unit (common shop practice). */
export const CHORD_TOLERANCE: Readonly<Record<Unit, number>> = { in: 0.001, mm: 0.02 };

/** $INSUNITS codes (DXF Reference, HEADER section) other than 1 and 4, for the warning. */
const OTHER_UNITS: Record<number, string> = {
  2: 'feet',
  3: 'miles',
  5: 'centimeters',
  6: 'meters',
  7: 'kilometers',
  8: 'microinches',
  9: 'mils',
  10: 'yards',
  11: 'angstroms',
  12: 'nanometers',
  13: 'microns',
  14: 'decimeters',
  15: 'decameters',
  16: 'hectometers',
  17: 'gigameters',
  18: 'astronomical units',
  19: 'light years',
  20: 'parsecs',
  21: 'US survey feet',
};

export interface HeaderFacts {
  /** From $INSUNITS: 1 → in, 4 → mm; anything else → null: ask the user. */
  unit: Unit | null;
  insunits: number | null;
  version: string | null;
  /** A sentence for a unit Gridset does not work in, else null. */
  unitWarning: string | null;
}

/** The unit and version from dxf-parser's header object. */
export function readHeader(header: Record<string, unknown> | undefined): HeaderFacts {
  const h = header ?? {};
  const rawUnits = h['$INSUNITS'];
  const insunits = typeof rawUnits === 'number' && Number.isFinite(rawUnits) ? rawUnits : null;
  const unit: Unit | null = insunits === 1 ? 'in' : insunits === 4 ? 'mm' : null;
  const version = h['$ACADVER'];
  let unitWarning: string | null = null;
  if (insunits !== null && unit === null && insunits !== 0) {
    const name = OTHER_UNITS[insunits];
    unitWarning = `$INSUNITS is ${insunits}${name ? ` (${name})` : ''}, a unit Gridset does not work in; the numbers are kept as written and the unit is left for you to choose.`;
  }
  return { unit, insunits, version: typeof version === 'string' ? version : null, unitWarning };
}
