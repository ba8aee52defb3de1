import { describe, expect, it } from 'vitest';
import type { Outline, OutlinePath } from '../../shared/schemas/geometry';
import { parseString, toPolylines } from 'dxf';
import { bulgeToSvgArc, circleData, pathData } from '../../app/lib/outline-svg';
import {
  componentWith, defaultRoles, dowelCircles, dowelsFromCircles, formatDrawingCell, formatDrawingLength, formatDrawingSize, gridOffset, groupCircles, initialMapping,
  layerMapFor, localPoint, namingProblemsByFileLayer, outlineLayers, pathsByLayer, platesOfDiameter, previewView,
  progressText, stopsFromCircles, targetName, toScreen, unsupportedText, type PlateHole,
} from '../../app/features/catalog/outline-preview';
import type { InspectedCircle, InspectedLayer } from '../../shared/schemas/dxf-inspection';
import type { Component } from '../../shared/schemas/catalog';

// The geometry of samples/jaw-rail-inch.dxf (scripts/make-samples.ts): a 12 × 1.5 in rail with
// 0.25 in corner radii, Ø0.500 dowel holes at x = 1 and 11, Ø0.531 bolt holes at 3, 5, 7, 9.
const QUARTER = Math.tan(Math.PI / 8); // bulge of a 90° arc: tan(θ/4), DXF Reference group code 42
const rail: OutlinePath = {
  layer: 'fx jr 1000', closed: true,
  points: [
    { x: 0.25, y: 0 }, { x: 11.75, y: 0, bulge: QUARTER }, { x: 12, y: 0.25 }, { x: 12, y: 1.25, bulge: QUARTER },
    { x: 11.75, y: 1.5 }, { x: 0.25, y: 1.5, bulge: QUARTER }, { x: 0, y: 1.25 }, { x: 0, y: 0.25, bulge: QUARTER },
  ],
};
const railCircles: InspectedCircle[] = [
  { x: 1, y: 0.75, r: 0.25, layer: 'DOWELS' }, { x: 11, y: 0.75, r: 0.25, layer: 'DOWELS' },
  ...[9, 3, 7, 5].map((x) => ({ x, y: 0.75, r: 0.531 / 2, layer: 'BOLTS' })),
];
const railOutline: Outline = { paths: [rail], circles: railCircles };
// The demo shop's plates (server/db/seed-demo.ts).
const plates: PlateHole[] = [
  { code: 'GP-IN-12x8', unit: 'in', holeDiameter: 0.5, pitch: 2 },
  { code: 'GP-MM-10x7', unit: 'mm', holeDiameter: 12, pitch: 50 },
];

describe('bulge → SVG arc (DXF Reference LWPOLYLINE group 42; SVG 2 arc flags)', () => {
  it('a 90° corner of radius 0.25 is an arc of radius 0.25, counter-clockwise, small', () => {
    const arc = bulgeToSvgArc({ x: 11.75, y: 0 }, { x: 12, y: 0.25 }, QUARTER)!;
    expect(arc.r).toBeCloseTo(0.25, 12);
    expect(arc).toMatchObject({ sweep: 1, largeArc: 0, x: 12, y: 0.25 });
    // Independent check by another reader: the `dxf` npm package (toPolylines, its LWPOLYLINE bulge
    // arcs) puts the same corner, written as a DXF LWPOLYLINE (DXF Reference, group codes 10/20/42),
    // on a circle of radius 0.25 about (11.75, 0.25), the corner's center by construction, and runs
    // it counter-clockwise (positive bulge) from the start to the end point.
    const lw = `0\nSECTION\n2\nENTITIES\n0\nLWPOLYLINE\n8\n0\n90\n2\n70\n0\n10\n11.75\n20\n0\n42\n${QUARTER}\n10\n12\n20\n0.25\n0\nENDSEC\n0\nEOF\n`;
    const pts = toPolylines(parseString(lw)).polylines[0]!.vertices as [number, number][];
    expect(pts.length).toBeGreaterThan(3);
    expect(pts[0]).toEqual([11.75, 0]);
    expect(pts.at(-1)).toEqual([12, 0.25]);
    for (const [x, y] of pts) expect(Math.hypot(x - 11.75, y - 0.25)).toBeCloseTo(arc.r, 9);
    const angles = pts.map(([x, y]) => Math.atan2(y - 0.25, x - 11.75));
    for (let i = 1; i < angles.length; i++) expect(angles[i]!).toBeGreaterThan(angles[i - 1]!); // counter-clockwise: sweep 1
    // and by hand: a bulge is tan(θ/4) (DXF Reference, group code 42), so θ = 4·atan(tan(π/8)) = 90°,
    // r = (chord / 2) / sin(θ / 2) = (0.25·√2 / 2) / sin 45° = 0.25, and 90° < 180° is the small arc.
    const theta = 4 * Math.atan(QUARTER);
    expect(arc.r).toBeCloseTo((Math.hypot(0.25, 0.25) / 2) / Math.sin(theta / 2), 12);
    expect(arc.largeArc).toBe(theta > Math.PI ? 1 : 0);
  });

  it('a negative bulge runs clockwise; |bulge| > 1 is more than a half circle; 1 is a half circle on the chord', () => {
    expect(bulgeToSvgArc({ x: 0, y: 0 }, { x: 1, y: 0 }, -QUARTER)!.sweep).toBe(0);
    expect(bulgeToSvgArc({ x: 0, y: 0 }, { x: 1, y: 0 }, 2)!.largeArc).toBe(1);
    const half = bulgeToSvgArc({ x: 2.05, y: 0 }, { x: 2.05, y: 0.9 }, 1)!;
    expect(half.r).toBeCloseTo(0.45, 12);
    expect(half.largeArc).toBe(0);
    expect(bulgeToSvgArc({ x: 0, y: 0 }, { x: 1, y: 0 }, 0)).toBeNull();
    expect(bulgeToSvgArc({ x: 1, y: 1 }, { x: 1, y: 1 }, 0.5)).toBeNull();
  });

  it('a closed path spells out an arced closing edge before Z, and a circle is two half arcs', () => {
    const d = pathData(rail);
    expect(d.startsWith('M0.25 0L11.75 0A0.25 0.25 0 0 1 12 0.25')).toBe(true);
    expect(d.endsWith('L0 0.25A0.25 0.25 0 0 1 0.25 0Z')).toBe(true);
    expect(pathData({ closed: true, points: [{ x: 0, y: 0 }, { x: 1, y: 0 }, { x: 1, y: 1 }] })).toBe('M0 0L1 0L1 1Z');
    expect(circleData({ x: 1, y: 0.75, r: 0.25 })).toBe('M0.75 0.75a0.25 0.25 0 1 0 0.5 0a0.25 0.25 0 1 0 -0.5 0Z');
  });
});

