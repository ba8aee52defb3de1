import type { Point, Unit } from '../schemas/common';
import type { Placement, Problem } from '../schemas/template';
import { formatLength } from '../units/units';
import { cosSinDeg, normalizeDegrees } from '../geometry/transform';
import type { Box, Polygon } from '../geometry/outline';
import { ANTIPARALLEL_TOLERANCE, lateralSpan } from './nominal-width';

/**
 * Whether a layout holds every part it says it holds: the checks that follow the station
 * engine's geometry. A part is pushed by a jaw rail's edge clamps against a fixed jaw (common
 * practice for clamp-rail fixturing), so every station on a rail needs a clamp facing its jaw
 * with nothing between them, and every jaw rail needs a jaw to push towards.
 */

/** Kinds whose stations are held by a jaw rail's clamps; a vise closes its own jaw and a dowel stop only locates. */
export const CLAMPED_KINDS: ReadonlySet<string> = new Set(['center-rail', 'short-rail']);

/**
 * A stop faces out of its jaw when the part's +Y axis (the station's angle + 90°) is the jaw
 * face's outward normal: the part's datum edge lies on the face and the part on the side the
 * normal points to. The demo rails' stops (angle 0) sit on faces whose normal is 90°.
 */
export function stopFacesOut(stopAngle: number, faceNormal: number, toleranceDeg = 1e-6): boolean {
  const d = normalizeDegrees(faceNormal - stopAngle - 90);
  return Math.min(d, 360 - d) <= toleranceDeg;
}

/**
 * The strip the clamps push parts across: from the fixed face at the stops to the clamp face,
 * `width` along the face's normal, shortened at both ends so the faces' own outlines do not
 * count, and as wide sideways as the stops (plus a thousandth of the pitch), so only an outline
 * that really lies between jaw and clamp does. One stop gives one station's strip; all the stops
 * one clamp faces give the strip of the whole pair, checked once.
 */
export function clampPath(stops: readonly Point[], normalDeg: number, width: number, pitch: number): Polygon {
  const { cos, sin } = cosSinDeg(normalDeg);
  const end = 1e-4 * pitch;
  const half = 5e-4 * pitch;
  const a = end;
  const b = Math.max(end, width - end);
  // Lateral coordinate on the tangent (−sin, cos), measured from the first stop.
  const o = stops[0]!;
  let lo = Infinity;
  let hi = -Infinity;
  for (const p of stops) {
    const t = -sin * (p.x - o.x) + cos * (p.y - o.y);
    if (t < lo) lo = t;
    if (t > hi) hi = t;
  }
  const at = (along: number, side: number) => ({ x: o.x + cos * along - sin * side, y: o.y + sin * along + cos * side });
  return [at(a, lo - half), at(b, lo - half), at(b, hi + half), at(a, hi + half)];
}

/** Extent of a box's corners along the tangent of a face whose normal points at `normalDeg`. */
export function lateralSpanOfBox(b: Box, normalDeg: number): { min: number; max: number } {
  return lateralSpan([{ x: b.minX, y: b.minY }, { x: b.maxX, y: b.minY }, { x: b.minX, y: b.maxY }, { x: b.maxX, y: b.maxY }], normalDeg);
}

export interface FacingClamp {
  x: number;
  y: number;
  normal: number;
  lateralMin: number;
  lateralMax: number;
}

export interface FacedJaw {
  x: number;
  y: number;
  normal: number;
  /** Extent of the fixed component, to ask whether the clamp reaches it sideways. */
  extent: Box;
}

/** Whether a clamp face looks back at a fixed jaw face that lies in front of it and within its reach sideways. */
export function clampFacesJaw(c: FacingClamp, f: FacedJaw, slack: number): boolean {
  const nc = cosSinDeg(c.normal);
  const nf = cosSinDeg(f.normal);
  if (Math.hypot(nc.cos + nf.cos, nc.sin + nf.sin) >= ANTIPARALLEL_TOLERANCE) return false;
  // The clamp lies on the side the fixed face's normal points to.
  if ((c.x - f.x) * nf.cos + (c.y - f.y) * nf.sin <= slack) return false;
  const span = lateralSpanOfBox(f.extent, c.normal);
  return span.max > c.lateralMin + slack && span.min < c.lateralMax - slack;
}

