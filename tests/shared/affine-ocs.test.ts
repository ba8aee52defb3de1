import fc from 'fast-check';
import { glMatrix, mat2d, vec2 } from 'gl-matrix';
import { describe, expect, it } from 'vitest';
import { ocsToWorldXY } from '../../shared/geometry/ocs';
import { Affine } from '../../shared/geometry/transform';

// gl-matrix defaults to Float32Array; the comparison needs doubles.
glMatrix.setMatrixArrayType(Array);

const num = fc.double({ min: -100, max: 100, noNaN: true });

describe('Affine (2D affine map, gl-matrix mat2d layout [a, b, c, d, tx, ty])', () => {
  it('composition and application match gl-matrix mat2d (independent matrix library) to 1e-9', () => {
    fc.assert(
      fc.property(fc.array(num, { minLength: 6, maxLength: 6 }), fc.array(num, { minLength: 6, maxLength: 6 }), num, num, (p, q, x, y) => {
        const m = new Affine(p[0]!, p[1]!, p[2]!, p[3]!, p[4]!, p[5]!);
        const n = new Affine(q[0]!, q[1]!, q[2]!, q[3]!, q[4]!, q[5]!);
        const ours = m.then(n).apply(x, y);
        const M = mat2d.fromValues(p[0]!, p[1]!, p[2]!, p[3]!, p[4]!, p[5]!);
        const N = mat2d.fromValues(q[0]!, q[1]!, q[2]!, q[3]!, q[4]!, q[5]!);
        const theirs = vec2.transformMat2d(vec2.create(), vec2.fromValues(x, y), mat2d.multiply(mat2d.create(), M, N));
        const scale = 1 + Math.abs(theirs[0]!) + Math.abs(theirs[1]!);
        expect(Math.abs(ours.x - theirs[0]!)).toBeLessThan(1e-9 * scale);
        expect(Math.abs(ours.y - theirs[1]!)).toBeLessThan(1e-9 * scale);
      }),
    );
  });

  it('tells a similarity (arcs stay arcs) from a stretch, and sees a mirror', () => {
    expect(Affine.IDENTITY.kind).toBe(0);
    const sim = Affine.translate(3, 4).then(Affine.rotateDeg(30)).then(Affine.scaling(2, 2));
    expect(sim.kind).toBe(1);
    expect(sim.scale).toBeCloseTo(2, 12);
    expect(sim.mirror).toBe(false);
    const flip = Affine.scaling(-1, 1);
    expect(flip.kind).toBe(1);
    expect(flip.mirror).toBe(true);
    const stretch = Affine.scaling(2, 1);
    expect(stretch.kind).toBe(2);
    // √|det| for a stretch: √(2·1).
    expect(stretch.scale).toBeCloseTo(Math.SQRT2, 12);
  });

  it('quarter turns are exact (cos 90° is 0, not 6e-17), so an inserted hole lands on its grid point', () => {
    expect(Affine.rotateDeg(90).apply(1, 0)).toEqual({ x: 0, y: 1 });
    expect(Affine.rotateDeg(-90).apply(2, 0)).toEqual({ x: 0, y: -2 });
    expect(Affine.rotateDeg(540).apply(1, 2)).toEqual({ x: -1, y: -2 });
  });
});

/** a × b */
function cross(a: [number, number, number], b: [number, number, number]): [number, number, number] {
  return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
}
function unit(v: [number, number, number]): [number, number, number] {
  const l = Math.hypot(...v);
  return [v[0] / l, v[1] / l, v[2] / l];
}

describe('arbitrary axis algorithm (DXF Reference, "Object Coordinate Systems (OCS)" and "Arbitrary Axis Algorithm")', () => {
  // The reference's rule, written out here from its text: if |Nx| < 1/64 and |Ny| < 1/64,
  // Ax = Wy × N, else Ax = Wz × N; Ay = N × Ax; a point (x, y) at elevation z is x·Ax + y·Ay + z·N.
  const reference = (n: [number, number, number], x: number, y: number, z: number): [number, number] => {
    const N = unit(n);
    const Ax = unit(Math.abs(N[0]) < 1 / 64 && Math.abs(N[1]) < 1 / 64 ? cross([0, 1, 0], N) : cross([0, 0, 1], N));
    const Ay = unit(cross(N, Ax));
    return [x * Ax[0] + y * Ay[0] + z * N[0], x * Ax[1] + y * Ay[1] + z * N[1]];
  };

  it('extrusion (0, 0, −1) mirrors X: the OCS X axis is world −X (hand-worked: Wy × −Wz = −Wx)', () => {
    const m = ocsToWorldXY(0, 0, -1, 0)!;
    const p = m.apply(3, 4);
    expect(p.x).toBeCloseTo(-3, 15);
    expect(p.y).toBeCloseTo(4, 15);
    expect(m.mirror).toBe(true);
  });

  it('extrusion (1, 0, 0): Ax = Wz × Wx = Wy, Ay = Wx × Wy = Wz, so (x, y) at elevation 5 projects to (5, x)', () => {
    const p = ocsToWorldXY(1, 0, 0, 5)!.apply(3, 4);
    expect(p.x).toBeCloseTo(5, 15);
    expect(p.y).toBeCloseTo(3, 15);
  });

  it('the default (0, 0, 1) and a zero or non-finite direction need no map', () => {
    expect(ocsToWorldXY(0, 0, 1, 7)).toBeNull();
    expect(ocsToWorldXY(0, 0, 2, 0)).toBeNull();
    expect(ocsToWorldXY(0, 0, 0, 0)).toBeNull();
    expect(ocsToWorldXY(Number.NaN, 0, 1, 0)).toBeNull();
  });

  it('agrees with the reference rule on random directions, both sides of the 1/64 threshold', () => {
    fc.assert(
      fc.property(
        fc.oneof(fc.double({ min: -0.015, max: 0.015, noNaN: true }), num),
        fc.oneof(fc.double({ min: -0.015, max: 0.015, noNaN: true }), num),
        num,
        num,
        num,
        num,
        (nx, ny, nz, x, y, z) => {
          const len = Math.hypot(nx, ny, nz);
          fc.pre(len > 1e-3);
          const N = unit([nx, ny, nz]);
          fc.pre(!(N[0] === 0 && N[1] === 0 && N[2] === 1));
          // Keep away from the threshold itself, where the two rules legitimately switch.
          fc.pre(Math.abs(Math.abs(N[0]) - 1 / 64) > 1e-9 && Math.abs(Math.abs(N[1]) - 1 / 64) > 1e-9);
          const p = ocsToWorldXY(nx, ny, nz, z)!.apply(x, y);
          const [ex, ey] = reference([nx, ny, nz], x, y, z);
          expect(Math.abs(p.x - ex)).toBeLessThan(1e-9 * (1 + Math.abs(ex)));
          expect(Math.abs(p.y - ey)).toBeLessThan(1e-9 * (1 + Math.abs(ey)));
        },
      ),
    );
  });
});
