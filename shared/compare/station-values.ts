import type { Unit } from '../schemas/common';
import type { StationValueChange, VersionDiff } from '../schemas/diff';
import { convert, formatLength, formatNumber } from '../units/units';
import { COMPARE_EPSILON } from './compare-versions';
import { signedDegrees } from './signed-degrees';

const ORDER: Record<StationValueChange['field'], number> = { x: 0, y: 1, z: 2, c: 3, width: 4 };

/**
 * Every station value a comparison changes, one line each, in station order: X, Y, Z and C of each
 * station whose translation moved (only the components that moved), and each width held that changed.
 */
export function stationValueChanges(stations: VersionDiff['stations'], epsilon = COMPARE_EPSILON): StationValueChange[] {
  const out: StationValueChange[] = [];
  const previous = new Map<string, number>();
  for (const s of stations.changed) {
    previous.set(s.id, s.previousNumber);
    for (const field of ['x', 'y', 'z'] as const) {
      if (Math.abs(s.to[field] - s.from[field]) > epsilon) out.push({ id: s.id, number: s.number, previousNumber: s.previousNumber, field, from: s.from[field], to: s.to[field] });
    }
    if (Math.abs(signedDegrees(s.to.c - s.from.c)) > epsilon) out.push({ id: s.id, number: s.number, previousNumber: s.previousNumber, field: 'c', from: s.from.c, to: s.to.c });
  }
  for (const w of stations.widthChanged) {
    out.push({ id: w.id, number: w.number, previousNumber: previous.get(w.id) ?? w.number, field: 'width', from: w.from, to: w.to });
  }
  return out.sort((a, b) => a.number - b.number || ORDER[a.field] - ORDER[b.field]);
}

const FIELD_WORDS: Record<StationValueChange['field'], string> = { x: 'X', y: 'Y', z: 'Z', c: 'C', width: 'width held' };

/** One value as the screen says it: a length with its unit in the display unit, C in degrees, "none" for no width. */
export function stationValueText(field: StationValueChange['field'], value: number | null, unit: Unit, displayUnit: Unit): string {
  if (value === null) return 'none';
  if (field === 'c') return `${formatNumber(value, 'mm')}°`;
  return formatLength(convert(value, unit, displayUnit), displayUnit);
}

/** "width held 1.2500 in → 1.5000 in at station 3" (station numbers of the later version; "(was 2)" when renumbered). */
export function stationValueLine(change: StationValueChange, unit: Unit, displayUnit: Unit): string {
  const at = change.previousNumber !== change.number ? `station ${change.number} (was ${change.previousNumber})` : `station ${change.number}`;
  return `${FIELD_WORDS[change.field]} ${stationValueText(change.field, change.from, unit, displayUnit)} → ${stationValueText(change.field, change.to, unit, displayUnit)} at ${at}`;
}
