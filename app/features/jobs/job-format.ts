import type { Unit } from '../../../shared/schemas/common';
import type { LoadList } from '../../../shared/schemas/load-list';
import { shiftInWords } from '../../../shared/clamps/shift-words';
import { formatLength } from '../../../shared/units/units';

/** Runtime as the shop reads it: whole minutes, and hours:minutes for the shift board ("270 min", "4:30"). */
export function formatMinutes(minutes: number): string {
  const rounded = Math.round(minutes * 10) / 10;
  return `${Number.isInteger(rounded) ? rounded : rounded.toFixed(1)} min`;
}

/** h:mm, rounded to the minute, e.g. 270 → "4:30", 59.6 → "1:00". */
export function formatHoursMinutes(minutes: number): string {
  const total = Math.round(minutes);
  return `${Math.floor(total / 60)}:${String(total % 60).padStart(2, '0')}`;
}

/** Station numbers as runs, e.g. [1,2,3,4,9,10] → "1–4, 9–10"; a run of one is the number alone. */
export function stationRuns(numbers: readonly number[]): string {
  const sorted = [...new Set(numbers)].sort((a, b) => a - b);
  const runs: string[] = [];
  for (let i = 0; i < sorted.length; ) {
    let j = i;
    while (j + 1 < sorted.length && sorted[j + 1] === sorted[j]! + 1) j++;
    runs.push(i === j ? String(sorted[i]) : `${sorted[i]}–${sorted[j]}`);
    i = j + 1;
  }
  return runs.join(', ');
}

/**
 * A rail setting's room said in words: how far the opening set may be from its target, either way,
 * with every bar of that setting still inside its clamp window (room: rail-settings.ts, half the
 * width of the bars' common window).
 */
export function roomInWords(room: string, zero: boolean): string {
  return zero
    ? 'no room either way: set the opening exactly to the target'
    : `the opening may be up to ${room} smaller or larger than the target and every bar of this setting still fits`;
}

/** A rail's target opening and its room, in the words the operator sets it by (screen and print). */
export function railSettingWords(r: LoadList['rails'][number], unit: Unit) {
  const room = formatLength(r.room, unit);
  return { target: formatLength(r.targetOpening, unit), room, shift: shiftInWords(r.shift, unit), roomWords: roomInWords(room, Number(room.split(' ')[0]) === 0) };
}
