// Pure helpers of the "Outline from a drawing" screen: no React, no DOM, so each can be tested.
import type { Point, Unit } from '../../../shared/schemas/common';
import type { Component, ComponentInput, Stop } from '../../../shared/schemas/catalog';
import type { NamingProblem } from '../../../shared/schemas/naming';
import type { Outline } from '../../../shared/schemas/geometry';
import { outlineBounds } from '../../../shared/geometry/outline';
import { GRID_TOLERANCE, convert, formatLength, formatNumber } from '../../../shared/units/units';
import { circleData, pathData } from '../../lib/outline-svg';
import { NamingRefusalSchema, type InspectedCircle, type InspectedLayer } from '../../../shared/schemas/dxf-inspection';

/** An outline whose paths and circles carry their layer (what the DXF reader hands back). */
export type LayeredOutline = Outline;

/** A length in the drawing's unit, said once when the file does not give one: "0.5000 (unit not known)". */
export function formatDrawingLength(value: number, unit: Unit | null): string {
  return unit ? formatLength(value, unit) : `${formatNumber(value, 'in')} (unit not known)`;
}

/** A table cell of the drawing's unit: with its unit, or the bare number (four decimals) under a header that says the unit is not known. */
export function formatDrawingCell(value: number, unit: Unit | null): string {
  return unit ? formatLength(value, unit) : formatNumber(value, 'in');
}

/** The drawing's width × height, e.g. "12.0000 in × 1.5000 in" or "6.0000 × 4.0000 (unit not known)". */
export function formatDrawingSize(width: number, height: number, unit: Unit | null): string {
  return unit ? `${formatLength(width, unit)} × ${formatLength(height, unit)}` : `${formatNumber(width, 'in')} × ${formatNumber(height, 'in')} (unit not known)`;
}

/** "not read: 3 HATCH, 1 DIMENSION", or null when every entity was read. */
export function unsupportedText(unsupported: readonly { type: string; count: number }[]): string | null {
  if (unsupported.length === 0) return null;
  return `not read: ${unsupported.map((u) => `${u.count} ${u.type}`).join(', ')}`;
}

/**
 * "Uploading… 42 %" while the file goes up, then what the server is doing once it is all sent.
 * Floors, so 100 % is only said when every byte is sent. Null progress: the browser has not
 * reported a size (yet), so no figure is made up.
 */
export function progressText(progress: number | null, after: string): string {
  if (progress === null) return 'Uploading…';
  return progress < 1 ? `Uploading… ${Math.floor(progress * 100)} %` : after;
}

// ---------- the drawing ----------

export interface PreviewView {
  /** The SVG viewBox: Y is flipped (ISO 841: +Y away from the operator, up on screen), so y = −maxY − margin. */
  viewBox: string;
  minX: number;
  minY: number;
  width: number;
  height: number;
}

/**
 * The box a drawing is fitted to: the outline's exact extents (arcs to their true extremes,
 * shared/geometry/outline) with `margin` of the larger side added all round. Drawn inside a
 * scale(1, −1) group, a point (x, y) shows at (x, −y), so the box's top edge is −maxY.
 * A drawing with no extent in one direction (a single straight line) gets the other's.
 */
export function previewView(outline: LayeredOutline, margin = 0.06): PreviewView | null {
  if (outline.paths.length === 0 && outline.circles.length === 0) return null;
  const b = outlineBounds(outline);
  if (![b.minX, b.minY, b.maxX, b.maxY].every(Number.isFinite)) return null;
  let w = b.maxX - b.minX;
  let h = b.maxY - b.minY;
  const side = Math.max(w, h) || 1;
  const m = side * margin;
  const minX = b.minX - m - (w === 0 ? side / 2 : 0);
  const maxY = b.maxY + m + (h === 0 ? side / 2 : 0);
  w = (w || side) + 2 * m;
  h = (h || side) + 2 * m;
  return { viewBox: `${minX} ${-maxY} ${w} ${h}`, minX, minY: -maxY, width: w, height: h };
}

/** A drawing point as it sits in the (unflipped) SVG user space: for labels, which must not be mirrored. */
export function toScreen(p: Point): Point {
  return { x: p.x, y: p.y === 0 ? 0 : -p.y };
}

export interface LayerPaths {
  layer: string;
  /** Closed paths: filled lightly, even-odd, so holes inside stay open. */
  closed: string;
  /** Open paths: stroked only, a fill would close them. */
  open: string;
  circles: string;
}

