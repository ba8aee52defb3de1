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

/**
 * A 2D affine map x' = a·x + c·y + e, y' = b·x + d·y + f (the column-major 2×3 matrix of
 * SVG 2 "transform" and of most graphics texts), with what kind of map it is: arcs stay arcs
 * (and DXF bulges stay bulges) only under a similarity. Used to place DXF block contents
 * (INSERT: scale, rotation, MINSERT array steps) and to bring object coordinates to world XY.
 */
export class Affine {
  /** 0 identity, 1 similarity (uniform scale, rotation, mirror, shift), 2 anything else. */
  readonly kind: 0 | 1 | 2;
  /** The similarity's scale factor; for other maps √|det|, the factor on areas' square root. */
  readonly scale: number;
  /** Whether the map reverses orientation (negative determinant). */
  readonly mirror: boolean;

  constructor(
    readonly a: number,
    readonly b: number,
    readonly c: number,
    readonly d: number,
    readonly e: number,
    readonly f: number,
  ) {
    const su = a * a + b * b;
    const sv = c * c + d * d;
    this.mirror = a * d - b * c < 0;
    if (a === 1 && b === 0 && c === 0 && d === 1 && e === 0 && f === 0) {
      this.kind = 0;
      this.scale = 1;
    } else if (Math.abs(su - sv) <= 1e-9 * su && Math.abs(a * c + b * d) <= 1e-9 * su) {
      this.kind = 1;
      this.scale = Math.sqrt(su);
    } else {
      this.kind = 2;
      this.scale = Math.sqrt(Math.abs(a * d - b * c));
    }
  }

  static readonly IDENTITY = new Affine(1, 0, 0, 1, 0, 0);

  /** this ∘ n: apply n first. */
  then(n: Affine): Affine {
    return new Affine(
      this.a * n.a + this.c * n.b,
      this.b * n.a + this.d * n.b,
      this.a * n.c + this.c * n.d,
      this.b * n.c + this.d * n.d,
      this.a * n.e + this.c * n.f + this.e,
      this.b * n.e + this.d * n.f + this.f,
    );
  }

  /** The point (x, y) under the map. */
  apply(x: number, y: number): Point {
    return { x: this.a * x + this.c * y + this.e, y: this.b * x + this.d * y + this.f };
  }

  static translate(x: number, y: number): Affine {
    return new Affine(1, 0, 0, 1, x, y);
  }

  /** Rotation counter-clockwise by `deg` degrees; quarter turns exact (see cosSinDeg). */
  static rotateDeg(deg: number): Affine {
    const { cos, sin } = cosSinDeg(deg);
    return new Affine(cos, sin, -sin, cos, 0, 0);
  }

  static scaling(sx: number, sy: number): Affine {
    return new Affine(sx, 0, 0, sy, 0, 0);
  }
}
