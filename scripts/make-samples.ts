// Writes the sample DXF files in samples/ (npm run samples). Three come from Gridset's own writer
// (server/dxf/write-dxf.ts); the fourth is written by hand as DXF text because the writer has no
// blocks, and is read back with server/dxf/read-dxf.ts so a broken sample is never written.
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { sweepToBulge } from '../shared/geometry/bulge';
import { emptyDrawing, type Drawing, type DrawingPolyline } from '../server/dxf/drawing';
import { writeDrawingDxf } from '../server/dxf/write-dxf';
import { inspectDxf } from '../server/dxf/read-dxf';
import { projectRoot } from './build-client';

const samplesDir = path.join(projectRoot, 'samples');

/** Bulge of a 90° arc: tan(90°/4) (DXF Reference, LWPOLYLINE group code 42). */
const QUARTER = sweepToBulge(Math.PI / 2);

/** A closed w × h rectangle from (x0, y0) with corners rounded to r by bulges, counter-clockwise. */
function roundedRect(layer: string, x0: number, y0: number, w: number, h: number, r: number): DrawingPolyline {
  const [x1, y1] = [x0 + w, y0 + h];
  return {
    layer,
    closed: true,
    vertices: [
      { x: x0 + r, y: y0 }, { x: x1 - r, y: y0, bulge: QUARTER },
      { x: x1, y: y0 + r }, { x: x1, y: y1 - r, bulge: QUARTER },
      { x: x1 - r, y: y1 }, { x: x0 + r, y: y1, bulge: QUARTER },
      { x: x0, y: y1 - r }, { x: x0, y: y0 + r, bulge: QUARTER },
    ],
  };
}

/**
 * Jaw rail, inch: 12.000 × 1.500 with 0.250 corner radii; two Ø0.500 dowel holes 10.000 apart
 * at x = 1 and 11 (five 2.000 in grid pitches), four Ø0.531 bolt holes (17/32, clearance for
 * 1/2-13 screws, common practice) on the grid between them. The layers are named as a drafter
 * might, not as the shop's convention wants, so the mapping has something to do.
 */
function jawRailInch(): Drawing {
  const d = emptyDrawing('in');
  d.layers = [{ name: 'fx jr 1000', color: 7 }, { name: 'DOWELS', color: 1 }, { name: 'BOLTS', color: 5 }, { name: 'NOTES', color: 3 }];
  d.polylines.push(roundedRect('fx jr 1000', 0, 0, 12, 1.5, 0.25));
  for (const x of [1, 11]) d.circles.push({ layer: 'DOWELS', center: { x, y: 0.75 }, radius: 0.25 });
  for (const x of [3, 5, 7, 9]) d.circles.push({ layer: 'BOLTS', center: { x, y: 0.75 }, radius: 0.531 / 2 });
  d.texts.push({ layer: 'NOTES', x: 0, y: -0.4, height: 0.15, text: 'JAW RAIL 12 x 1.5 - DOWELS 0.500 ON 10.000' });
  return d;
}

/**
 * Center rail, millimetres ($INSUNITS 4): 224 × 20 with two Ø12 dowel holes 200 apart (four
 * 50 mm grid pitches) and four Ø6 stop-pin holes at 50 mm steps near the front face.
 */
function centerRailMm(): Drawing {
  const d = emptyDrawing('mm');
  d.layers = [{ name: 'FX-CRM-200', color: 7 }, { name: 'STOP PINS', color: 2 }];
  d.polylines.push({ layer: 'FX-CRM-200', closed: true, vertices: [{ x: 0, y: 0 }, { x: 224, y: 0 }, { x: 224, y: 20 }, { x: 0, y: 20 }] });
  for (const x of [12, 212]) d.circles.push({ layer: 'FX-CRM-200', center: { x, y: 10 }, radius: 6 });
  for (let k = 0; k < 4; k++) d.circles.push({ layer: 'STOP PINS', center: { x: 37 + 50 * k, y: 16 }, radius: 3 });
  return d;
}

/**
 * Part outline, inch: a 2.500 × 0.900 bracket whose right end is a full 0.450 radius (a half
 * circle, bulge 1), with a Ø0.266 hole at the center of that radius and a Ø0.201 hole near the
 * square end. Its lower-left corner is the part's datum corner.
 */
function partOutlineInch(): Drawing {
  const d = emptyDrawing('in');
  d.layers = [{ name: 'PART-10452-A', color: 7 }];
  d.polylines.push({
    layer: 'PART-10452-A',
    closed: true,
    vertices: [{ x: 0, y: 0 }, { x: 2.05, y: 0, bulge: 1 }, { x: 2.05, y: 0.9 }, { x: 0, y: 0.9 }],
  });
  d.circles.push({ layer: 'PART-10452-A', center: { x: 2.05, y: 0.45 }, radius: 0.133 });
  d.circles.push({ layer: 'PART-10452-A', center: { x: 0.4, y: 0.45 }, radius: 0.1005 });
  return d;
}

