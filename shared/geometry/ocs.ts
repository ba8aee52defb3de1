// Object coordinate systems of planar DXF entities, by the arbitrary axis algorithm.
import { Affine } from './transform';

/**
 * The map from an entity's object coordinate system to world XY, by the arbitrary axis
 * algorithm (DXF Reference, "Arbitrary Axis Algorithm"): with N the extrusion direction,
 * Ax = Wy × N when |Nx| and |Ny| are both below 1/64, else Wz × N; Ay = N × Ax. A point (x, y)
 * at elevation z lies at x·Ax + y·Ay + z·N; keeping X and Y projects it onto the XY plane.
 * Returns null for the default N = (0, 0, 1), and for a direction that is zero or not finite.
 */
export function ocsToWorldXY(nx: number, ny: number, nz: number, elevation: number): Affine | null {
  if (!(Number.isFinite(nx) && Number.isFinite(ny) && Number.isFinite(nz))) return null;
  const len = Math.hypot(nx, ny, nz);
  if (len === 0) return null;
  nx /= len;
  ny /= len;
  nz /= len;
  if (nx === 0 && ny === 0 && nz === 1) return null;
  let ax: number;
  let ay: number;
  let az: number;
  if (Math.abs(nx) < 1 / 64 && Math.abs(ny) < 1 / 64) {
    [ax, ay, az] = [nz, 0, -nx];
  } else {
    [ax, ay, az] = [-ny, nx, 0];
  }
  const al = Math.hypot(ax, ay, az);
  ax /= al;
  ay /= al;
  az /= al;
  let bx = ny * az - nz * ay;
  let by = nz * ax - nx * az;
  const bz = nx * ay - ny * ax;
  const bl = Math.hypot(bx, by, bz);
  bx /= bl;
  by /= bl;
  const z = Number.isFinite(elevation) ? elevation : 0;
  return new Affine(ax, ay, bx, by, z * nx, z * ny);
}
