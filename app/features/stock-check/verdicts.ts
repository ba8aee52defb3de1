import type { Unit } from '../../../shared/schemas/common';
import type { StockCheckReason } from '../../../shared/schemas/stock-check';
import { REASON_TEXT } from '../../../shared/clamps/reason-text';
import { DISPLAY_DECIMALS, formatNumber, roundForDisplay } from '../../../shared/units/units';

/** A bar's verdict at one rail setting: accepted, or one of the refusals. */
export type Verdict = 'accepted' | StockCheckReason;

/**
 * The short word the operator reads first; the sentence after it is reason-text.ts's (the one
 * wording the setup sheet uses too).
 */
export const VERDICT_WORD: Readonly<Record<Verdict, string>> = {
  accepted: 'accepted',
  'too-narrow': 'too narrow',
  'too-wide': 'too wide',
  'thinner-than-carrier': 'thinner than the carrier',
  'clamp-above-carrier': 'clamp above carrier — collision risk',
  'short-bite': 'short bite — pull-out risk',
};

export function verdictSentence(v: Verdict): string {
  return v === 'accepted' ? 'the clamp window accepts this bar' : REASON_TEXT[v];
}

/**
 * Safety hues after ANSI Z535.1 / ISO 3864: red for the collision (a tool into a clamp), orange for
 * the pull-out (a part thrown), yellow for a bar that will not fit, green only for "accepted".
 */
export type VerdictTone = 'safe' | 'caution' | 'warning' | 'danger';
export const VERDICT_TONE: Readonly<Record<Verdict, VerdictTone>> = {
  accepted: 'safe',
  'too-narrow': 'caution',
  'too-wide': 'caution',
  // The clamp top then stands above the bar the tool cuts: the same collision as a clamp above the carrier.
  'thinner-than-carrier': 'danger',
  'clamp-above-carrier': 'danger',
  'short-bite': 'warning',
};

/** Worst first: where one mark stands for a bar (the chart), it shows the gravest refusal. */
const SEVERITY: readonly Verdict[] = ['thinner-than-carrier', 'clamp-above-carrier', 'short-bite', 'too-wide', 'too-narrow', 'accepted'];

export function worstVerdict(reasons: readonly StockCheckReason[]): Verdict {
  return SEVERITY.find((v) => v !== 'accepted' && reasons.includes(v)) ?? 'accepted';
}

export function verdictsOf(reasons: readonly StockCheckReason[]): Verdict[] {
  return reasons.length === 0 ? ['accepted'] : [...reasons];
}

/** A signed length at display precision, "+0.0150 in", "-0.0150 in"; zero reads "0.0000 in". */
export function formatSigned(value: number, unit: Unit): string {
  const shown = formatNumber(value, unit);
  return `${Number(shown) > 0 ? '+' : ''}${shown} ${unit}`;
}

/**
 * A setting's shift. rail-settings.ts rounds it to the display step when the rounded value still
 * serves every bar of the setting, and leaves it exact otherwise; then two more decimals are
 * shown, so the operator never reads a rounded value that falls outside the setting's window.
 */
export function formatSettingShift(shift: number, unit: Unit): string {
  if (Math.abs(roundForDisplay(shift, unit) - shift) <= 1e-12) return formatSigned(shift, unit);
  return `${shift > 0 ? '+' : ''}${shift.toFixed(DISPLAY_DECIMALS[unit] + 2)} ${unit}`;
}

/** A shift range, "-0.0150 to +0.0150 in", or one value when both ends read the same. */
export function formatShiftRange(range: readonly [number, number], unit: Unit): string {
  const lo = formatSigned(range[0], unit);
  const hi = formatSigned(range[1], unit);
  if (lo === hi) return `${lo} only`;
  return `${lo.slice(0, -unit.length - 1)} to ${hi}`;
}
