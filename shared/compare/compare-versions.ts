import type { Unit } from '../schemas/common';
import type { Hole, Numbering, Placement, PlateRef, Problem, SharedOffset, Station, TemplateComponent, TemplateContent } from '../schemas/template';
import type {
  ChangedPlacement, ChangedStation, MovedPlacement, NamingFinding, RenumberedStation, SharedOffsetDiff, VersionDiff, WidthChangedStation,
} from '../schemas/diff';
import { evaluateTemplate, type TemplateEvaluation } from '../stations/evaluate-template';
import { canonicalJson } from '../interchange/canonical-json';
import { convert } from '../units/units';
import { keyedDifference } from './keyed-difference';
import { signedDegrees } from './signed-degrees';
import { summaryText } from './summary-text';

/**
 * Two translations closer than this (template unit, or degrees for C) are the same. Far below any
 * machine resolution, yet above the float noise of converting a value between in and mm.
 */
export const COMPARE_EPSILON = 1e-9;

export interface CompareOptions {
  /**
   * The naming-convention findings of a version. The convention check lives outside this
   * comparison; without it no naming problems are reported.
   */
  namingProblems?: (content: TemplateContent) => NamingFinding[];
  /** Tolerance for "the same translation"; COMPARE_EPSILON by default. */
  epsilon?: number;
  /** Evaluations the caller already holds; each must be evaluateTemplate of the matching content. */
  evaluations?: { from?: TemplateEvaluation; to?: TemplateEvaluation };
}

const PLATE_FIELDS = ['code', 'name', 'unit', 'pitch', 'columns', 'rows', 'holeDiameter', 'edgeMargin'] as const satisfies readonly (keyof PlateRef)[];

/** The first of each id, as the station engine uses it; later duplicates are a layout problem of their own. */
function firstBy<T>(items: readonly T[], key: (item: T) => string): Map<string, T> {
  const out = new Map<string, T>();
  for (const item of items) if (!out.has(key(item))) out.set(key(item), item);
  return out;
}

/** -0 reads as "moved backwards by nothing"; the answer says 0. */
const clean = (v: number) => (v === 0 ? 0 : v);

const copyPlacement = (p: Placement): Placement => ({
  id: p.id, component: p.component, hole: { col: p.hole.col, row: p.hole.row }, rotation: p.rotation, stopsInUse: [...(p.stopsInUse ?? [])],
});

const numberingOf = (c: TemplateContent): Numbering => c.numbering ?? { order: 'row-by-row' };

/** A hand list only counts while the order is by hand: a list kept under another order numbers nothing. */
function numberingDiffers(a: Numbering, b: Numbering): boolean {
  if (a.order !== b.order) return true;
  return a.order === 'by-hand' && canonicalJson(a.manual ?? []) !== canonicalJson(b.manual ?? []);
}

/**
 * Compares two versions of a template: what moved, by how much, and which station translations
 * that changes. Placements are matched by placement id and stations by station id, never by
 * number, so a renumbering shows as such and not as every station moving.
 *
 * Every length in the answer is in `to`'s template unit: `from`'s stations and origin are
 * converted first, so a version that only switched units compares as unmoved. Deltas are
 * `to` − `from`. Definitions quoted as they are (plates, shared offsets, placements removed) keep
 * their own units.
 */
export function compareVersions(from: TemplateContent, to: TemplateContent, options: CompareOptions = {}): VersionDiff {
  const eps = options.epsilon ?? COMPARE_EPSILON;
  const unit = to.unit;
  const len = (v: number) => convert(v, from.unit, unit);
  const differs = (a: number, b: number) => Math.abs(a - b) > eps;
  const evFrom = options.evaluations?.from ?? evaluateTemplate(from);
  const evTo = options.evaluations?.to ?? evaluateTemplate(to);

  const body: Omit<VersionDiff, 'summary'> = {
    unit,
    template: {
      name: { changed: from.name !== to.name, from: from.name, to: to.name },
      unit: { changed: from.unit !== to.unit, from: from.unit, to: to.unit },
      numbering: { changed: numberingDiffers(numberingOf(from), numberingOf(to)), from: numberingOf(from), to: numberingOf(to) },
    },
    plate: plateDiff(from.plate, to.plate),
    components: componentDiff(from.components, to.components),
    placements: placementDiff(from, to, unit, differs),
    stations: stationDiff(evFrom.stations.map((s) => inUnit(s, from.unit, unit)), evTo.stations, differs),
    sharedOffset: sharedOffsetDiff(from, to, evFrom.origin, evTo.origin, len, differs),
    // A station's problem is the same problem when only its number (and so its message) changed.
    problems: keyedDifference<Problem>(evFrom.problems, evTo.problems, (p) => JSON.stringify([p.code, p.placement ?? '', p.station ?? p.message])),
    naming: keyedDifference<NamingFinding>(options.namingProblems?.(from) ?? [], options.namingProblems?.(to) ?? [], (f) => f.key),
  };
  return { ...body, summary: summaryText(body) };
}

