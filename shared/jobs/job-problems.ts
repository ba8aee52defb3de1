import type { ClampJob } from '../clamps/clamp-window';
import { clampWindow } from '../clamps/clamp-window';
import { displayDecimals } from '../clamps/rail-settings';
import type { Point, Unit } from '../schemas/common';
import type { Outline } from '../schemas/geometry';
import type { Placement, Station, TemplateComponent } from '../schemas/template';
import { componentGeometryIn } from '../geometry/component-geometry';
import { boxOfPoints, footprintsOverlap, outlineBounds, outlineFootprint, overlappingBoxPairs, type Polygon } from '../geometry/outline';
import { applyTransform, cosSinDeg, placementTransform } from '../geometry/transform';
import { convert, formatLength } from '../units/units';
import type { JobRail } from './stations-used';

export interface JobProblem {
  code: 'width-not-held' | 'no-bar-passes' | 'part-overlap' | 'overlap-not-checked';
  message: string;
  /** Station numbers (from 1) the problem is about. */
  stations?: number[];
}

export const PART_ROTATIONS = [0, 90, 180, 270] as const;
export type PartRotation = (typeof PART_ROTATIONS)[number];

/** The part outline turned about its datum (0, 0) by a quarter turn; a proper rotation keeps each arc's bulge. */
export function turnOutline(outline: Outline, degrees: number): Outline {
  if (!degrees) return outline;
  const { cos, sin } = cosSinDeg(degrees);
  const t = { cos, sin, tx: 0, ty: 0, degrees };
  const map = (p: Point) => applyTransform(t, p);
  return {
    paths: outline.paths.map((p) => ({ ...p, points: p.points.map((v) => ({ ...v, ...map(v) })) })),
    circles: outline.circles.map((c) => ({ ...c, ...map(c) })),
  };
}

interface JobSettings { stock: { width: number; thickness: number }; carrier: number; clearance: number; minBite: number }

/**
 * Settings no bar could pass, checked once against the clamp models of the rails the job uses:
 * a bar of exactly the stock width and thickness with sharp corners (the best case a measured bar can
 * be) is put through each rail's clamp window (shared/clamps/clamp-window.ts). When no rail takes it,
 * one problem names the value that would work: the least carrier (rounded up to display precision),
 * else the largest minimum bite, found by bisection (both conditions are monotone: a thicker carrier
 * raises the face and the allowed clamp top, a smaller bite asks less), at most 60 steps each.
 */
export function settingsProblem(unit: Unit, rails: readonly JobRail[], job: JobSettings): JobProblem | null {
  const clamped = rails.filter((r) => r.clamp);
  if (!clamped.length) return null;
  const bar = { width: job.stock.width, thickness: job.stock.thickness, cornerRadius: 0 };
  const passes = (cj: ClampJob) => clamped.some((r) => clampWindow(r.nominalOpening, r.clamp!, cj)(bar).shiftRange !== null);
  const base = { carrier: job.carrier, clearance: job.clearance, minBite: job.minBite };
  if (passes(base)) return null;
  const len = (v: number) => formatLength(v, unit);
  const step = 10 ** -displayDecimals(unit);
  const names = clamped.map((r) => r.jawPlacement).join(', ');
  const head = `No bar of ${len(job.stock.width)} × ${len(job.stock.thickness)} could pass the clamps of ${names} with carrier ${len(job.carrier)}, tool clearance ${len(job.clearance)} and minimum bite ${len(job.minBite)}`;
  if (passes({ ...base, carrier: job.stock.thickness })) {
    let lo = job.carrier;
    let hi = job.stock.thickness;
    for (let i = 0; i < 60 && hi - lo > step * 1e-7; i++) {
      const mid = (lo + hi) / 2;
      if (passes({ ...base, carrier: mid })) hi = mid; else lo = mid;
    }
    let carrier = Math.ceil(hi / step - 1e-6) * step;
    if (!passes({ ...base, carrier }) || carrier > job.stock.thickness) carrier = hi;
    return { code: 'no-bar-passes', message: `${head}: a carrier of ${len(carrier)} would work.` };
  }
  if (passes({ ...base, minBite: 0 })) {
    let lo = 0;
    let hi = job.minBite;
    for (let i = 0; i < 60 && hi - lo > step * 1e-7; i++) {
      const mid = (lo + hi) / 2;
      if (passes({ ...base, minBite: mid })) lo = mid; else hi = mid;
    }
    let bite = Math.floor(lo / step + 1e-6) * step;
    if (!(bite > 0) || !passes({ ...base, minBite: bite })) bite = lo;
    return { code: 'no-bar-passes', message: `${head}: a minimum bite of ${len(bite)} would work.` };
  }
  if (passes({ ...base, clearance: 0, minBite: 0, carrier: job.stock.thickness })) {
    return { code: 'no-bar-passes', message: `${head}: a carrier of ${len(job.stock.thickness)} with no tool clearance would work.` };
  }
  return { code: 'no-bar-passes', message: `${head}, whatever the carrier: choose rails whose clamp model reaches this stock.` };
}

