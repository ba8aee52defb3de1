import { z } from 'zod';
import { finite, positive, type Unit, UnitSchema } from '../../shared/schemas/common';
import { OutlineVertexSchema } from '../../shared/schemas/geometry';
import type { DxfInspection } from './read-dxf';

/**
 * A neutral 2D drawing that Gridset writes as DXF or SVG: plain lines, arcs, circles,
 * polylines with bulges, points and one-line texts, each on a layer, in one unit.
 */

/** Characters a DXF symbol-table name may not hold, and line breaks, which would split a group. */
const FORBIDDEN_IN_NAME = /[<>/\\":;?*|=`\r\n]/;

const LayerName = z
  .string()
  .min(1, 'A layer needs a name.')
  .max(255, 'Layer names are at most 255 characters.')
  .refine((s) => !FORBIDDEN_IN_NAME.test(s), 'Layer names may not contain < > / \\ " : ; ? * | = ` or line breaks.')
  .refine((s) => s.trim() === s, 'Layer names may not start or end with blanks.');

const xy = z.object({ x: finite('x'), y: finite('y') });

export const DrawingLayerSchema = z.object({
  name: LayerName,
  /** AutoCAD Color Index 1–255 (1 red, 2 yellow, 3 green, 4 cyan, 5 blue, 6 magenta, 7 white/black). */
  color: z.number().int('A layer colour is a whole ACI number.').min(1, 'Layer colours run from 1 to 255.').max(255, 'Layer colours run from 1 to 255.'),
});

export const DrawingLineSchema = z.object({ layer: LayerName, start: xy, end: xy });

/** Angles in degrees, counter-clockwise from +X, as in the DXF ARC entity (groups 50 and 51). */
export const DrawingArcSchema = z.object({
  layer: LayerName,
  center: xy,
  radius: positive('Arc radius'),
  startAngle: finite('Arc start angle'),
  endAngle: finite('Arc end angle'),
});

export const DrawingCircleSchema = z.object({ layer: LayerName, center: xy, radius: positive('Circle radius') });

/** Vertices carry DXF bulges: tan(¼ of the included angle), negative when clockwise. */
export const DrawingPolylineSchema = z.object({
  layer: LayerName,
  closed: z.boolean(),
  vertices: z.array(OutlineVertexSchema).min(2, 'A polyline needs at least two vertices.'),
});

export const DrawingPointSchema = z.object({ layer: LayerName, x: finite('Point x'), y: finite('Point y') });

export const DrawingTextSchema = z.object({
  layer: LayerName,
  x: finite('Text x'),
  y: finite('Text y'),
  height: positive('Text height'),
  text: z
    .string()
    .max(2000, 'A text is at most 2000 characters.')
    .refine((s) => !/[\r\n]/.test(s), 'A DXF TEXT holds one line: no line breaks.'),
});

export const DrawingSchema = z.object({
  unit: UnitSchema,
  layers: z.array(DrawingLayerSchema),
  lines: z.array(DrawingLineSchema),
  arcs: z.array(DrawingArcSchema),
  circles: z.array(DrawingCircleSchema),
  polylines: z.array(DrawingPolylineSchema),
  points: z.array(DrawingPointSchema),
  texts: z.array(DrawingTextSchema),
});

export type DrawingLayer = z.infer<typeof DrawingLayerSchema>;
export type DrawingLine = z.infer<typeof DrawingLineSchema>;
export type DrawingArc = z.infer<typeof DrawingArcSchema>;
export type DrawingCircle = z.infer<typeof DrawingCircleSchema>;
export type DrawingPolyline = z.infer<typeof DrawingPolylineSchema>;
export type DrawingPoint = z.infer<typeof DrawingPointSchema>;
export type DrawingText = z.infer<typeof DrawingTextSchema>;
export type Drawing = z.infer<typeof DrawingSchema>;

/** A drawing with nothing in it. */
export function emptyDrawing(unit: Unit): Drawing {
  return { unit, layers: [], lines: [], arcs: [], circles: [], polylines: [], points: [], texts: [] };
}

/**
 * What inspectDxf read, as a Drawing (for a preview or a cleaned-up copy): paths become
 * polylines, circles circles, points points, one-line notes texts (a multi-line note becomes one
 * text per line). Every layer gets `color` (ACI, default 7). The unit is the caller's, since a
 * DXF file may not say.
 */
export function drawingFromInspection(result: DxfInspection, unit: Unit, color = 7): Drawing {
  const d = emptyDrawing(unit);
  const names = new Set<string>(result.layers.map((l) => l.name));
  const layer = (name: string | undefined): string => {
    const n = name && !FORBIDDEN_IN_NAME.test(name) && name.trim() === name ? name : '0';
    names.add(n);
    return n;
  };
  for (const p of result.outline.paths) {
    d.polylines.push({ layer: layer(p.layer), closed: p.closed, vertices: p.points.map((v) => ({ ...v })) });
  }
  for (const c of result.outline.circles) d.circles.push({ layer: layer(c.layer), center: { x: c.x, y: c.y }, radius: c.r });
  for (const p of result.points) d.points.push({ layer: layer(p.layer), x: p.x, y: p.y });
  for (const n of result.notes) {
    if (!(n.height > 0)) continue;
    n.text.split(/\r?\n/).forEach((line, i) => {
      if (line.trim() !== '') d.texts.push({ layer: layer(n.layer), x: n.x, y: n.y - i * n.height * 1.5, height: n.height, text: line });
    });
  }
  d.layers = [...names].filter((n) => !FORBIDDEN_IN_NAME.test(n) && n !== '').map((name) => ({ name, color }));
  return d;
}
