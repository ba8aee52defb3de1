import { z } from 'zod';
import { finite, plainText, positive } from './common';
import { LIMITS, count } from './limits';

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
  layer: plainText('Layer', 255).optional(),
  closed: z.boolean(),
  points: z
    .array(OutlineVertexSchema)
    .min(2, 'A path needs at least two points.')
    .max(LIMITS.outlineVertices, `A path may have at most ${count(LIMITS.outlineVertices)} points.`),
});
export type OutlinePath = z.infer<typeof OutlinePathSchema>;

export const OutlineCircleSchema = z.object({
  layer: plainText('Layer', 255).optional(),
  x: finite('Circle x'),
  y: finite('Circle y'),
  r: positive('Circle radius'),
});
export type OutlineCircle = z.infer<typeof OutlineCircleSchema>;

export const OutlineSchema = z
  .object({
    paths: z.array(OutlinePathSchema).max(LIMITS.outlinePaths, `An outline may have at most ${count(LIMITS.outlinePaths)} paths.`),
    circles: z.array(OutlineCircleSchema).max(LIMITS.outlineCircles, `An outline may have at most ${count(LIMITS.outlineCircles)} circles.`),
  })
  .superRefine((o, ctx) => {
    const vertices = o.paths.reduce((n, p) => n + p.points.length, 0);
    if (vertices > LIMITS.outlineVertices) {
      ctx.addIssue({ code: 'custom', path: ['paths'], message: `The outline has ${count(vertices)} vertices; at most ${count(LIMITS.outlineVertices)} are kept for one outline. Simplify the drawing.` });
    }
  });
export type Outline = z.infer<typeof OutlineSchema>;
