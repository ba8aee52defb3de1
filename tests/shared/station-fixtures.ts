// Small catalog and layouts for the station-engine tests. Inch unless said otherwise.
import type { z } from 'zod';
import { TemplateContentSchema, type TemplateContent } from '../../shared/schemas/template';
import type { Outline } from '../../shared/schemas/geometry';
import type { Unit } from '../../shared/schemas/common';

export const rect = (x0: number, y0: number, x1: number, y1: number): Outline => ({
  paths: [{ closed: true, points: [{ x: x0, y: y0 }, { x: x1, y: y0 }, { x: x1, y: y1 }, { x: x0, y: y1 }] }],
  circles: [],
});

/**
 * Center rail: dowels at local (0, 0) and (8, 0); stops at (0.5 + k, 0.375), k = 0..7, on a
 * fixed jaw face along y = 0.375 whose normal points +Y (the side the part sits on).
 */
export const centerRail = (code = 'CR-8', outline: Outline | null = rect(-0.5, -0.375, 8.5, 0.375)) => ({
  code,
  kind: 'center-rail' as const,
  unit: 'in' as Unit,
  dowels: [{ x: 0, y: 0 }, { x: 8, y: 0 }],
  stops: Array.from({ length: 8 }, (_, k) => ({ x: 0.5 + k, y: 0.375 })),
  jawFaces: [{ x: 0, y: 0.375, normal: 90 }],
  outline,
});

/** Jaw rail: same dowels; its clamp face at its nominal opening along y = −0.375, facing −Y. */
export const jawRail = (code = 'JR-1', outline: Outline | null = rect(-0.5, -0.375, 8.5, 0.375)) => ({
  code,
  kind: 'jaw-rail' as const,
  unit: 'in' as Unit,
  dowels: [{ x: 0, y: 0 }, { x: 8, y: 0 }],
  stops: [],
  jawFaces: [{ x: 4, y: -0.375, normal: 270 }],
  outline,
});

export const ALL_STOPS = [0, 1, 2, 3, 4, 5, 6, 7];

type ContentInput = z.input<typeof TemplateContentSchema>;
type Loose = Partial<Omit<ContentInput, 'plate'>> & { plate?: Partial<ContentInput['plate']> };

/** 2.000 in pitch, 16 × 10 holes: holes span x 0..30, y 0..18; edges one half pitch beyond. */
export function content(over: Loose = {}): TemplateContent {
  return TemplateContentSchema.parse({
    name: 'Test layout',
    unit: 'in',
    components: [centerRail(), jawRail()],
    placements: [],
    sharedOffset: { kind: 'hole', hole: { col: 6, row: 5 } },
    ...over,
    plate: { code: 'GP-16x10', unit: 'in', pitch: 2, columns: 16, rows: 10, ...over.plate },
  });
}

/**
 * A large layout for scale checks and the benchmark: bands of 10 center rails (16 stops) with a
 * jaw rail one row above each; rails 17 in long on 18 in (9 hole) centers leave 1 in between;
 * bands 4 in (2 rows) apart. 20 placements and 160 stations per band.
 */
export function railBands(bands: number): TemplateContent {
  const cr16 = { ...centerRail('CR-16', rect(-0.5, -0.375, 16.5, 0.375)), dowels: [{ x: 0, y: 0 }, { x: 16, y: 0 }], stops: Array.from({ length: 16 }, (_, k) => ({ x: 0.5 + k, y: 0.375 })) };
  // With a clamp model, so the layout holds every part and measures the engine, not 16,000 problem messages.
  const clamp = { acceptBelow: 0.03, acceptAbove: 0.03, topHeight: 0.16, topSlope: 0.5, gripLow: 0.04, gripHigh: 0.16, gripSlope: 0.5, slotSlop: 0.015 };
  const jr16 = { ...jawRail('JR-16', rect(-0.5, -0.375, 16.5, 0.375)), dowels: [{ x: 0, y: 0 }, { x: 16, y: 0 }], clamp };
  const placements = [];
  for (let band = 0; band < bands; band++) {
    for (let k = 0; k < 10; k++) {
      placements.push({ id: `C${band}-${k}`, component: 'CR-16', hole: { col: 9 * k, row: 2 * band }, rotation: 0 as const, stopsInUse: Array.from({ length: 16 }, (_, i) => i) });
      placements.push({ id: `J${band}-${k}`, component: 'JR-16', hole: { col: 9 * k, row: 2 * band + 1 }, rotation: 0 as const });
    }
  }
  return content({ plate: { columns: 90, rows: 2 * bands }, components: [cr16, jr16], placements, sharedOffset: { kind: 'center' } });
}

/** railBands(bands) with stops taken off the last rails until exactly `stations` stations remain. */
export function railBandsWithStations(bands: number, stations: number): TemplateContent {
  const c = railBands(bands);
  let left = stations;
  c.placements = c.placements.map((p) => {
    if (!p.stopsInUse?.length) return p;
    const n = Math.max(0, Math.min(p.stopsInUse.length, left));
    left -= n;
    return { ...p, stopsInUse: Array.from({ length: n }, (_, i) => i) };
  });
  return c;
}
