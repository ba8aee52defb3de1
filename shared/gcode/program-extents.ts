import type { XY } from './read-part-program';

/** Running extents of programmed points, part coordinates. */
export interface Bounds { minX: number; minY: number; minZ: number; maxX: number; maxY: number; maxZ: number; any: boolean }

export function include(b: Bounds, x: number, y: number, z: number | null) {
  b.any = true;
  if (x < b.minX) b.minX = x;
  if (x > b.maxX) b.maxX = x;
  if (y < b.minY) b.minY = y;
  if (y > b.maxY) b.maxY = y;
  if (z !== null) {
    if (z < b.minZ) b.minZ = z;
    if (z > b.maxZ) b.maxZ = z;
  }
}

/** The quadrant points an arc passes through (G2 clockwise, G3 counter-clockwise seen from +Z). */
export function includeArc(b: Bounds, s: XY, e: XY, c: XY, ccw: boolean, z: number | null) {
  const r = Math.hypot(s.x - c.x, s.y - c.y);
  let a0 = Math.atan2(s.y - c.y, s.x - c.x);
  let a1 = Math.atan2(e.y - c.y, e.x - c.x);
  if (!ccw) [a0, a1] = [a1, a0];
  let sweep = a1 - a0;
  while (sweep <= 1e-12) sweep += 2 * Math.PI;
  for (let k = 0; k < 4; k++) {
    const a = (k * Math.PI) / 2;
    let d = a - a0;
    while (d < 0) d += 2 * Math.PI;
    while (d >= 2 * Math.PI) d -= 2 * Math.PI;
    if (d <= sweep) include(b, c.x + r * Math.cos(a), c.y + r * Math.sin(a), z);
  }
  include(b, e.x, e.y, z);
}

export const emptyBounds = (): Bounds => ({ minX: Infinity, minY: Infinity, minZ: Infinity, maxX: -Infinity, maxY: -Infinity, maxZ: -Infinity, any: false });
