import { z } from 'zod';
import { finite, positive } from './common';

/**
 * Outline geometry, in the owning object's unit. Paths are polylines whose vertices may carry a
 * DXF-style bulge (tan of a quarter of the included angle of the arc to the next vertex,
 * negative when clockwise — DXF Reference, LWPOLYLINE group code 42), so lines, arcs and
 * rounded rectangles share one shape. Circles are kept apart because holes are circles.
 */
export const OutlineVertexSchema = z.object({
  x: finite('Vertex x'),
  y: finite('Vertex y'),
  bulge: finite('Bulge').optional(),
});
export type OutlineVertex = z.infer<typeof OutlineVertexSchema>;

export const OutlinePathSchema = z.object({
  layer: z.string().max(255).optional(),
  closed: z.boolean(),
  points: z.array(OutlineVertexSchema).min(2, 'A path needs at least two points.'),
});
export type OutlinePath = z.infer<typeof OutlinePathSchema>;

export const OutlineCircleSchema = z.object({
  layer: z.string().max(255).optional(),
  x: finite('Circle x'),
  y: finite('Circle y'),
  r: positive('Circle radius'),
});
export type OutlineCircle = z.infer<typeof OutlineCircleSchema>;

export const OutlineSchema = z.object({
  paths: z.array(OutlinePathSchema).max(100_000),
  circles: z.array(OutlineCircleSchema).max(100_000),
});
export type Outline = z.infer<typeof OutlineSchema>;
