/**
 * Unattended runtime of one load of the fixture: every station runs its cycle, plus the time
 * to load it (common practice: runtime = stations × cycle time + load time).
 */
export function runtimeMinutes(stations: number, cycleMinutes: number, loadMinutes = 0): number {
  assertTimes(cycleMinutes, loadMinutes);
  if (!Number.isInteger(stations) || stations < 0) throw new RangeError('Stations must be a whole number, zero or more.');
  return stations * cycleMinutes + loadMinutes;
}

/**
 * Stations to fill an unattended window: ceil((window − load) / cycle), at least 1. Rounded up
 * so the machine is still cutting when the window ends rather than standing idle before it;
 * the run overshoots by less than one cycle. The small epsilon keeps a window that divides
 * exactly (e.g. 182 / 13) from rounding up on floating-point noise.
 */
export function stationsForWindow(windowMinutes: number, cycleMinutes: number, loadMinutes = 0): number {
  assertTimes(cycleMinutes, loadMinutes);
  if (!Number.isFinite(windowMinutes) || windowMinutes < 0) throw new RangeError('The window must be zero minutes or more.');
  const exact = (windowMinutes - loadMinutes) / cycleMinutes;
  return Math.max(1, Math.ceil(exact - 1e-9));
}

function assertTimes(cycleMinutes: number, loadMinutes: number): void {
  if (!Number.isFinite(cycleMinutes) || cycleMinutes <= 0) throw new RangeError('Cycle time must be greater than zero minutes.');
  if (!Number.isFinite(loadMinutes) || loadMinutes < 0) throw new RangeError('Load time must be zero minutes or more.');
}
