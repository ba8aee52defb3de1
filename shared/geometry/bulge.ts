// DXF polyline bulges and the circular arcs they stand for: the one home of this arithmetic for
// the DXF reader, the drawing previews, and outline bounds and footprints.
//
// bulge = tan(θ/4), θ the included angle of the arc from a vertex to the next, negative when the
// arc runs clockwise (DXF Reference, LWPOLYLINE group code 42; POLYLINE VERTEX group 42).
import { LIMITS } from '../schemas/limits';

/** The circle through a bulge segment. */
export interface BulgeArc {
  cx: number;
  cy: number;
  /** Radius, always positive. */
  r: number;
  /** Angle of the start vertex seen from the centre, radians. */
  start: number;
  /** Signed sweep, radians, + counter-clockwise: 4·atan(bulge). */
  sweep: number;
  /** Length of the chord from start to end vertex. */
  chord: number;
}

/** Included angle θ (signed, + counter-clockwise) of a bulge: θ = 4·atan(b). */
export function bulgeSweep(bulge: number): number {
  return 4 * Math.atan(bulge);
}

/** The bulge of an arc of signed included angle θ: tan(θ/4). */
export function sweepToBulge(sweep: number): number {
  return Math.tan(sweep / 4);
}

/**
 * Radius of the arc with this bulge over a chord of length c. From the sagitta s = |b|·c/2 and
 * r = (c²/4 + s²)/(2s): r = c·(1 + b²)/(4|b|).
 */
export function bulgeRadius(chord: number, bulge: number): number {
  return (chord * (1 + bulge * bulge)) / (4 * Math.abs(bulge));
}

/**
 * The arc of the segment (x0, y0) → (x1, y1) with bulge b, or null for a straight segment (b zero
 * or not finite, or the two vertices equal). The centre lies off the chord midpoint along the
 * chord turned left by (c/2)·cot(θ/2) = c·(1 − b²)/(4b), which changes side by itself when b < 0.
 */
export function bulgeArc(x0: number, y0: number, x1: number, y1: number, b: number): BulgeArc | null {
  const dx = x1 - x0;
  const dy = y1 - y0;
  const chord = Math.hypot(dx, dy);
  if (b === 0 || !Number.isFinite(b) || chord === 0) return null;
  const k = (1 - b * b) / (4 * b);
  const cx = (x0 + x1) / 2 - dy * k;
  const cy = (y0 + y1) / 2 + dx * k;
  return { cx, cy, r: bulgeRadius(chord, b), start: Math.atan2(y0 - cy, x0 - cx), sweep: bulgeSweep(b), chord };
}

/**
 * Chord count for an arc of radius r over `sweep` so that no chord strays more than `tolerance`
 * from it: a chord spanning angle Δ on radius r has sagitta r·(1 − cos(Δ/2)) (Machinery's
 * Handbook, segments of circles). Capped at LIMITS.arcChords, so a huge radius costs no more
 * than that (a coarser chord error on an arc far larger than any plate).
 */
export function arcChordCount(r: number, sweep: number, tolerance: number): number {
  if (tolerance >= r) return Math.max(1, Math.ceil(Math.abs(sweep) / (Math.PI / 2)));
  const maxStep = 2 * Math.acos(1 - tolerance / r);
  return Math.min(LIMITS.arcChords, Math.max(1, Math.ceil(Math.abs(sweep) / maxStep)));
}

/**
 * The points strictly between the two vertices of a bulge segment, on its arc, such that the
 * chords through them stray at most `tolerance` from the arc (see arcChordCount). `push` gets
 * them in order from start to end; nothing for a straight segment.
 */
export function flattenBulge(
  x0: number,
  y0: number,
  x1: number,
  y1: number,
  b: number,
  tolerance: number,
  push: (x: number, y: number) => void,
): void {
  const arc = bulgeArc(x0, y0, x1, y1, b);
  if (!arc) return;
  const n = arcChordCount(arc.r, arc.sweep, tolerance);
  for (let i = 1; i < n; i++) {
    const t = arc.start + (arc.sweep * i) / n;
    push(arc.cx + arc.r * Math.cos(t), arc.cy + arc.r * Math.sin(t));
  }
}
