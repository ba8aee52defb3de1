import type { Unit } from '../schemas/common';
import type { StockCheckRequest, StockCheckResponse, StockCheckBarResult } from '../schemas/stock-check';
import { formatLength } from '../units/units';
import { clampWindow } from './clamp-window';
import { displayDecimals, planRailSettings, roomAt } from './rail-settings';

/** How closely a rail is set when the request does not say: a few thousandths (common practice, from memory). */
export const DEFAULT_SETTING_ACCURACY: Readonly<Record<Unit, number>> = { in: 0.002, mm: 0.05 };

/**
 * Check measured bars against one clamp window and group the usable ones into the fewest jaw-rail
 * settings, leaving the most room. Takes a request already parsed by StockCheckRequestSchema
 * (routes safeParse first); pure and O(n log n) in the number of bars.
 *
 * - `bars` keeps the request's order; `ok`/`reasons` are the verdict at the nominal setting (shift
 *   0), `shiftRange` every shift within the slot slop that accepts the bar (exact, see
 *   clamp-window.ts), `settableRange` that range narrowed by the setting accuracy on each side
 *   (a rail set within the accuracy of any shift in it still holds the bar), `setting` the index of
 *   the rail setting that serves it and `room` how far beyond the accuracy that setting may be off.
 * - `settings` run from the most closed to the most open shift; each gives the target opening
 *   (nominal + shift), its ± room (the least of its bars'), and its bars in request order. A bar
 *   accepted at shift 0 may still be served by a non-zero setting: the plan minimizes the number of
 *   settings first, then leaves the most room.
 * - `unplaceable` lists, in request order, the bars no setting holds once the accuracy is allowed.
 */
export function checkStock(request: StockCheckRequest): StockCheckResponse {
  const job = { carrier: request.carrier, clearance: request.clearance, minBite: request.minBite };
  const accuracy = request.settingAccuracy ?? DEFAULT_SETTING_ACCURACY[request.unit];
  const evaluate = clampWindow(request.nominalOpening, request.clamp, job);
  const windows = request.bars.map(evaluate);
  const settable = windows.map((w): [number, number] | null =>
    w.shiftRange && w.shiftRange[1] - w.shiftRange[0] >= 2 * accuracy ? [w.shiftRange[0] + accuracy, w.shiftRange[1] - accuracy] : null);
  const plans = planRailSettings(settable, displayDecimals(request.unit));

  const settingOf = new Array<number | null>(windows.length).fill(null);
  plans.forEach((p, k) => {
    for (const i of p.members) settingOf[i] = k;
  });

  const bars: StockCheckBarResult[] = windows.map((w, i) => {
    const k = settingOf[i] ?? null;
    return {
      id: request.bars[i]!.id,
      ok: w.reasons.length === 0,
      reasons: w.reasons,
      shiftRange: w.shiftRange,
      d: w.d,
      topHeight: w.topHeight,
      bite: w.bite,
      setting: k,
      settableRange: settable[i] ?? null,
      room: k === null ? null : roomAt(plans[k]!.shift, settable[i]!),
    };
  });

  return {
    bars,
    settings: plans.map((p) => ({
      shift: p.shift,
      bars: p.members.map((i) => request.bars[i]!.id),
      targetOpening: request.nominalOpening + p.shift,
      room: Math.min(...p.members.map((i) => roomAt(p.shift, settable[i]!))),
    })),
    unplaceable: bars.filter((b) => b.setting === null).map((b) => b.id),
    settingAccuracy: accuracy,
    warnings: fixedTopWarnings(request),
  };
}

/** A fixed jaw or stop that stands above the carrier less the clearance is in the tool's path as much as a clamp top. */
function fixedTopWarnings(request: StockCheckRequest): StockCheckResponse['warnings'] {
  if (request.fixedTop === undefined) return [];
  const limit = request.carrier - request.clearance;
  if (request.fixedTop <= limit) return [];
  const len = (v: number) => formatLength(v, request.unit);
  return [{
    code: 'fixed-top-above-carrier',
    message: `The fixed jaw's top, ${len(request.fixedTop)} above the seat, stands above the carrier less the clearance (${len(request.carrier)} − ${len(request.clearance)} = ${len(limit)}): a tool cutting down to the carrier meets it — collision risk; leave a thicker carrier or a lower jaw.`,
  }];
}
