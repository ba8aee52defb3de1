import type { StockCheckRequest, StockCheckResponse, StockCheckBarResult } from '../schemas/stock-check';
import { clampWindow } from './clamp-window';
import { displayDecimals, planRailSettings } from './rail-settings';

/**
 * Check measured bars against one clamp window and group the usable ones into the fewest jaw-rail
 * settings. Takes a request already parsed by StockCheckRequestSchema (routes safeParse first);
 * pure and O(n log n) in the number of bars.
 *
 * - `bars` keeps the request's order; `ok`/`reasons` are the verdict at the nominal setting (shift
 *   0), `shiftRange` every shift within the slot slop that accepts the bar (exact, see
 *   clamp-window.ts), `setting` the index of the rail setting that serves it.
 * - `settings` run from the most closed to the most open shift; each lists its bars in request
 *   order. A bar accepted at shift 0 may still be served by a non-zero setting: the plan minimizes
 *   the number of settings, not the distance from nominal.
 * - `unplaceable` lists, in request order, the bars no shift within the slot slop accepts.
 * Shifts and ranges are not rounded except a setting's shift (see rail-settings.ts).
 */
export function checkStock(request: StockCheckRequest): StockCheckResponse {
  const job = { carrier: request.carrier, clearance: request.clearance, minBite: request.minBite };
  const evaluate = clampWindow(request.nominalOpening, request.clamp, job);
  const windows = request.bars.map(evaluate);
  const plans = planRailSettings(
    windows.map((w) => w.shiftRange),
    displayDecimals(request.unit),
  );

  const settingOf = new Array<number | null>(windows.length).fill(null);
  plans.forEach((p, k) => {
    for (const i of p.members) settingOf[i] = k;
  });

  const bars: StockCheckBarResult[] = windows.map((w, i) => ({
    id: request.bars[i]!.id,
    ok: w.reasons.length === 0,
    reasons: w.reasons,
    shiftRange: w.shiftRange,
    d: w.d,
    topHeight: w.topHeight,
    bite: w.bite,
    setting: settingOf[i] ?? null,
  }));

  return {
    bars,
    settings: plans.map((p) => ({ shift: p.shift, bars: p.members.map((i) => request.bars[i]!.id) })),
    unplaceable: bars.filter((b) => b.shiftRange === null).map((b) => b.id),
  };
}
