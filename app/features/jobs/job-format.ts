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
