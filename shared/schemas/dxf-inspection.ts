import { z } from 'zod';
import { UnitSchema } from './common';
import { NamingProblemSchema } from './naming';

/**
 * The answer of POST /api/dxf/inspect (server/routes/dxf.ts over server/dxf/read-dxf.ts
 * DxfInspection, with each layer checked against the naming convention). The route's answer is
 * typed with it and the server's tests parse the answer with it; the client parses with it.
 */
export const InspectedLayerSchema = z.object({
  name: z.string(),
  entities: z.number().int(),
  ok: z.boolean(),
  problems: z.array(NamingProblemSchema),
  proposed: z.string().nullable(),
});
export type InspectedLayer = z.infer<typeof InspectedLayerSchema>;

export const InspectedCircleSchema = z.object({ x: z.number(), y: z.number(), r: z.number(), layer: z.string() });
export type InspectedCircle = z.infer<typeof InspectedCircleSchema>;

const count = z.object({ type: z.string(), count: z.number().int() });

/**
 * The outline as read, before it is stored: the shape of shared/schemas/geometry's Outline
 * without its size caps, so a large drawing still previews (the store applies its own rules).
 */
const InspectedOutlineSchema = z.object({
  paths: z.array(z.object({ layer: z.string().optional(), closed: z.boolean(), points: z.array(z.object({ x: z.number(), y: z.number(), bulge: z.number().optional() })) })),
  circles: z.array(z.object({ layer: z.string().optional(), x: z.number(), y: z.number(), r: z.number() })),
});

export const DxfInspectionSchema = z.object({
  unit: UnitSchema.nullable(),
  insunits: z.number().nullable(),
  version: z.string().nullable(),
  layers: z.array(InspectedLayerSchema),
  entities: z.number().int(),
  entityTypes: z.array(count),
  bbox: z.object({ minX: z.number(), minY: z.number(), maxX: z.number(), maxY: z.number() }).nullable(),
  /** The same circles as outline.circles, in the same order. */
  circles: z.array(InspectedCircleSchema),
  unsupported: z.array(count),
  outline: InspectedOutlineSchema,
  notes: z.array(z.object({ text: z.string(), x: z.number(), y: z.number(), height: z.number(), layer: z.string() })),
  points: z.array(z.object({ x: z.number(), y: z.number(), layer: z.string() })),
  approximations: z.array(z.string()),
  warnings: z.array(z.string()),
});
export type DxfInspection = z.infer<typeof DxfInspectionSchema>;

/** details of a 400 'naming' answer from POST /api/components/:id/outline. */
export const NamingRefusalSchema = z.object({
  layers: z.array(z.object({ layer: z.string(), problems: z.array(NamingProblemSchema), proposed: z.string().nullable() })),
});
export type NamingRefusal = z.infer<typeof NamingRefusalSchema>;