/** A numbered station as the holding checks need it (in numbering order). */
export interface HeldStation {
  id: string;
  placementId: string;
  componentCode: string;
  stop: number;
  /** On a rail held by clamps, with a fixed face to hold against. */
  clamped: boolean;
  match: { clamp: { placement: string }; width: number } | null;
  blockedBy?: string;
  facesOut: boolean;
  stopAngle: number;
  faceNormal: number | null;
}

export interface PlacedJawRail {
  placement: Placement;
  component: string;
  /** How far below its opening the clamp closes (plate unit); null without a clamp model. */
  clampCloses: number | null;
  faces: readonly FacingClamp[];
}

// Words and tags of a station with a problem; module-level so the per-station loop allocates nothing until one is found.
const stationWords = (d: HeldStation, i: number) => `Station ${i + 1} (placement ${d.placementId}, stop ${d.stop + 1})`;
const stationTags = (d: HeldStation) => ({ placement: d.placementId, stop: d.stop, station: d.id });

/**
 * Stations no clamp holds, stops that face into their jaw, jaw rails that push on nothing, and a
 * layout with no station: problems that block submit and release (not saving a draft in progress).
 * Lengths in the plate's unit `pu`; station and stop numbers counted from 1.
 */
export function holdingProblems(ordered: readonly HeldStation[], jawRails: readonly PlacedJawRail[], jaws: readonly FacedJaw[], slack: number, pu: Unit): Problem[] {
  const out: Problem[] = [];
  if (!ordered.length) out.push({ code: 'no-stations', message: 'The layout has no stations: place a rail or vise and tick the stops in use.' });
  const len = (v: number) => formatLength(v, pu);
  const rails = new Map(jawRails.map((r) => [r.placement.id, r]));
  const holding = new Set<string>();
  for (let i = 0; i < ordered.length; i++) {
    const d = ordered[i]!;
    if (!d.facesOut) {
      out.push({ code: 'stop-faces-away', ...stationTags(d), message: `${stationWords(d, i)} is set at ${d.stopAngle}° on a jaw face whose normal is ${d.faceNormal}°, so the part would lie inside the jaw; a stop faces out when its angle is the face normal less 90° — correct stop ${d.stop + 1} of ${d.componentCode} in the catalog.` });
    }
    if (!d.clamped) continue;
    if (!d.match) {
      out.push({ code: 'no-facing-clamp', ...stationTags(d), ...(d.blockedBy ? { otherPlacement: d.blockedBy } : {}), message: d.blockedBy
        ? `${stationWords(d, i)} has no clamp it can reach: placement ${d.blockedBy} lies between its fixed jaw and the nearest jaw rail facing it; place a jaw rail in front of it, or take the stop out of use.`
        : `${stationWords(d, i)} has no jaw-rail clamp facing its fixed jaw; place a jaw rail facing it, or take the stop out of use.` });
      continue;
    }
    holding.add(d.match.clamp.placement);
    const jaw = rails.get(d.match.clamp.placement)!;
    const rail = `jaw rail ${jaw.placement.id} (${jaw.component})`;
    if (jaw.clampCloses === null) {
      out.push({ code: 'no-facing-clamp', ...stationTags(d), otherPlacement: jaw.placement.id, message: `${stationWords(d, i)} is faced by ${rail}, which has no clamp model, so no bar can be judged to fit; give ${jaw.component} its clamp model in the catalog.` });
    } else if (d.match.width - jaw.clampCloses <= slack) {
      out.push({ code: 'no-facing-clamp', ...stationTags(d), otherPlacement: jaw.placement.id, message: `${stationWords(d, i)} is faced by ${rail} only ${len(d.match.width)} away, closer than its clamp can close (${len(jaw.clampCloses)} below its opening), so no bar fits; move the jaw rail out a hole.` });
    }
  }
  for (const r of jawRails) {
    if (holding.has(r.placement.id)) continue;
    if (r.faces.some((c) => jaws.some((j) => clampFacesJaw(c, j, slack)))) continue;
    const h = r.placement.hole;
    out.push({ code: 'jaw-rail-faces-nothing', placement: r.placement.id, hole: h, message: `Placement ${r.placement.id} (${r.component}) on hole (${h.col}, ${h.row}) is a jaw rail that faces no fixed jaw, so its clamps would push on nothing; turn it to face a rail's jaw, or remove it.` });
  }
  return out;
}
