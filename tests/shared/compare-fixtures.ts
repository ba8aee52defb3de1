// Layouts and small helpers shared by the version-comparison tests. Inch, 2.000 in pitch, shared
// offset on hole (6, 5) = (12, 10) unless said otherwise (see station-fixtures.ts).
import type { Placement, Rotation } from '../../shared/schemas/template';
import { ALL_STOPS } from './station-fixtures';

export const rail = (id: string, col: number, row: number, rotation: Rotation = 0, stopsInUse: number[] = ALL_STOPS, component = 'CR-8'): Placement =>
  ({ id, component, hole: { col, row }, rotation, stopsInUse });

export const jaw = (id: string, col: number, row: number, rotation: Rotation = 0): Placement =>
  ({ id, component: 'JR-1', hole: { col, row }, rotation, stopsInUse: [] });

/**
 * Quarter-turn rotation matrices written out (rotation matrix, any linear algebra text;
 * R(θ) = [[cos θ, −sin θ], [sin θ, cos θ]], so R(90°) = [[0, −1], [1, 0]]), not computed, so the
 * tests do not share the code under test's trigonometry.
 */
export const R: Record<Rotation, [[number, number], [number, number]]> = {
  0: [[1, 0], [0, 1]],
  90: [[0, -1], [1, 0]],
  180: [[-1, 0], [0, -1]],
  270: [[0, 1], [-1, 0]],
};

export const rotate = (theta: Rotation, s: { x: number; y: number }) => ({
  x: R[theta][0][0] * s.x + R[theta][0][1] * s.y,
  y: R[theta][1][0] * s.x + R[theta][1][1] * s.y,
});

/** The CR-8 stop k in its local frame: (0.5 + k, 0.375). */
export const stopOf = (k: number) => ({ x: 0.5 + k, y: 0.375 });