/** Path data per layer, in the order layers first appear; paths without a layer go on "0" (DXF default). */
export function pathsByLayer(outline: LayeredOutline): LayerPaths[] {
  const by = new Map<string, LayerPaths>();
  const of = (layer: string | undefined) => {
    const name = layer ?? '0';
    let e = by.get(name);
    if (!e) by.set(name, (e = { layer: name, closed: '', open: '', circles: '' }));
    return e;
  };
  for (const p of outline.paths) {
    const e = of(p.layer);
    if (p.closed) e.closed += pathData(p);
    else e.open += pathData(p);
  }
  for (const c of outline.circles) of(c.layer).circles += circleData(c);
  return [...by.values()];
}

/** The layers that carry outline geometry (paths or circles): only these are stored, so only these need conforming names. */
export function outlineLayers(outline: LayeredOutline): Set<string> {
  const s = new Set<string>();
  for (const p of outline.paths) s.add(p.layer ?? '0');
  for (const c of outline.circles) s.add(c.layer ?? '0');
  return s;
}

// ---------- circles: dowels and stops ----------

export interface CircleGroup {
  /** The diameter at display precision, e.g. "0.5000": circles within a display step are one size. */
  key: string;
  diameter: number;
  /** Indexes into the inspection's circles, left to right, then bottom to top. */
  indices: number[];
}

/**
 * Circles grouped by diameter at the display precision of the drawing's unit (4 decimals in
 * inches, 3 in mm; four when the unit is not known), smallest first. A drawing's dowel holes
 * are one size, so grouping offers them together.
 */
export function groupCircles(circles: readonly InspectedCircle[], unit: Unit | null): CircleGroup[] {
  const groups = new Map<string, CircleGroup>();
  circles.forEach((c, i) => {
    const key = formatNumber(2 * c.r, unit ?? 'in');
    let g = groups.get(key);
    if (!g) groups.set(key, (g = { key, diameter: Number(key), indices: [] }));
    g.indices.push(i);
  });
  const sorted = [...groups.values()].sort((a, b) => a.diameter - b.diameter);
  for (const g of sorted) g.indices.sort((a, b) => circles[a]!.x - circles[b]!.x || circles[a]!.y - circles[b]!.y || a - b);
  return sorted;
}

export interface PlateHole {
  code: string;
  unit: Unit;
  holeDiameter: number;
  pitch: number;
}

/** The plates whose dowel-hole diameter is this group's, compared at the drawing unit's display precision. */
export function platesOfDiameter(group: CircleGroup, unit: Unit | null, plates: readonly PlateHole[]): PlateHole[] {
  if (!unit) return [];
  return plates.filter((p) => formatNumber(convert(p.holeDiameter, p.unit, unit), unit) === group.key);
}

export interface CircleRoles {
  /** The group whose circles are dowel holes, or null. */
  dowelKey: string | null;
  dowels: number[];
  primary: number | null;
  stops: number[];
}

/**
 * The first guess: the group of a plate's dowel diameter (the largest such group when several
 * match) is the dowels, all ticked, the primary the leftmost (then lowest) of them — the first
 * dowel of a rail read left to right. Nothing is a stop until the user says so.
 */
export function defaultRoles(groups: readonly CircleGroup[], unit: Unit | null, plates: readonly PlateHole[]): CircleRoles {
  const matching = groups.filter((g) => platesOfDiameter(g, unit, plates).length > 0);
  const best = matching.sort((a, b) => b.indices.length - a.indices.length)[0];
  if (!best) return { dowelKey: null, dowels: [], primary: null, stops: [] };
  return { dowelKey: best.key, dowels: [...best.indices], primary: best.indices[0] ?? null, stops: [] };
}

/** A drawing point relative to the primary dowel, in the component's unit. */
export function localPoint(p: Point, primary: Point, fileUnit: Unit, componentUnit: Unit): Point {
  const x = convert(p.x - primary.x, fileUnit, componentUnit);
  const y = convert(p.y - primary.y, fileUnit, componentUnit);
  return { x: x === 0 ? 0 : x, y: y === 0 ? 0 : y };
}

/**
 * The component's dowels from the ticked circles: the primary first at exactly (0, 0) (the
 * catalog requires it, shared/schemas/catalog), the others in the order given, relative to it
 * and converted into the component's unit.
 */