/** Group code / value pairs as DXF text, one per line (DXF Reference, "DXF Format"). */
const dxf = (pairs: [number, string | number][]) => pairs.map(([c, v]) => `${String(c).padStart(3)}\n${v}`).join('\n');

/**
 * A 6.000 × 4.000 subplate, hand-written as R12 DXF (AC1009), that does not say its unit (no
 * $INSUNITS: R12 has none), with a block: DOWEL_PAIR holds two Ø0.500 holes 2.000 apart on
 * layer 0, so they take the layer of each INSERT (DXF Reference, BLOCK). It is inserted twice,
 * at (1, 1) and, rotated 90°, at (5, 1): holes at (1, 1), (3, 1), (5, 1) and (5, 3). A DIMENSION
 * shows what the screen says of entities it does not read.
 */
function subplateBlocksText(): string {
  const polyline = (layer: string, pts: [number, number][]): [number, string | number][] => [
    [0, 'POLYLINE'], [8, layer], [66, 1], [10, 0], [20, 0], [30, 0], [70, 1],
    ...pts.flatMap(([x, y]): [number, string | number][] => [[0, 'VERTEX'], [8, layer], [10, x], [20, y], [30, 0]]),
    [0, 'SEQEND'], [8, layer],
  ];
  const circle = (layer: string, x: number, y: number, r: number): [number, string | number][] => [[0, 'CIRCLE'], [8, layer], [10, x], [20, y], [30, 0], [40, r]];
  return `${dxf([
    [0, 'SECTION'], [2, 'HEADER'], [9, '$ACADVER'], [1, 'AC1009'], [0, 'ENDSEC'],
    [0, 'SECTION'], [2, 'TABLES'],
    [0, 'TABLE'], [2, 'LAYER'], [70, 4],
    [0, 'LAYER'], [2, '0'], [70, 0], [62, 7], [6, 'CONTINUOUS'],
    [0, 'LAYER'], [2, 'SUBPLATE'], [70, 0], [62, 7], [6, 'CONTINUOUS'],
    [0, 'LAYER'], [2, 'DOWEL HOLES'], [70, 0], [62, 1], [6, 'CONTINUOUS'],
    [0, 'LAYER'], [2, 'DIMS'], [70, 0], [62, 3], [6, 'CONTINUOUS'],
    [0, 'ENDTAB'], [0, 'ENDSEC'],
    [0, 'SECTION'], [2, 'BLOCKS'],
    [0, 'BLOCK'], [8, '0'], [2, 'DOWEL_PAIR'], [70, 0], [10, 0], [20, 0], [30, 0], [3, 'DOWEL_PAIR'],
    ...circle('0', 0, 0, 0.25),
    ...circle('0', 2, 0, 0.25),
    [0, 'ENDBLK'], [8, '0'],
    [0, 'ENDSEC'],
    [0, 'SECTION'], [2, 'ENTITIES'],
    ...polyline('SUBPLATE', [[0, 0], [6, 0], [6, 4], [0, 4]]),
    [0, 'INSERT'], [8, 'DOWEL HOLES'], [2, 'DOWEL_PAIR'], [10, 1], [20, 1], [30, 0],
    [0, 'INSERT'], [8, 'DOWEL HOLES'], [2, 'DOWEL_PAIR'], [10, 5], [20, 1], [30, 0], [50, 90],
    // A linear dimension of the 6.000 width: Gridset reads no dimensions, so the screen lists it as not read.
    [0, 'DIMENSION'], [8, 'DIMS'], [10, 6], [20, -0.75], [30, 0], [11, 3], [21, -0.75], [31, 0], [70, 0], [1, '6.000'],
    [13, 0], [23, 0], [33, 0], [14, 6], [24, 0], [34, 0],
    [0, 'ENDSEC'],
    [0, 'EOF'],
  ])}\n`;
}

function main() {
  mkdirSync(samplesDir, { recursive: true });
  const files: [string, string][] = [
    ['jaw-rail-inch.dxf', writeDrawingDxf(jawRailInch())],
    ['center-rail-mm.dxf', writeDrawingDxf(centerRailMm())],
    ['part-outline-inch.dxf', writeDrawingDxf(partOutlineInch())],
    ['subplate-blocks-no-unit.dxf', subplateBlocksText()],
  ];
  for (const [name, text] of files) {
    // Every sample must read back: a sample that fails in the app is worse than none.
    const r = inspectDxf(text);
    if (name.startsWith('subplate')) {
      const holes = r.circles.map((c) => `${c.x},${c.y}`).sort().join(' ');
      if (holes !== '1,1 3,1 5,1 5,3' || r.unit !== null || r.unsupported[0]?.type !== 'DIMENSION') throw new Error(`${name} reads back wrong: holes ${holes}, unit ${r.unit}`);
    }
    writeFileSync(path.join(samplesDir, name), text);
    console.log(`${name}: ${r.unit ?? 'no unit'}, ${r.entities} entities, ${r.circles.length} circles, layers ${r.layers.map((l) => l.name).join(', ')}`);
  }
}

main();
