import type { ClampModel } from '../schemas/catalog';
import type { Unit } from '../schemas/common';
import { convert } from '../units/units';

/**
 * A clamp model's lengths from one unit into another (1 in = 25.4 mm exactly, shared/units/units.ts);
 * slopes are ratios and stay. The one conversion of a clamp model: the server's job checks and the
 * job screen's rails both call it.
 */
export function clampIn(clamp: ClampModel, from: Unit, to: Unit): ClampModel {
  const l = (v: number) => convert(v, from, to);
  return { ...clamp, acceptBelow: l(clamp.acceptBelow), acceptAbove: l(clamp.acceptAbove), topHeight: l(clamp.topHeight), gripLow: l(clamp.gripLow), gripHigh: l(clamp.gripHigh), slotSlop: l(clamp.slotSlop) };
}