function plateDiff(from: PlateRef, to: PlateRef): VersionDiff['plate'] {
  const fields = PLATE_FIELDS.filter((k) => from[k] !== to[k]);
  return { changed: fields.length > 0, from, to, fields: [...fields] };
}

function componentDiff(from: readonly TemplateComponent[], to: readonly TemplateComponent[]): VersionDiff['components'] {
  const a = firstBy(from, (c) => c.code);
  const b = firstBy(to, (c) => c.code);
  return {
    added: [...b.keys()].filter((code) => !a.has(code)),
    removed: [...a.keys()].filter((code) => !b.has(code)),
    // Same code, other geometry: stops or dowels edited in place move stations with no placement moving.
    changed: [...b.keys()].filter((code) => a.has(code) && canonicalJson(a.get(code)) !== canonicalJson(b.get(code))),
  };
}

function placementDiff(from: TemplateContent, to: TemplateContent, unit: Unit, differs: (a: number, b: number) => boolean): VersionDiff['placements'] {
  const a = firstBy(from.placements, (p) => p.id);
  const b = firstBy(to.placements, (p) => p.id);
  const pf = from.plate;
  const pt = to.plate;
  const sameGrid = pf.unit === pt.unit && pf.pitch === pt.pitch;
  // On one grid the shift is exactly hole delta × pitch; across plates, the difference of the
  // two primary dowel positions, each from its own datum hole.
  const shift = (h0: Hole, h1: Hole, axis: 'col' | 'row') => clean(sameGrid
    ? convert((h1[axis] - h0[axis]) * pt.pitch, pt.unit, unit)
    : convert(h1[axis] * pt.pitch, pt.unit, unit) - convert(h0[axis] * pf.pitch, pf.unit, unit));

  const moved: MovedPlacement[] = [];
  const changed: ChangedPlacement[] = [];
  for (const [id, q] of b) {
    const p = a.get(id);
    if (!p) continue;
    const dx = shift(p.hole, q.hole, 'col');
    const dy = shift(p.hole, q.hole, 'row');
    // Across plates hole numbers are not comparable (hole (4, 6) at 1 in pitch is hole (2, 3) at
    // 2 in), so there the position decides.
    const relocated = sameGrid ? p.hole.col !== q.hole.col || p.hole.row !== q.hole.row : differs(dx, 0) || differs(dy, 0);
    if (relocated || p.rotation !== q.rotation) {
      moved.push({
        id, componentFrom: p.component, componentTo: q.component,
        from: { hole: { ...p.hole }, rotation: p.rotation }, to: { hole: { ...q.hole }, rotation: q.rotation },
        dx, dy, dRotation: signedDegrees(q.rotation - p.rotation),
      });
    }
    const stopsFrom = new Set(p.stopsInUse ?? []);
    const stopsTo = new Set(q.stopsInUse ?? []);
    const stopsAdded = [...stopsTo].filter((s) => !stopsFrom.has(s)).sort((x, y) => x - y);
    const stopsRemoved = [...stopsFrom].filter((s) => !stopsTo.has(s)).sort((x, y) => x - y);
    if (p.component !== q.component || stopsAdded.length || stopsRemoved.length) {
      changed.push({ id, componentFrom: p.component, componentTo: q.component, stopsAdded, stopsRemoved });
    }
  }
  return {
    added: [...b.values()].filter((q) => !a.has(q.id)).map(copyPlacement),
    removed: [...a.values()].filter((p) => !b.has(p.id)).map(copyPlacement),
    moved,
    changed,
  };
}

