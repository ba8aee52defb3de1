import type { Unit } from '../schemas/common';
import { DISPLAY_DECIMALS, formatNumber, roundForDisplay } from '../units/units';

/**
 * A rail setting's shift said as the operator sets it. Sign convention of clamp-window.ts: the
 * opening becomes nominal + shift, so a positive shift moves the jaw rail away from the fixed jaw
 * (opens the jaw) and a negative one moves it closer. The size is shown at display precision when
 * that rounding still serves the setting (rail-settings.ts rounds the shift so), else with two more
 * decimals, so the words never name a value outside the setting's window.
 */
export function shiftSize(shift: number, unit: Unit): string {
  const size = Math.abs(shift);
  const text = Math.abs(roundForDisplay(shift, unit) - shift) <= 1e-12 ? formatNumber(size, unit) : size.toFixed(DISPLAY_DECIMALS[unit] + 2);
  return `${text} ${unit}`;
}

/** e.g. "set the jaw rail 0.0085 in closer to the fixed jaw (a smaller opening)". */
export function shiftInWords(shift: number, unit: Unit): string {
  const size = shiftSize(shift, unit);
  if (Number(size.split(' ')[0]) === 0) return 'leave the jaw rail at its nominal setting (no shift)';
  return shift < 0
    ? `set the jaw rail ${size} closer to the fixed jaw (a smaller opening)`
    : `set the jaw rail ${size} farther from the fixed jaw (a wider opening)`;
}