/** A stock width no station's jaw rail accepts: names the widths held and the one nearest the stock. */
export function widthProblem(unit: Unit, rails: readonly JobRail[], stockWidth: number, used: readonly number[]): JobProblem | null {
  if (used.length || !rails.length) return null;
  const len = (v: number) => formatLength(v, unit);
  const held = [...new Map(rails.map((r) => [r.nominalOpening, r])).values()];
  const nearest = held.reduce((a, b) => (Math.abs(b.nominalOpening - stockWidth) < Math.abs(a.nominalOpening - stockWidth) ? b : a));
  const windows = held.map((r) => `${len(r.nominalOpening)} (${len(r.nominalOpening - (r.clamp?.acceptBelow ?? 0))} to ${len(r.nominalOpening + (r.clamp?.acceptAbove ?? 0))})`).join(', ');
  return { code: 'width-not-held', message: `Stock width ${len(stockWidth)} is outside the accept window of every jaw rail, holding ${windows}: a stock width of ${len(nearest.nominalOpening)} would work.` };
}

/** At most this many footprint pairs are compared; past it the check stops and says so. */
export const MAX_OVERLAP_PAIRS = 20_000;
/** At most this many footprint vertices in the whole layout (parts and components). */
export const MAX_OVERLAP_VERTICES = 400_000;

interface Layout {
  unit: Unit;
  plate: { unit: Unit; pitch: number };
  placements: readonly Placement[];
  components: readonly TemplateComponent[];
}

/**
 * Parts that overlap another station's part or any component outline, with the part turned by
 * `rotation` about its datum at every used station. Footprints from shared/geometry/outline.ts;
 * candidate pairs from overlappingBoxPairs (a grid, not n²), then footprintsOverlap on each. Parts
 * touching a jaw face or a neighbour along an edge do not overlap (slack 0.0001 in or its mm value).
 * `origin` is the shared offset origin in plate coordinates (template unit): station coordinates are
 * measured from it.
 */
export function partOverlapProblems(layout: Layout, origin: Point, stations: readonly Station[], part: Outline, rotation: number): JobProblem[] {
  const u = layout.unit;
  const tol = convert(0.001, 'in', u);
  const slack = convert(0.0001, 'in', u);
  const turned = turnOutline(part, rotation);
  let local = outlineFootprint(turned, tol);
  // A part drawn as loose lines (no closed path) encloses nothing the footprint code can see: its bounding box stands in for it.
  if (!local.length && turned.paths.length) {
    const b = outlineBounds(turned);
    local = [[{ x: b.minX, y: b.minY }, { x: b.maxX, y: b.minY }, { x: b.maxX, y: b.maxY }, { x: b.minX, y: b.maxY }]];
  }
  if (!local.length || !stations.length) return [];
  const shapes: { station: number | null; label: string; fp: Polygon[] }[] = [];
  let vertices = 0;
  const localCount = local.reduce((n, p) => n + p.length, 0);
  for (const s of stations) {
    const { cos, sin } = cosSinDeg(s.c);
    const t = { cos, sin, tx: s.x, ty: s.y, degrees: s.c };
    shapes.push({ station: s.number, label: `station ${s.number}`, fp: local.map((poly) => poly.map((p) => applyTransform(t, p))) });
    vertices += localCount;
    if (vertices > MAX_OVERLAP_VERTICES) return [{ code: 'overlap-not-checked', message: `The part outline at ${stations.length} stations is too detailed to check for overlap (over ${MAX_OVERLAP_VERTICES} points): simplify the outline.` }];
  }
  const byCode = new Map(layout.components.map((c) => [c.code, c]));
  const pitch = convert(layout.plate.pitch, layout.plate.unit, u);
  for (const p of layout.placements) {
    const c = byCode.get(p.component);
    const outline = c ? componentGeometryIn(c, u).outline : null;
    if (!outline) continue;
    const fp = outlineFootprint(outline, tol);
    const t = placementTransform(p.hole, p.rotation, pitch);
    shapes.push({ station: null, label: `placement ${p.id} (${p.component})`, fp: fp.map((poly) => poly.map((q) => { const m = applyTransform(t, q); return { x: m.x - origin.x, y: m.y - origin.y }; })) });
    vertices += fp.reduce((n, poly) => n + poly.length, 0);
    if (vertices > MAX_OVERLAP_VERTICES) return [{ code: 'overlap-not-checked', message: `The layout is too detailed to check the part for overlap (over ${MAX_OVERLAP_VERTICES} points).` }];
  }
  const boxes = shapes.map((s) => boxOfPoints(s.fp.flat()));
  const pairs = overlappingBoxPairs(boxes, slack).filter(([i, j]) => shapes[i]!.station !== null || shapes[j]!.station !== null);
  const found: string[] = [];
  const named = new Set<number>();
  const checked = Math.min(pairs.length, MAX_OVERLAP_PAIRS);
  for (let k = 0; k < checked; k++) {
    const [i, j] = pairs[k]!;
    const [a, b] = shapes[i]!.station === null ? [shapes[j]!, shapes[i]!] : [shapes[i]!, shapes[j]!];
    if (!footprintsOverlap(a.fp, b.fp, slack)) continue;
    named.add(a.station!);
    if (b.station !== null) named.add(b.station);
    found.push(b.station !== null && b.station < a.station! ? `${b.label} and ${a.label}` : `${a.label} and ${b.label}`);
  }
  const problems: JobProblem[] = [];
  if (found.length) {
    found.sort((x, y) => x.localeCompare(y, 'en', { numeric: true }));
    const shown = found.slice(0, 12).join('; ') + (found.length > 12 ? `; and ${found.length - 12} more` : '');
    problems.push({ code: 'part-overlap', stations: [...named].sort((x, y) => x - y), message: `Turned ${rotation}°, the part overlaps at ${shown}: turn the part or choose a template that spaces the stations for it.` });
  }
  if (pairs.length > checked) problems.push({ code: 'overlap-not-checked', message: `Only the first ${checked} of ${pairs.length} close pairs were checked for overlap.` });
  return problems;
}