describe('the preview box, Y up (ISO 841: +Y away from the operator)', () => {
  it('fits the outline with a margin and flips Y: the top edge is −maxY', () => {
    const v = previewView(railOutline, 0.05)!;
    const m = 12 * 0.05;
    expect(v.minX).toBeCloseTo(-m, 12);
    expect(v.minY).toBeCloseTo(-(1.5 + m), 12);
    expect(v.width).toBeCloseTo(12 + 2 * m, 12);
    expect(v.height).toBeCloseTo(1.5 + 2 * m, 12);
    expect(v.viewBox.split(' ').map(Number)).toEqual([v.minX, v.minY, v.width, v.height]);
    // A point farther from the operator (larger y) is drawn higher on the screen (smaller SVG y).
    expect(toScreen({ x: 1, y: 1.25 }).y).toBeLessThan(toScreen({ x: 1, y: 0.25 }).y);
    expect(toScreen({ x: 1, y: 0 })).toEqual({ x: 1, y: 0 });
  });

  it('reaches arcs to their true extent: the bracket with a 0.45 radius end is 2.5 long', () => {
    const bracket: Outline = { paths: [{ closed: true, points: [{ x: 0, y: 0 }, { x: 2.05, y: 0, bulge: 1 }, { x: 2.05, y: 0.9 }, { x: 0, y: 0.9 }] }], circles: [] };
    const v = previewView(bracket, 0)!;
    expect(v.width).toBeCloseTo(2.5, 12);
    expect(v.height).toBeCloseTo(0.9, 12);
  });

  it('gives a straight line some height and an empty outline no box', () => {
    const v = previewView({ paths: [{ closed: false, points: [{ x: 0, y: 0 }, { x: 4, y: 0 }] }], circles: [] }, 0)!;
    expect(v.height).toBe(4);
    expect(previewView({ paths: [], circles: [] })).toBeNull();
  });

  it('groups path data by layer; only layers with paths or circles are stored', () => {
    const outline: Outline = { paths: [rail, { layer: 'NOTES', closed: false, points: [{ x: 0, y: 0 }, { x: 1, y: 0 }] }], circles: railCircles };
    const layers = pathsByLayer(outline);
    expect(layers.map((l) => l.layer)).toEqual(['fx jr 1000', 'NOTES', 'DOWELS', 'BOLTS']);
    expect(layers[0]!.closed).toBe(pathData(rail));
    expect(layers[1]!.open).toBe('M0 0L1 0');
    expect(layers[2]!.circles).toBe(circleData(railCircles[0]!) + circleData(railCircles[1]!));
    expect([...outlineLayers(railOutline)].sort()).toEqual(['BOLTS', 'DOWELS', 'fx jr 1000']);
  });
});

