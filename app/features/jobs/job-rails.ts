import type { ClampModel } from '../../../shared/schemas/catalog';
import type { Unit } from '../../../shared/schemas/common';
import type { JobDetail, JobStockCheck } from '../../../shared/schemas/job';
import type { StockCheckRequest, StockCheckResponse } from '../../../shared/schemas/stock-check';
import type { Pairing, TemplateComponent } from '../../../shared/schemas/template';
import { clampIn } from '../../../shared/clamps/clamp-units';
import { parseServerTime } from '../../lib/server-time';

/** One jaw rail of the pinned template: the placements that hold a width, grouped as the server checks them. */
export interface JobRail {
  jawPlacement: string;
  jawComponent: string;
  /** The width the rail holds at its nominal setting: the first pairing's, as the server takes it. */
  width: number;
  pairings: Pairing[];
  /** Station ids held by this rail, in numbering order. */
  stations: string[];
}

/** Pairings grouped by jaw rail placement, in the template's order. */
export function jobRails(pairings: readonly Pairing[]): JobRail[] {
  const byRail = new Map<string, JobRail>();
  for (const p of pairings) {
    const rail = byRail.get(p.jawPlacement);
    if (rail) {
      rail.pairings.push(p);
      rail.stations.push(...p.stations);
    } else byRail.set(p.jawPlacement, { jawPlacement: p.jawPlacement, jawComponent: p.jawComponent, width: p.width, pairings: [p], stations: [...p.stations] });
  }
  return [...byRail.values()];
}


/** The clamp model of a jaw rail as the pinned version carries it, in the job's unit; null when the rail has none. */
export function railClamp(components: readonly TemplateComponent[], jawComponent: string, jobUnit: Unit): ClampModel | null {
  const c = components.find((x) => x.code === jawComponent);
  return c?.clamp ? clampIn(c.clamp, c.unit, jobUnit) : null;
}

/** A stored check, shaped for the stock check's result views (its CheckRun). */
export interface JobCheckRun {
  key: string;
  rail: { code: string; name: string; unit: Unit; clamp: ClampModel };
  request: StockCheckRequest;
  response: StockCheckResponse;
  stock: { width?: number; thickness?: number };
}

/**
 * The server keeps the bars, the rail and the result of each check; the carrier, clearance and
 * minimum bite are the job's, so a check older than the job's last edit may have used other
 * values (see `checkedBeforeEdit`).
 */
export function jobCheckRun(job: JobDetail, check: JobStockCheck, rail: { code: string; name: string; clamp: ClampModel }): JobCheckRun {
  return {
    key: String(check.id),
    rail: { ...rail, unit: check.unit },
    request: {
      unit: check.unit, nominalOpening: check.nominalOpening, clamp: rail.clamp,
      carrier: job.carrier, clearance: job.clearance, minBite: job.minBite, bars: check.bars,
    },
    response: check.result,
    stock: { width: job.stock.width, thickness: job.stock.thickness },
  };
}

/** One rail's part of a stored check: its own entry in `rails`, or the top-level fields of a check made before checks covered several rails. */
export function railOfCheck(check: JobStockCheck, jawPlacement: string): { nominalOpening: number; result: StockCheckResponse } | null {
  const entry = check.rails.find((r) => r.jawPlacement === jawPlacement);
  if (entry) return entry;
  return check.rails.length === 0 && check.jawPlacement === jawPlacement ? { nominalOpening: check.nominalOpening, result: check.result } : null;
}

/** True when the job was saved after the check was made: its inputs may have changed since. */
export function checkedBeforeEdit(job: Pick<JobDetail, 'updatedAt' | 'unit'>, check: Pick<JobStockCheck, 'at' | 'unit'>): boolean {
  if (check.unit !== job.unit) return true;
  const at = parseServerTime(check.at);
  const edited = parseServerTime(job.updatedAt);
  return !!at && !!edited && edited.getTime() > at.getTime();
}
