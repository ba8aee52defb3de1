import { describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { TemplateContentSchema, type TemplateContent } from '../../shared/schemas/template';
import { applyTransform, placementTransform } from '../../shared/geometry/transform';
import { evaluateTemplate } from '../../shared/stations/evaluate-template';
import {
  buildPlateScene,
  buildStationScene,
  comparePlacements,
  describeDrawing,
  faultsByPlacement,
  pointerReadout,
} from '../../app/features/templates/components/plate-drawing-scene';
import { polylinePathData } from '../../app/features/templates/components/plate-drawing-geometry';

// A small layout, self-contained so other suites' fixtures can change freely. Inch unless said.
const rail = {
  code: 'CR-8',
  kind: 'center-rail' as const,
  unit: 'in' as const,
  dowels: [{ x: 0, y: 0 }, { x: 8, y: 0 }],
  stops: Array.from({ length: 8 }, (_, k) => ({ x: 0.5 + k, y: 0.375 })),
  jawFaces: [{ x: 0, y: 0.375, normal: 90 }],
  outline: { paths: [{ closed: true, points: [{ x: -0.5, y: -0.375 }, { x: 8.5, y: -0.375 }, { x: 8.5, y: 0.375 }, { x: -0.5, y: 0.375 }] }], circles: [] },
};
const stop = { code: 'ST-1', kind: 'stop' as const, unit: 'in' as const, dowels: [{ x: 0, y: 0 }], stops: [{ x: 0.25, y: 0 }], outline: null };

type ContentInput = z.input<typeof TemplateContentSchema>;
const layout = (over: Partial<ContentInput> = {}): TemplateContent => TemplateContentSchema.parse({
  name: 'Drawing test',
  unit: 'in',
  plate: { code: 'GP-16x10', unit: 'in', pitch: 2, columns: 16, rows: 10 },
  components: [rail, stop],
  placements: [
    { id: 'A', component: 'CR-8', hole: { col: 1, row: 1 }, rotation: 0, stopsInUse: [0, 1, 2] },
    { id: 'B', component: 'CR-8', hole: { col: 10, row: 2 }, rotation: 90, stopsInUse: [0] },
    { id: 'S', component: 'ST-1', hole: { col: 1, row: 8 }, rotation: 0 },
  ],
  sharedOffset: { kind: 'hole', hole: { col: 6, row: 5 } },
  ...over,
});

describe('plate scene', () => {
  it('builds each component\'s path once and shares it between its placements', () => {
    // The component keeps 2,000 placements cheap by reusing one path string per component code.
    const scene = buildPlateScene(layout());
    const [a, b] = scene.placements;
    expect(a!.shape).toBe(b!.shape);
    expect(a!.shape.fill).toBe('M-0.5 -0.375L8.5 -0.375L8.5 0.375L-0.5 0.375Z');
    expect(b!.transform).toBe('translate(20 4) rotate(90)');
  });

  it('places the outline by the placement transform', () => {
    // Placement transform (shared/geometry/transform.ts): hole (10, 2) on 2 in is (20, 4); turned 90°, local (x, y) → (20 − y, 4 + x)
    const b = buildPlateScene(layout()).byId.get('B')!;
    expect(b.bounds).toEqual({ minX: 19.625, minY: 3.5, maxX: 20.375, maxY: 12.5 });
    expect(b.primary).toEqual({ x: 20, y: 4 });
    expect(b.labelVertical).toBe(true);
    expect(b.title).toBe('CR-8, center rail: placement B on hole (10, 2), turned 90°');
  });

  it('draws a component without an outline as a box around its dowels and stops, and says so', () => {
    const s = buildPlateScene(layout()).byId.get('S')!;
    expect(s.shape.outlined).toBe(false);
    const pad = 2 * 0.15; // symbolSizes: pad is 0.15 pitch
    expect(s.shape.local.minX).toBeCloseTo(-pad, 12);
    expect(s.shape.local.maxX).toBeCloseTo(0.25 + pad, 12);
    expect(s.shape.lines).not.toBe(''); // the dowel
    expect(s.title).toMatch(/no outline/);
  });

  it('still draws a placement whose component is unknown, and names the fault', () => {
    const scene = buildPlateScene(layout({ placements: [{ id: 'X', component: 'NOPE', hole: { col: 2, row: 2 }, rotation: 0 }] }));
    const x = scene.byId.get('X')!;
    expect(x.known).toBe(false);
    expect(x.title).toMatch(/NOPE is not in the template's component list/);
  });

  it('converts an inch component onto a millimetre plate', () => {
    // 1 in = 25.4 mm exactly (NIST SP 811, Appendix B)
    const scene = buildPlateScene(layout({
      plate: { code: 'GP-50', unit: 'mm', pitch: 50, columns: 10, rows: 8 },
      placements: [{ id: 'A', component: 'CR-8', hole: { col: 1, row: 1 }, rotation: 0 }],
    }));
    const a = scene.byId.get('A')!;
    expect(a.shape.local.minX).toBeCloseTo(-0.5 * 25.4, 9);
    expect(a.shape.local.maxX).toBeCloseTo(8.5 * 25.4, 9);
    expect(a.primary).toEqual({ x: 50, y: 50 });
    expect(scene.holeRadius).toBeCloseTo(50 * 0.125, 12); // no hole diameter given: an eighth of the pitch
  });
});

describe('station scene', () => {
  it.each<['in' | 'mm']>([['in'], ['mm']])('puts each station at origin + translation on the plate (template in %s)', (unit) => {
    // Station translation (shared/stations/evaluate-template.ts): translation = datum − shared offset origin, so datum = origin + translation;
    // the datum is the stop moved by the placement transform (computation 1).
    const content = layout({ unit });
    const ev = evaluateTemplate(content);
    const scene = buildStationScene(content, ev.stations, ev.origin, 'in', 'in', 0.14);
    expect(scene.origin.x).toBeCloseTo(12, 9);
    expect(scene.origin.y).toBeCloseTo(10, 9);
    const b = placementTransform({ col: 10, row: 2 }, 90, 2);
    const expected = new Map([
      ['A:0', applyTransform(placementTransform({ col: 1, row: 1 }, 0, 2), rail.stops[0]!)],
      ['A:2', applyTransform(placementTransform({ col: 1, row: 1 }, 0, 2), rail.stops[2]!)],
      ['B:0', applyTransform(b, rail.stops[0]!)],
    ]);
    for (const [id, p] of expected) {
      const s = scene.stations.find((st) => st.id === id)!;
      expect(s.datum.x).toBeCloseTo(p.x, 9);
      expect(s.datum.y).toBeCloseTo(p.y, 9);
    }
  });

  it('draws the machining order through the datums in number order, and titles each station', () => {
    const content = layout();
    const ev = evaluateTemplate(content);
    const shuffled = [...ev.stations].reverse();
    const scene = buildStationScene(content, shuffled, ev.origin, 'in', 'in', 0.14);
    expect(scene.stations.map((s) => s.number)).toEqual(ev.stations.map((s) => s.number).sort((a, b) => a - b));
    expect(scene.order).toBe(polylinePathData(scene.stations.map((s) => s.datum)));
    const a0 = scene.stations.find((s) => s.id === 'A:0')!;
    // A:0 datum (2.5, 2.375) − origin (12, 10) = (−9.5, −7.625); four decimals in inches (display precision, shared/units/units.ts)
    expect(a0.title).toContain('X -9.5000 in, Y -7.6250 in from the shared offset');
  });

  it('names the shared offset by its name when it has one', () => {
    const content = layout({ sharedOffset: { kind: 'hole', hole: { col: 6, row: 5 }, name: 'G54' } });
    const ev = evaluateTemplate(content);
    expect(buildStationScene(content, ev.stations, ev.origin, 'in', 'mm', 0.14).offsetName).toBe('G54');
  });
});

describe('comparison', () => {
  it('matches placements by id: moved, turned in place, added, removed', () => {
    const older = buildPlateScene(layout());
    const newer = buildPlateScene(layout({
      placements: [
        { id: 'A', component: 'CR-8', hole: { col: 1, row: 2 }, rotation: 0 }, // one row up
        { id: 'B', component: 'CR-8', hole: { col: 10, row: 2 }, rotation: 270 }, // turned
        { id: 'N', component: 'ST-1', hole: { col: 14, row: 8 }, rotation: 0 },
      ],
    }));
    const c = comparePlacements(older, newer);
    expect(c.moved).toEqual([{ id: 'A', code: 'CR-8', from: { x: 2, y: 2 }, to: { x: 2, y: 4 } }]);
    expect(c.turned).toEqual(['B']);
    expect(c.added).toEqual(['N']);
    expect(c.removed).toEqual(['S']);
  });

  it('compares an older millimetre plate in the newer plate\'s unit', () => {
    const older = buildPlateScene(layout({ plate: { code: 'GP', unit: 'mm', pitch: 50.8, columns: 16, rows: 10 } }), 'in');
    const newer = buildPlateScene(layout());
    // 50.8 mm is exactly 2 in, so nothing moved
    expect(comparePlacements(older, newer).moved).toEqual([]);
  });
});

describe('problems', () => {
  it('labels each placement at fault in words, from evaluateTemplate\'s problems', () => {
    const content = layout({
      placements: [
        { id: 'A', component: 'CR-8', hole: { col: 1, row: 1 }, rotation: 0 },
        { id: 'C', component: 'CR-8', hole: { col: 1, row: 1 }, rotation: 90 },
      ],
    });
    const faults = faultsByPlacement(evaluateTemplate(content).problems);
    const c = faults.get('C')!;
    expect(c.label).toBe('C: hole taken by A, overlaps A');
    expect(c.messages.length).toBeGreaterThanOrEqual(2);
    expect(faults.has('A')).toBe(false); // the later placement is the one at fault
  });

  it('accepts bare placement ids', () => {
    expect(faultsByPlacement(['P1', 'P1']).get('P1')).toEqual({ id: 'P1', label: 'P1', messages: [] });
  });
});

describe('words', () => {
  it('reads the pointer from the shared offset in the display unit, with the nearest hole', () => {
    const scene = buildPlateScene(layout());
    const origin = { x: 12, y: 10 };
    // 7.25 in = 184.150 mm (NIST SP 811: 1 in = 25.4 mm exactly); three decimals in mm (shared/units/units.ts)
    expect(pointerReadout({ x: 19.25, y: 13.125 }, scene, origin, 'in')).toEqual({ x: '7.2500 in', y: '3.1250 in', hole: { col: 10, row: 7 } });
    expect(pointerReadout({ x: 19.25, y: 13.125 }, scene, origin, 'mm')).toMatchObject({ x: '184.150 mm', y: '79.375 mm' });
    expect(pointerReadout({ x: -1.5, y: 0 }, scene, origin, 'in').hole).toBeNull();
  });

  it('tells the drawing\'s story in its accessible name', () => {
    const content = layout();
    const ev = evaluateTemplate(content);
    const plate = buildPlateScene(content);
    const stations = buildStationScene(content, ev.stations, ev.origin, 'in', 'in', 0.14);
    expect(describeDrawing({ content, plate, stations, displayUnit: 'in', faults: 0 })).toBe(
      'Plate drawing of Drawing test on plate GP-16x10: 16 × 10 holes at 2.0000 in pitch; 3 placements and 4 stations; ' +
      'shared offset at X 12.0000 in, Y 10.0000 in from the datum hole (0, 0).',
    );
  });
});
