import type { Unit } from '../schemas/common';
import type { Station, TemplateComponent } from '../schemas/template';
import { convert } from '../units/units';

/** Least clearance above the highest obstacle, whatever the job's tool clearance says (common practice). */
export const MIN_SAFE_CLEARANCE: Record<Unit, number> = { in: 0.1, mm: 2.5 };

/**
 * The lowest height above the shared offset's Z0 a tool may cross between stations at: above
 * the top of the stock at the highest station and above the tallest clamp top (its height above
 * the deck, at the highest station), plus the larger of the job's tool clearance and
 * MIN_SAFE_CLEARANCE. Advice from the entered data; the operator checks the real heights.
 */
export function minimumSafeZ(input: { unit: Unit; stations: readonly Station[]; components: readonly TemplateComponent[]; stockThickness: number; clearance: number }): number {
  const { unit, stations } = input;
  const topStation = stations.length ? Math.max(...stations.map((s) => s.z)) : 0;
  const clampTop = Math.max(0, ...input.components.map((c) => (c.clamp ? convert(c.clamp.topHeight, c.unit, unit) : 0)));
  const highest = topStation + Math.max(input.stockThickness, clampTop);
  return highest + Math.max(input.clearance, MIN_SAFE_CLEARANCE[unit]);
}