function inUnit(s: Station, from: Unit, to: Unit): Station {
  if (from === to) return s;
  return {
    ...s,
    x: convert(s.x, from, to),
    y: convert(s.y, from, to),
    z: convert(s.z, from, to),
    nominalWidth: s.nominalWidth === null ? null : convert(s.nominalWidth, from, to),
  };
}

/** `from` already in `to`'s unit. Lists follow `to`'s numbering, removed stations `from`'s. */
function stationDiff(from: readonly Station[], to: readonly Station[], differs: (a: number, b: number) => boolean): VersionDiff['stations'] {
  const a = new Map(from.map((s) => [s.id, s]));
  const b = new Map(to.map((s) => [s.id, s]));
  const changed: ChangedStation[] = [];
  const renumbered: RenumberedStation[] = [];
  const widthChanged: WidthChangedStation[] = [];
  let unchanged = 0;
  for (const t of to) {
    const f = a.get(t.id);
    if (!f) continue;
    const dc = signedDegrees(t.c - f.c);
    const moved = differs(f.x, t.x) || differs(f.y, t.y) || differs(f.z, t.z) || differs(dc, 0);
    if (moved) {
      changed.push({
        id: t.id, number: t.number, previousNumber: f.number, placement: t.placement, stop: t.stop,
        from: { x: f.x, y: f.y, z: f.z, c: f.c }, to: { x: t.x, y: t.y, z: t.z, c: t.c },
        dx: clean(t.x - f.x), dy: clean(t.y - f.y), dz: clean(t.z - f.z), dc,
      });
    } else if (f.number !== t.number) {
      renumbered.push({ id: t.id, from: f.number, to: t.number });
    } else {
      unchanged++;
    }
    const wf = f.nominalWidth;
    const wt = t.nominalWidth;
    if (wf === null ? wt !== null : wt === null || differs(wf, wt)) {
      widthChanged.push({ id: t.id, number: t.number, from: wf, to: wt });
    }
  }
  return {
    added: to.filter((s) => !a.has(s.id)).map((s) => ({ ...s })),
    removed: from.filter((s) => !b.has(s.id)).map((s) => ({ ...s })),
    changed,
    renumbered,
    widthChanged,
    unchanged,
  };
}

/** The same point written in another unit is the same definition; anything else is compared as written. */
function offsetDefinitionsDiffer(a: SharedOffset, b: SharedOffset, aUnit: Unit, bUnit: Unit, differs: (x: number, y: number) => boolean): boolean {
  if ((a.name ?? '') !== (b.name ?? '')) return true;
  if (a.kind === 'point' && b.kind === 'point') {
    return differs(convert(a.x, aUnit, bUnit), b.x) || differs(convert(a.y, aUnit, bUnit), b.y) || differs(convert(a.z ?? 0, aUnit, bUnit), b.z ?? 0);
  }
  return canonicalJson({ ...a, name: undefined }) !== canonicalJson({ ...b, name: undefined });
}

function sharedOffsetDiff(
  from: TemplateContent, to: TemplateContent,
  originFromRaw: TemplateEvaluation['origin'], originTo: TemplateEvaluation['origin'],
  len: (v: number) => number, differs: (a: number, b: number) => boolean,
): SharedOffsetDiff {
  const originFrom = { x: len(originFromRaw.x), y: len(originFromRaw.y), z: len(originFromRaw.z) };
  const moved = differs(originFrom.x, originTo.x) || differs(originFrom.y, originTo.y) || differs(originFrom.z, originTo.z);
  return {
    changed: moved || offsetDefinitionsDiffer(from.sharedOffset, to.sharedOffset, from.unit, to.unit, differs),
    moved,
    from: from.sharedOffset,
    to: to.sharedOffset,
    originFrom,
    originTo: { ...originTo },
    dx: clean(originTo.x - originFrom.x),
    dy: clean(originTo.y - originFrom.y),
    dz: clean(originTo.z - originFrom.z),
  };
}
