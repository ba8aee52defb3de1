import type { RailCheck } from '../schemas/job';
import type { LoadList, LoadListInput, LoadListTick } from '../schemas/load-list';

/**
 * The load list: for one cycle, one setting per jaw rail and one fitting bar per station on that
 * rail. Gridset proposes it from the latest stock check; the operator may change any bar, and the
 * list is kept with the job. The stations it leaves empty are the ones a whole-table program skips.
 */

/** A rail of the job: its placement and the numbers of the used stations it holds, in numbering order. */
export interface LoadRail {
  jawPlacement: string;
  stations: number[];
}

type Rails = readonly Pick<RailCheck, 'jawPlacement' | 'nominalOpening' | 'result'>[];

/** A rail's setting k as the operator sets it: target opening (nominal + shift) and its ± room. */
function settingFacts(checks: Rails, jawPlacement: string, k: number) {
  const check = checks.find((c) => c.jawPlacement === jawPlacement);
  const s = check?.result.settings[k];
  if (!check || !s) return null;
  return { bars: s.bars, shift: s.shift, targetOpening: s.targetOpening ?? check.nominalOpening + s.shift, room: s.room ?? 0 };
}


/**
 * Gridset's proposal: each rail at the setting that serves the most bars not yet loaded (ties: the
 * first), its stations filled in numbering order from that setting's bars, each bar used once in
 * the whole list; stations beyond the bars left empty.
 */
export function proposeLoadList(rails: readonly LoadRail[], checks: Rails): Pick<LoadList, 'rails' | 'emptyStations'> {
  const used = new Set<string>();
  const out: LoadList['rails'] = [];
  for (const rail of rails) {
    const check = checks.find((c) => c.jawPlacement === rail.jawPlacement);
    if (!check || !check.result.settings.length) {
      continue;
    }
    const free = (bars: readonly string[]) => bars.filter((b) => !used.has(b));
    let best = 0;
    check.result.settings.forEach((s, k) => {
      if (free(s.bars).length > free(check.result.settings[best]!.bars).length) best = k;
    });
    const setting = settingFacts(checks, rail.jawPlacement, best)!;
    const bars = free(setting.bars);
    const stations = rail.stations.map((station, i) => ({ station, bar: bars[i] ?? null }));
    for (const s of stations) if (s.bar) used.add(s.bar);
    out.push({ jawPlacement: rail.jawPlacement, setting: best, stations, targetOpening: setting.targetOpening, room: setting.room, shift: setting.shift });
  }
  return { rails: out, emptyStations: emptyOf(rails, out) };
}

/** Stations of the job's rails with no bar in the list (a rail the check did not cover is wholly empty). */
function emptyOf(rails: readonly LoadRail[], list: readonly { jawPlacement: string; stations: readonly { station: number; bar: string | null }[] }[]): number[] {
  const loaded = new Set(list.flatMap((r) => r.stations.filter((s) => s.bar).map((s) => s.station)));
  return rails.flatMap((r) => r.stations).filter((n) => !loaded.has(n)).sort((a, b) => a - b);
}

export type LoadListCheck = { ok: true; list: Pick<LoadList, 'rails' | 'emptyStations'> } | { ok: false; message: string };

/**
 * The operator's list, checked before it is kept: every rail one the job uses, every station one of
 * that rail's, every bar in the setting chosen for its rail (so the clamp holds it there) and used
 * once. The first fault is answered as a sentence that says what to change.
 */
