import type { Point } from '../../shared/schemas/common';
import type { Outline } from '../../shared/schemas/geometry';
import type { Station, TemplateContent } from '../../shared/schemas/template';
import type { TemplateEvaluation } from '../../shared/stations/evaluate-template';
import { componentGeometryIn } from '../../shared/geometry/component-geometry';
import { applyTransform, cosSinDeg, placementTransform, type RigidTransform } from '../../shared/geometry/transform';
import { DRAWING_LAYERS, componentLayer } from '../../shared/interchange/drawing-layers';
import { draftMark, type MarkedVersion } from '../../shared/interchange/draft-mark';
import { emptyDrawing, type Drawing } from '../dxf/drawing';

export interface PartOnStations {
  /** The part's outline with its datum corner at (0, 0), in the template's unit. */
  outline: Outline;
  layer: string;
}

/**
 * A template (or a job: with the part drawn at every station) as a neutral drawing whose origin
 * is the shared work offset, so it drops into a CAM file with the work offset at the drawing
 * origin. Plate coordinates minus the shared offset origin; the part is turned by each station's C.
 * Given the version (`source`) and it is not released, its draft mark is written as one text on a
 * layer of its own above the plate's far edge, as wide as the plate at most.
 */
export function templateDrawing(content: TemplateContent, evaluation: Pick<TemplateEvaluation, 'stations' | 'origin'>, part?: PartOnStations, source?: MarkedVersion): Drawing {
  const { plate } = content;
  const d = emptyDrawing(content.unit);
  const o = evaluation.origin;
  const shift = (p: Point): Point => ({ x: p.x - o.x, y: p.y - o.y });
  const pitch = plate.pitch;
  const margin = plate.edgeMargin ?? pitch / 2;
  const size = pitch / 8;

  // ACI colours: 8 grey for the plate, 9 light grey holes, 1 red origin, 3 green stations, 7 text, 5 blue components, 6 magenta parts.
  d.layers.push({ name: DRAWING_LAYERS.plate, color: 8 }, { name: DRAWING_LAYERS.holes, color: 9 }, { name: DRAWING_LAYERS.origin, color: 1 }, { name: DRAWING_LAYERS.stations, color: 3 }, { name: DRAWING_LAYERS.numbers, color: 7 });

  const x1 = (plate.columns - 1) * pitch + margin;
  const y1 = (plate.rows - 1) * pitch + margin;
  d.polylines.push({ layer: DRAWING_LAYERS.plate, closed: true, vertices: [shift({ x: -margin, y: -margin }), shift({ x: x1, y: -margin }), shift({ x: x1, y: y1 }), shift({ x: -margin, y: y1 })] });
  const holeR = (plate.holeDiameter || pitch / 4) / 2;
  for (let c = 0; c < plate.columns; c++) for (let r = 0; r < plate.rows; r++) d.circles.push({ layer: DRAWING_LAYERS.holes, center: shift({ x: c * pitch, y: r * pitch }), radius: holeR });

  const byCode = new Map(content.components.map((c) => [c.code, c]));
  const layersSeen = new Set<string>();
  for (const p of content.placements) {
    const c = byCode.get(p.component);
    if (!c) continue;
    const layer = componentLayer(c);
    if (!layersSeen.has(layer)) { layersSeen.add(layer); d.layers.push({ name: layer, color: 5 }); }
    const g = componentGeometryIn(c, plate.unit);
    const t = placementTransform(p.hole, p.rotation, pitch);
    pushOutline(d, g.outline, layer, (q) => shift(applyTransform(t, q)));
    if (!g.outline) for (const dw of g.dowels) d.circles.push({ layer, center: shift(applyTransform(t, dw)), radius: holeR * 0.8 });
    const label = shift(applyTransform(t, g.dowels[0]!));
    d.texts.push({ layer, x: label.x + size, y: label.y + size, height: size * 1.2, text: `${p.id} ${c.code}` });
  }

  // The shared offset: crossed axes at the drawing origin with its name.
  d.lines.push({ layer: DRAWING_LAYERS.origin, start: { x: -pitch / 2, y: 0 }, end: { x: pitch / 2, y: 0 } }, { layer: DRAWING_LAYERS.origin, start: { x: 0, y: -pitch / 2 }, end: { x: 0, y: pitch / 2 } });
  d.texts.push({ layer: DRAWING_LAYERS.origin, x: size, y: -size * 2.5, height: size * 1.5, text: content.sharedOffset.name || 'SHARED OFFSET' });

  if (part) d.layers.push({ name: part.layer, color: 6 });
  for (const s of evaluation.stations) {
    d.points.push({ layer: DRAWING_LAYERS.stations, x: s.x, y: s.y });
    d.lines.push({ layer: DRAWING_LAYERS.stations, start: { x: s.x - size, y: s.y }, end: { x: s.x + size, y: s.y } }, { layer: DRAWING_LAYERS.stations, start: { x: s.x, y: s.y - size }, end: { x: s.x, y: s.y + size } });
    d.texts.push({ layer: DRAWING_LAYERS.numbers, x: s.x + size * 0.6, y: s.y + size * 0.6, height: size * 1.4, text: String(s.number) });
    if (part) pushOutline(d, part.outline, part.layer, stationTransform(s));
  }

  const mark = source ? draftMark(source) : null;
  if (mark) {
    // SVG and most CAD fonts set a capital about 0.6 of the text height wide (drawing-svg.ts boxes texts the same way).
    const height = Math.min(pitch / 4, (x1 + margin) / (0.6 * mark.length));
    const corner = shift({ x: -margin, y: y1 + height });
    d.layers.push({ name: DRAWING_LAYERS.draft, color: 7 });
    d.texts.push({ layer: DRAWING_LAYERS.draft, x: corner.x, y: corner.y, height, text: mark });
  }
  return d;
}

/** Part-local (datum at 0,0) to drawing coordinates: turned by the station's C, moved to its datum. */
function stationTransform(s: Station): (p: Point) => Point {
  const { cos, sin } = cosSinDeg(s.c);
  const t: RigidTransform = { cos, sin, tx: s.x, ty: s.y, degrees: s.c };
  return (p) => applyTransform(t, p);
}

function pushOutline(d: Drawing, outline: Outline | null, layer: string, map: (p: Point) => Point) {
  if (!outline) return;
  for (const path of outline.paths) {
    // A proper rotation keeps every arc's turning sense, so bulges carry over unchanged.
    d.polylines.push({ layer, closed: path.closed, vertices: path.points.map((v) => ({ ...map(v), ...(v.bulge ? { bulge: v.bulge } : {}) })) });
  }
  for (const c of outline.circles) d.circles.push({ layer, center: map(c), radius: c.r });
}