describe('circles as dowels and stops', () => {
  it('groups by diameter at display precision, smallest first, each left to right', () => {
    const groups = groupCircles(railCircles, 'in');
    expect(groups.map((g) => [g.key, g.indices])).toEqual([['0.5000', [0, 1]], ['0.5310', [3, 5, 4, 2]]]);
    // Three decimals in mm (shared/units/units DISPLAY_DECIMALS): 12.0004 and 11.9996 are one size.
    const mm = groupCircles([{ x: 0, y: 0, r: 6.0002, layer: '0' }, { x: 200, y: 0, r: 5.9998, layer: '0' }], 'mm');
    expect(mm.map((g) => [g.key, g.indices])).toEqual([['12.000', [0, 1]]]);
  });

  it('matches a plate dowel-hole diameter across units (0.5 in = 12.7 mm, NIST SP 811 exact inch)', () => {
    const [dowels, bolts] = groupCircles(railCircles, 'in');
    expect(platesOfDiameter(dowels!, 'in', plates).map((p) => p.code)).toEqual(['GP-IN-12x8']);
    expect(platesOfDiameter(bolts!, 'in', plates)).toEqual([]);
    expect(platesOfDiameter(dowels!, null, plates)).toEqual([]);
    const metric = groupCircles([{ x: 0, y: 0, r: 6.35, layer: '0' }, { x: 0, y: 0, r: 6, layer: '0' }], 'mm');
    expect(metric.map((g) => platesOfDiameter(g, 'mm', plates).map((p) => p.code))).toEqual([['GP-MM-10x7'], ['GP-IN-12x8']]);
  });

  it('guesses the plate-sized circles as dowels, the leftmost the primary; nothing without a match', () => {
    const groups = groupCircles(railCircles, 'in');
    expect(defaultRoles(groups, 'in', plates)).toEqual({ dowelKey: '0.5000', dowels: [0, 1], primary: 0, stops: [] });
    expect(defaultRoles(groups, 'in', [])).toEqual({ dowelKey: null, dowels: [], primary: null, stops: [] });
  });

  it('puts the primary first at exactly (0, 0) and the others relative to it', () => {
    expect(dowelsFromCircles(railCircles, 0, [0, 1], 'in', 'in')).toEqual([{ x: 0, y: 0 }, { x: 10, y: 0 }]);
    expect(dowelsFromCircles(railCircles, 1, [1, 0], 'in', 'in')).toEqual([{ x: 0, y: 0 }, { x: -10, y: 0 }]);
    // 200 mm = 200 / 25.4 in (NIST SP 811: 1 in = 25.4 mm exactly).
    const mmRail: InspectedCircle[] = [{ x: 12, y: 10, r: 6, layer: 'FX-CRM-200' }, { x: 212, y: 10, r: 6, layer: 'FX-CRM-200' }];
    const inch = dowelsFromCircles(mmRail, 0, [0, 1], 'mm', 'in');
    expect(inch[0]).toEqual({ x: 0, y: 0 });
    expect(inch[1]!.x).toBeCloseTo(200 / 25.4, 12);
    expect(inch[1]!.y).toBe(0);
    expect(localPoint({ x: 1, y: 0.75 }, { x: 1, y: 0.75 }, 'in', 'mm')).toEqual({ x: 0, y: 0 });
    expect(localPoint({ x: 11, y: 0.75 }, { x: 1, y: 0.75 }, 'in', 'mm')).toEqual({ x: 254, y: 0 });
  });

  it('turns ticked circles into stops at angle 0, relative to the primary', () => {
    expect(stopsFromCircles(railCircles, 0, [3, 2], 'in', 'in')).toEqual([{ x: 2, y: 0, angle: 0 }, { x: 8, y: 0, angle: 0 }]);
    expect(stopsFromCircles(railCircles, 99, [3], 'in', 'in')).toEqual([]);
  });

  it('says whether a dowel lands on a grid hole (within GRID_TOLERANCE, shared/units/units)', () => {
    expect(gridOffset({ x: 10, y: 0 }, 2, 'in')).toEqual({ on: true, off: 0, steps: { x: 5, y: 0 } });
    const off = gridOffset({ x: 200 / 25.4, y: 0 }, 2, 'in');
    expect(off.on).toBe(false);
    expect(off.off).toBeCloseTo(8 - 200 / 25.4, 12);
    expect(gridOffset({ x: 10.0004, y: 0 }, 2, 'in').on).toBe(true);
  });

  it('marks the stored outline circles that sit on the dowels', () => {
    const local: Outline = { paths: [], circles: [{ x: 2, y: 0, r: 0.26 }, { x: 0, y: 0, r: 0.25 }, { x: 10, y: 0, r: 0.25 }] };
    expect(dowelCircles(local, [{ x: 0, y: 0 }, { x: 10, y: 0 }, { x: 4, y: 0 }], 'in')).toEqual([{ index: 1, dowel: 0 }, { index: 2, dowel: 1 }]);
  });
});