export function dowelsFromCircles(circles: readonly InspectedCircle[], primary: number, ticked: readonly number[], fileUnit: Unit, componentUnit: Unit): Point[] {
  const p = circles[primary];
  if (!p) return [];
  return [{ x: 0, y: 0 }, ...ticked.filter((i) => i !== primary && circles[i]).map((i) => localPoint(circles[i]!, p, fileUnit, componentUnit))];
}

/** Stop positions at the ticked circles' centers, relative to the primary dowel, at angle 0. */
export function stopsFromCircles(circles: readonly InspectedCircle[], primary: number, ticked: readonly number[], fileUnit: Unit, componentUnit: Unit): Stop[] {
  const p = circles[primary];
  if (!p) return [];
  return ticked.filter((i) => circles[i]).map((i) => ({ ...localPoint(circles[i]!, p, fileUnit, componentUnit), angle: 0 }));
}

/**
 * How far a local dowel position sits from the nearest grid hole of a square grid of `pitch`
 * with a hole at the primary: the nearest hole is found by rounding each axis. Within
 * GRID_TOLERANCE it counts as on the grid (shared/units/units).
 */
export function gridOffset(local: Point, pitch: number, unit: Unit): { on: boolean; off: number; steps: Point } {
  const sx = Math.round(local.x / pitch);
  const sy = Math.round(local.y / pitch);
  const off = Math.hypot(local.x - sx * pitch, local.y - sy * pitch);
  return { on: off <= GRID_TOLERANCE[unit], off, steps: { x: sx === 0 ? 0 : sx, y: sy === 0 ? 0 : sy } };
}

// ---------- layer mapping ----------

/** The first mapping offered: a conforming layer keeps its name, any other gets the server's proposal, or nothing. */
export function initialMapping(layers: readonly InspectedLayer[]): Record<string, string> {
  return Object.fromEntries(layers.map((l) => [l.name, l.ok ? l.name : l.proposed ?? '']));
}

/** The name a file layer ends up with: what the user typed, or its own name when the field is empty. */
export function targetName(layer: string, mapping: Readonly<Record<string, string>>): string {
  const t = (mapping[layer] ?? '').trim();
  return t === '' ? layer : t;
}

/** The layerMap the outline route takes: only the layers whose name changes. */
export function layerMapFor(mapping: Readonly<Record<string, string>>): Record<string, string> {
  const out: Record<string, string> = {};
  for (const layer of Object.keys(mapping)) {
    const t = targetName(layer, mapping);
    if (t !== layer) out[layer] = t;
  }
  return out;
}

/**
 * A 400 'naming' refusal names the layers as they would have been stored (after the map); this
 * puts each one's problems back on the file layers that map to it, where the user typed.
 * Null when the details are not a naming refusal.
 */
export function namingProblemsByFileLayer(details: unknown, mapping: Readonly<Record<string, string>>, fileLayers: readonly string[]): Record<string, NamingProblem[]> | null {
  const parsed = NamingRefusalSchema.safeParse(details);
  if (!parsed.success) return null;
  const out: Record<string, NamingProblem[]> = {};
  for (const refused of parsed.data.layers) {
    for (const layer of fileLayers) {
      if (targetName(layer, mapping) === refused.layer) out[layer] = refused.problems;
    }
  }
  return out;
}

/**
 * The stored outline's circles that sit on the component's dowels (within GRID_TOLERANCE):
 * dowel n is marked "D<n>", the first being the primary at the origin.
 */
export function dowelCircles(outline: LayeredOutline, dowels: readonly Point[], unit: Unit): { index: number; dowel: number }[] {
  const out: { index: number; dowel: number }[] = [];
  dowels.forEach((d, n) => {
    let best = -1;
    let bestD = Infinity;
    outline.circles.forEach((c, i) => {
      const dist = Math.hypot(c.x - d.x, c.y - d.y);
      if (dist < bestD) [best, bestD] = [i, dist];
    });
    if (best >= 0 && bestD <= GRID_TOLERANCE[unit]) out.push({ index: best, dowel: n });
  });
  return out;
}

/** The component as the edit route takes it, with new dowels and stops and everything else as stored. */
export function componentWith(c: Component, dowels: Point[], stops: Stop[]): ComponentInput {
  return { code: c.code, kind: c.kind, name: c.name, unit: c.unit, dowels, stops, jawFaces: c.jawFaces, clamp: c.clamp, outline: c.outline, layer: c.layer, notes: c.notes };
}
