import type { ClampModel } from '../schemas/catalog';
import type { Unit } from '../schemas/common';
import type { Pairing, Station, TemplateComponent } from '../schemas/template';
import { clampIn } from '../clamps/clamp-units';

/** One jaw rail of a template as a job sees it: the width it holds, its clamp model (template unit) and its stations. */
export interface JobRail {
  jawPlacement: string;
  jawComponent: string;
  /** The opening the rail holds at its nominal setting (the pairing's width), template unit. */
  nominalOpening: number;
  /** The rail's clamp model in the template's unit, or null when the component has none. */
  clamp: ClampModel | null;
  /** Station ids this rail clamps. */
  stations: string[];
}

/** The jaw rails of a template version, one per jaw placement (its first pairing's width), in pairing order. */
export function jobRails(v: { unit: Unit; pairings: readonly Pairing[]; components: readonly Pick<TemplateComponent, 'code' | 'unit' | 'clamp'>[] }): JobRail[] {
  const byCode = new Map(v.components.map((c) => [c.code, c]));
  const rails = new Map<string, JobRail>();
  for (const p of v.pairings) {
    const have = rails.get(p.jawPlacement);
    if (have) { have.stations.push(...p.stations); continue; }
    const c = byCode.get(p.jawComponent);
    rails.set(p.jawPlacement, { jawPlacement: p.jawPlacement, jawComponent: p.jawComponent, nominalOpening: p.width, clamp: c?.clamp ? clampIn(c.clamp, c.unit, v.unit) : null, stations: [...p.stations] });
  }
  return [...rails.values()];
}

/**
 * The stations a stock width can be held at: a station whose jaw rail's clamp accepts the width
 * around the width the station holds, nominal − acceptBelow ≤ width ≤ nominal + acceptAbove (the
 * clamp model's accept window, see shared/clamps/clamp-window.ts "fits"), with the same 1e-9 slack
 * as the clamp window so a width measured on a limit is accepted. A station no jaw rail clamps (no
 * width held: a vise or a stop plate) is located, not clamped by width, and is always used.
 * Returns station numbers in ascending order. O(stations + pairing stations).
 */
export function stationsUsed(stations: readonly Pick<Station, 'id' | 'number' | 'nominalWidth'>[], rails: readonly JobRail[], stockWidth: number, eps = 1e-9): number[] {
  const railOf = new Map<string, JobRail>();
  for (const r of rails) for (const s of r.stations) if (!railOf.has(s)) railOf.set(s, r);
  const used: number[] = [];
  for (const s of stations) {
    const rail = railOf.get(s.id);
    if (s.nominalWidth === null && !rail) { used.push(s.number); continue; }
    const nominal = s.nominalWidth ?? rail!.nominalOpening;
    const clamp = rail?.clamp;
    // A rail with no clamp model holds its nominal width only.
    const below = clamp ? clamp.acceptBelow : 0;
    const above = clamp ? clamp.acceptAbove : 0;
    if (stockWidth >= nominal - below - eps && stockWidth <= nominal + above + eps) used.push(s.number);
  }
  return used.sort((a, b) => a - b);
}

/** The jaw rails holding at least one of the used stations. */
export function railsUsed(rails: readonly JobRail[], stations: readonly Pick<Station, 'id' | 'number'>[], used: readonly number[]): JobRail[] {
  const numbers = new Set(used);
  const usedIds = new Set(stations.filter((s) => numbers.has(s.number)).map((s) => s.id));
  return rails.filter((r) => r.stations.some((id) => usedIds.has(id)));
}