describe('layer mapping', () => {
  const layers: InspectedLayer[] = [
    { name: 'FX-JR-1000', entities: 1, ok: true, problems: [], proposed: 'FX-JR-1000' },
    { name: 'fx jr 1000', entities: 1, ok: false, problems: [{ token: null, message: 'Use upper case.' }], proposed: 'FX-JR-1000' },
    { name: 'DOWELS', entities: 2, ok: false, problems: [{ token: null, message: 'Does not match any pattern.' }], proposed: null },
  ];

  it('offers the file name when it fits, the proposal when there is one, else nothing', () => {
    expect(initialMapping(layers)).toEqual({ 'FX-JR-1000': 'FX-JR-1000', 'fx jr 1000': 'FX-JR-1000', DOWELS: '' });
  });

  it('sends only the layers whose name changes; an empty field keeps the file name', () => {
    const mapping = { 'FX-JR-1000': 'FX-JR-1000', 'fx jr 1000': ' FX-JR-1000 ', DOWELS: '' };
    expect(targetName('DOWELS', mapping)).toBe('DOWELS');
    expect(targetName('fx jr 1000', mapping)).toBe('FX-JR-1000');
    expect(layerMapFor(mapping)).toEqual({ 'fx jr 1000': 'FX-JR-1000' });
  });

  it('puts a naming refusal back on every file layer that maps to the refused name', () => {
    const problems = [{ token: null, message: 'Layer names are upper case.' }];
    const details = { layers: [{ layer: 'jaw', problems, proposed: 'JAW' }] };
    const mapping = { DOWELS: 'jaw', BOLTS: 'jaw', 'fx jr 1000': 'FX-JR-1000' };
    expect(namingProblemsByFileLayer(details, mapping, Object.keys(mapping))).toEqual({ DOWELS: problems, BOLTS: problems });
    expect(namingProblemsByFileLayer({ line: 3 }, mapping, Object.keys(mapping))).toBeNull();
  });
});

describe('words', () => {
  it('lists what was not read, most frequent first as the server sorts them', () => {
    expect(unsupportedText([{ type: 'HATCH', count: 3 }, { type: 'DIMENSION', count: 1 }])).toBe('not read: 3 HATCH, 1 DIMENSION');
    expect(unsupportedText([])).toBeNull();
  });

  it('says how far the upload is, and what follows once every byte is sent', () => {
    expect(progressText(null, 'Reading the drawing…')).toBe('Uploading…');
    expect(progressText(0.999, 'Reading the drawing…')).toBe('Uploading… 99 %');
    expect(progressText(0.42, 'Reading the drawing…')).toBe('Uploading… 42 %');
    expect(progressText(1, 'Reading the drawing…')).toBe('Reading the drawing…');
  });

  it('formats lengths with their unit, and says so when the file does not give one', () => {
    expect(formatDrawingLength(10, 'in')).toBe('10.0000 in');
    expect(formatDrawingLength(200, 'mm')).toBe('200.000 mm');
    expect(formatDrawingLength(0.5, null)).toBe('0.5000 (unit not known)');
    expect(formatDrawingCell(0.5, null)).toBe('0.5000');
    expect(formatDrawingCell(12, 'mm')).toBe('12.000 mm');
    expect(formatDrawingSize(12, 1.5, 'in')).toBe('12.0000 in × 1.5000 in');
    expect(formatDrawingSize(6, 4, null)).toBe('6.0000 × 4.0000 (unit not known)');
  });

  it('keeps everything of the component but the dowels and stops when setting them', () => {
    const c = { id: 3, code: 'JR-1.000', kind: 'jaw-rail', name: 'Jaw rail', unit: 'in', dowels: [{ x: 0, y: 0 }, { x: 8, y: 0 }], stops: [], jawFaces: [{ x: 0, y: -0.625, normal: 270 }], clamp: null, outline: railOutline, layer: 'FX-JR-1000', notes: 'n', seatHeight: 0, jawTop: null, outlineFile: null, usedBy: 0, createdAt: '', updatedAt: '' } satisfies Component;
    const input = componentWith(c, [{ x: 0, y: 0 }, { x: 10, y: 0 }], []);
    expect(input).toEqual({ code: 'JR-1.000', kind: 'jaw-rail', name: 'Jaw rail', unit: 'in', dowels: [{ x: 0, y: 0 }, { x: 10, y: 0 }], stops: [], jawFaces: c.jawFaces, clamp: null, outline: railOutline, layer: 'FX-JR-1000', notes: 'n' });
  });
});
