import type { Point } from '../schemas/common';
import type { Hole, Rotation } from '../schemas/template';

/** A rigid placement on the plate: p' = t + R(θ)·p, with cos/sin exact for the grid rotations. */
export interface RigidTransform {
  tx: number;
  ty: number;
  cos: number;
  sin: number;
  /** Rotation in degrees, counter-clockwise from plate +X. */
  degrees: number;
}

export const GRID_ROTATIONS: readonly Rotation[] = [0, 90, 180, 270];

export function isGridRotation(value: unknown): value is Rotation {
  return value === 0 || value === 90 || value === 180 || value === 270;
}

/** Degrees into [0, 360), with -0 and float wrap (e.g. -1e-15 → 360) folded to 0. */
export function normalizeDegrees(deg: number): number {
  const d = ((deg % 360) + 360) % 360;
  return d === 360 || d === 0 ? 0 : d;
}

/**
 * cos and sin of an angle in degrees. Quarter turns are looked up, not computed, because
 * Math.cos(π/2) is 6.1e-17, and that noise would leak into printed offsets and into the
 * antiparallel test of jaw faces.
 */
export function cosSinDeg(deg: number): { cos: number; sin: number } {
  const d = normalizeDegrees(deg);
  if (d === 0) return { cos: 1, sin: 0 };
  if (d === 90) return { cos: 0, sin: 1 };
  if (d === 180) return { cos: -1, sin: 0 };
  if (d === 270) return { cos: 0, sin: -1 };
  const rad = (d * Math.PI) / 180;
  return { cos: Math.cos(rad), sin: Math.sin(rad) };
}

/** Grid hole (col, row) sits at (col·pitch, row·pitch) from the datum hole. */
export function holePosition(hole: Hole, pitch: number): Point {
  return { x: hole.col * pitch, y: hole.row * pitch };
}

/** The transform of a component whose primary dowel (its local origin) drops into `hole`. */
export function placementTransform(hole: Hole, rotation: number, pitch: number): RigidTransform {
  const { cos, sin } = cosSinDeg(rotation);
  return { tx: hole.col * pitch, ty: hole.row * pitch, cos, sin, degrees: normalizeDegrees(rotation) };
}

export function applyTransform(t: RigidTransform, p: Point): Point {
  return { x: t.tx + t.cos * p.x - t.sin * p.y, y: t.ty + t.sin * p.x + t.cos * p.y };
}

/** A direction (no translation), e.g. a jaw face normal. */
export function rotateVector(t: RigidTransform, v: Point): Point {
  return { x: t.cos * v.x - t.sin * v.y, y: t.sin * v.x + t.cos * v.y };
}
