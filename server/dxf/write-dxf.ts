import DxfWriter, { type PolylineVertex } from 'dxf-writer/src/Drawing.js';
import { type Drawing, DrawingSchema } from './drawing';

/** $INSUNITS for Gridset's units (DXF Reference, HEADER section: 1 = inches, 4 = millimeters). */
export const INSUNITS = { in: 1, mm: 4 } as const;

/** ACI colour given to a layer that entities use but `layers` does not list. */
const DEFAULT_LAYER_COLOR = 7;

/**
 * Writes a Drawing as an ASCII DXF file in dxf-writer's AC1021 (R2007, UTF-8) format, using only
 * LINE, ARC, CIRCLE, LWPOLYLINE, POINT and TEXT entities.
 *
 * What dxf-writer 1.18.4 does and what this adds, checked against its source and output:
 * - $INSUNITS comes from setUnits (1 for Inches, 4 for Millimeters). $MEASUREMENT (0 imperial,
 *   1 metric), which some programs consult for their defaults, is not written by dxf-writer, so it
 *   is set here through its header API.
 * - LWPOLYLINE bulges are written as group 42 after each vertex's 10/20 when the vertex is given
 *   as [x, y, bulge]; nothing to add.
 * - Numbers are written with JavaScript's shortest round-trip form, so they read back exactly.
 * - dxf-writer writes values as given: a line break inside a text or layer name would split the
 *   group structure. DrawingSchema refuses those (and non-finite numbers) first; the ZodError it
 *   throws describes the bad item.
 * Layers that entities use but `layers` omits are added with ACI colour 7.
 */
export function writeDrawingDxf(input: Drawing): string {
  const drawing = DrawingSchema.parse(input);
  const dxf = new DxfWriter();
  dxf.setUnits(drawing.unit === 'in' ? 'Inches' : 'Millimeters');
  dxf.header('MEASUREMENT', [[70, drawing.unit === 'in' ? 0 : 1]]);

  const declared = new Set<string>();
  for (const layer of drawing.layers) {
    dxf.addLayer(layer.name, layer.color, 'CONTINUOUS');
    declared.add(layer.name);
  }
  const use = (name: string): void => {
    if (!declared.has(name)) {
      dxf.addLayer(name, DEFAULT_LAYER_COLOR, 'CONTINUOUS');
      declared.add(name);
    }
    dxf.setActiveLayer(name);
  };

  for (const l of drawing.lines) {
    use(l.layer);
    dxf.drawLine(l.start.x, l.start.y, l.end.x, l.end.y);
  }
  for (const a of drawing.arcs) {
    use(a.layer);
    dxf.drawArc(a.center.x, a.center.y, a.radius, a.startAngle, a.endAngle);
  }
  for (const c of drawing.circles) {
    use(c.layer);
    dxf.drawCircle(c.center.x, c.center.y, c.radius);
  }
  for (const p of drawing.polylines) {
    use(p.layer);
    const last = p.vertices.length - 1;
    const vertices = p.vertices.map((v, i): PolylineVertex => {
      // The last vertex of an open polyline starts no segment, so its bulge means nothing.
      const b = v.bulge ?? 0;
      return b !== 0 && (p.closed || i < last) ? [v.x, v.y, b] : [v.x, v.y];
    });
    dxf.drawPolyline(vertices, p.closed);
  }
  for (const p of drawing.points) {
    use(p.layer);
    dxf.drawPoint(p.x, p.y);
  }
  for (const t of drawing.texts) {
    use(t.layer);
    dxf.drawText(t.x, t.y, t.height, 0, t.text);
  }
  return dxf.toDxfString();
}
