import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { glMatrix, mat3, vec2 } from 'gl-matrix';
import { applyTransform, cosSinDeg, holePosition, normalizeDegrees, placementTransform, rotateVector } from '../../shared/geometry/transform';
import { componentGeometryIn } from '../../shared/geometry/component-geometry';
import { centerRail } from './station-fixtures';

// gl-matrix defaults to Float32Array; the comparison needs doubles.
glMatrix.setMatrixArrayType(Array);

describe('placement transform', () => {
  it('matches gl-matrix (independent matrix library) on random placements to 1e-9', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: -5, max: 120 }),
        fc.integer({ min: -5, max: 120 }),
        fc.constantFrom(0, 90, 180, 270),
        fc.constantFrom(2, 1.5, 50, 25),
        fc.double({ min: -500, max: 500, noNaN: true }),
        fc.double({ min: -500, max: 500, noNaN: true }),
        (col, row, rotation, pitch, x, y) => {
          const ours = applyTransform(placementTransform({ col, row }, rotation, pitch), { x, y });
          // gl-matrix: M = T(hole) · R(θ), then p' = M·p (vec2.transformMat3, homogeneous w = 1)
          const m = mat3.create();
          mat3.fromTranslation(m, [col * pitch, row * pitch]);
          mat3.rotate(m, m, (rotation * Math.PI) / 180);
          const out = vec2.transformMat3(vec2.create(), [x, y], m);
          expect(Math.abs(ours.x - out[0]!)).toBeLessThan(1e-9);
          expect(Math.abs(ours.y - out[1]!)).toBeLessThan(1e-9);
        },
      ),
      { numRuns: 1000 },
    );
  });

  it.each([
    // rotation, local point, plate point — hole (10, 1) at pitch 2 = (20, 2); R(θ) by hand
    [0, { x: 0.5, y: 0.375 }, { x: 20.5, y: 2.375 }], // (20 + 0.5, 2 + 0.375)
    [90, { x: 0.5, y: 0.375 }, { x: 19.625, y: 2.5 }], // R90·(0.5, 0.375) = (−0.375, 0.5)
    [180, { x: 0.5, y: 0.375 }, { x: 19.5, y: 1.625 }], // R180·(0.5, 0.375) = (−0.5, −0.375)
    [270, { x: 0.5, y: 0.375 }, { x: 20.375, y: 1.5 }], // R270·(0.5, 0.375) = (0.375, −0.5)
  ] as const)('rotation %d maps a quarter-turn exactly', (rotation, local, plate) => {
    const p = applyTransform(placementTransform({ col: 10, row: 1 }, rotation, 2), local);
    expect(p).toEqual(plate); // exact: no 6e-17 from cos(π/2)
  });

  it('uses exact cos and sin at quarter turns', () => {
    expect(Math.cos(Math.PI / 2)).not.toBe(0); // the noise being avoided: 6.1e-17
    expect(cosSinDeg(90)).toEqual({ cos: 0, sin: 1 });
    expect(cosSinDeg(180)).toEqual({ cos: -1, sin: 0 });
    expect(cosSinDeg(-90)).toEqual({ cos: 0, sin: -1 });
    expect(cosSinDeg(450)).toEqual({ cos: 0, sin: 1 });
    expect(cosSinDeg(30).cos).toBeCloseTo(Math.sqrt(3) / 2, 15); // cos 30° = √3/2
  });

  it.each([
    [-90, 270], [450, 90], [360, 0], [-0, 0], [720.5, 0.5], [-1e-15, 0],
  ])('normalizeDegrees(%d) = %d', (deg, expected) => {
    expect(Object.is(normalizeDegrees(deg), expected)).toBe(true);
  });

  it('grid hole (i, j) sits at (i·pitch, j·pitch) from the datum hole', () => {
    expect(holePosition({ col: 6, row: 5 }, 2)).toEqual({ x: 12, y: 10 });
    expect(holePosition({ col: 3, row: 2 }, 50)).toEqual({ x: 150, y: 100 });
  });

  it('rotates directions without translating them', () => {
    expect(rotateVector(placementTransform({ col: 9, row: 9 }, 90, 2), { x: 1, y: 0 })).toEqual({ x: 0, y: 1 });
  });
});

describe('component geometry in the plate unit', () => {
  it('scales lengths by 25.4 and leaves angles and bulges alone', () => {
    const mm = componentGeometryIn(
      {
        ...centerRail(),
        unit: 'mm',
        dowels: [{ x: 0, y: 0 }, { x: 203.2, y: 0 }],
        stops: [{ x: 12.7, y: 9.525, z: 25.4, angle: 90 }],
        jawFaces: [{ x: 0, y: 9.525, normal: 90 }],
        outline: { paths: [{ closed: false, points: [{ x: 0, y: 0, bulge: 0.5 }, { x: 25.4, y: 0 }] }], circles: [{ x: 0, y: 0, r: 6.35 }] },
      },
      'in',
    );
    expect(mm.dowels[1]!.x).toBeCloseTo(8, 12); // 203.2 / 25.4
    expect(mm.stops[0]).toMatchObject({ angle: 90 });
    expect(mm.stops[0]!.x).toBeCloseTo(0.5, 12); // 12.7 / 25.4
    expect(mm.stops[0]!.y).toBeCloseTo(0.375, 12); // 9.525 / 25.4
    expect(mm.stops[0]!.z).toBeCloseTo(1, 12); // 25.4 / 25.4
    expect(mm.jawFaces[0]!.normal).toBe(90);
    expect(mm.outline!.paths[0]!.points[0]!.bulge).toBe(0.5); // tan(θ/4): unitless
    expect(mm.outline!.circles[0]!.r).toBeCloseTo(0.25, 12); // 6.35 / 25.4
  });
});