export function checkLoadList(input: LoadListInput, rails: readonly LoadRail[], checks: Rails): LoadListCheck {
  const seenBars = new Map<string, number>();
  const out: LoadList['rails'] = [];
  const seenRails = new Set<string>();
  for (const r of input.rails) {
    const rail = rails.find((x) => x.jawPlacement === r.jawPlacement);
    if (!rail) return { ok: false, message: `Jaw rail ${r.jawPlacement} holds no station this job uses; load only ${rails.map((x) => x.jawPlacement).join(', ')}.` };
    if (seenRails.has(r.jawPlacement)) return { ok: false, message: `Jaw rail ${r.jawPlacement} is listed twice; list each rail once.` };
    seenRails.add(r.jawPlacement);
    const setting = settingFacts(checks, r.jawPlacement, r.setting);
    if (!setting) return { ok: false, message: `Jaw rail ${r.jawPlacement} has no setting ${r.setting + 1} in the latest stock check; check the bars again or choose another setting.` };
    const seenStations = new Set<number>();
    for (const s of r.stations) {
      if (!rail.stations.includes(s.station)) return { ok: false, message: `Station ${s.station} is not on jaw rail ${r.jawPlacement} (its stations: ${rail.stations.join(', ')}).` };
      if (seenStations.has(s.station)) return { ok: false, message: `Station ${s.station} is listed twice on jaw rail ${r.jawPlacement}; give it one bar.` };
      seenStations.add(s.station);
      if (s.bar === null) continue;
      if (!setting.bars.includes(s.bar)) {
        return { ok: false, message: `Bar ${s.bar} does not fit jaw rail ${r.jawPlacement} at setting ${r.setting + 1} (target opening ${setting.targetOpening.toFixed(4)}); choose one of ${setting.bars.join(', ') || 'no bar'}, or leave station ${s.station} empty.` };
      }
      const other = seenBars.get(s.bar);
      if (other !== undefined) return { ok: false, message: `Bar ${s.bar} is loaded at station ${other} already; a bar goes in one station.` };
      seenBars.set(s.bar, s.station);
    }
    out.push({ ...r, stations: rail.stations.map((n) => r.stations.find((s) => s.station === n) ?? { station: n, bar: null }), targetOpening: setting.targetOpening, room: setting.room, shift: setting.shift });
  }
  return { ok: true, list: { rails: out, emptyStations: emptyOf(rails, out) } };
}

export type TicksApplied = { ok: true; ticks: LoadListTick[]; changed: LoadListTick[] } | { ok: false; message: string };

/**
 * The operator's ticks laid over the ones kept: each station named must hold a bar in this list, be
 * named once, and be loaded before it is clamped (common practice: a clamp is tightened on a bar
 * that is in place). Answers every station with a tick, ascending, and the ticks that changed.
 */
export function applyTicks(list: Pick<LoadList, 'rails'>, kept: readonly LoadListTick[], input: readonly LoadListTick[]): TicksApplied {
  const barAt = new Map(list.rails.flatMap((r) => r.stations.map((s) => [s.station, s.bar] as const)));
  const next = new Map(kept.filter((t) => barAt.get(t.station)).map((t) => [t.station, t]));
  const seen = new Set<number>();
  const changed: LoadListTick[] = [];
  for (const t of input) {
    if (seen.has(t.station)) return { ok: false, message: `Station ${t.station} is ticked twice; send it once.` };
    seen.add(t.station);
    if (!barAt.has(t.station)) return { ok: false, message: `Station ${t.station} is not in this load list; tick only its stations (${[...barAt.keys()].sort((a, b) => a - b).join(', ') || 'none'}).` };
    if (!barAt.get(t.station)) return { ok: false, message: `Station ${t.station} is left empty this cycle; tick only stations with a bar.` };
    if (t.clamped && !t.loaded) return { ok: false, message: `Station ${t.station} is ticked clamped but not loaded; tick it loaded first.` };
    const before = next.get(t.station);
    if ((before?.loaded ?? false) !== t.loaded || (before?.clamped ?? false) !== t.clamped) changed.push(t);
    if (t.loaded || t.clamped) next.set(t.station, { station: t.station, loaded: t.loaded, clamped: t.clamped });
    else next.delete(t.station);
  }
  return { ok: true, ticks: [...next.values()].sort((a, b) => a.station - b.station), changed };
}
