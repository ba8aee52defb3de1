import { z } from 'zod';
import { UnitSchema } from './common';
import { LIMITS } from './limits';
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
  /**
   * SHA-256 of the file as sent (FIPS 180-4, hex): the server keeps the inspected file under it for
   * an hour, so POST /api/components/:id/outline/from-inspection names it instead of sending it again.
   */
  sha256: z.string(),
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

const SHA256 = z.string({ message: 'sha256 must be the hex SHA-256 the inspection answered.' }).regex(/^[0-9a-f]{64}$/, 'sha256 must be the 64 hex digits of SHA-256 the inspection answered.');
const coordinate = (label: string) => z.number({ message: `${label} must be a number.` }).refine(Number.isFinite, `${label} must be a number.`)
  .refine((v) => Math.abs(v) <= LIMITS.coordinate, `${label} must lie between -${LIMITS.coordinate.toLocaleString('en-US')} and ${LIMITS.coordinate.toLocaleString('en-US')}.`);
const layerName = z.string().min(1, 'Each layer name in layerMap needs at least one character.').max(255, 'Layer names in layerMap are at most 255 characters.');

/**
 * POST /api/components/:id/outline/from-inspection: store the outline of a file inspected a moment
 * ago, named by its SHA-256, with what the user chose on the preview. The same choices as the
 * multipart POST /api/components/:id/outline, as JSON.
 */
export const InspectedOutlineInputSchema = z.object({
  sha256: SHA256,
  /** The file's name as the user chose it, kept with the outline. */
  name: z.string({ message: 'name must be the file name.' }).min(1, 'name must be the file name.').max(255, 'name must be 255 characters or fewer.'),
  /** Only when the file does not say its unit. */
  unit: UnitSchema.optional(),
  /** The drawing point (file coordinates and unit) that becomes the local origin: the primary dowel; (0, 0) when left out. */
  datumX: coordinate('datumX').optional(),
  datumY: coordinate('datumY').optional(),
  /** A file layer → the conforming name it takes. */
  layerMap: z.record(layerName, layerName, { message: 'layerMap must be an object from each file layer to its new name.' })
    .refine((m) => Object.keys(m).length <= 1000, 'layerMap takes at most 1,000 layers.').optional(),
});
export type InspectedOutlineInput = z.infer<typeof InspectedOutlineInputSchema>;

/** details of a 400 'naming' answer from POST /api/components/:id/outline. */
export const NamingRefusalSchema = z.object({
  layers: z.array(z.object({ layer: z.string(), problems: z.array(NamingProblemSchema), proposed: z.string().nullable() })),
});
export type NamingRefusal = z.infer<typeof NamingRefusalSchema>;

/**
 * POST /api/jobs/:id/outline/from-inspection: a job's part outline from a file inspected a moment
 * ago, named by its SHA-256. The same choices as the multipart POST /api/jobs/:id/outline (a part's
 * layers are kept as drawn, so no layer map); the datum defaults to the lower-left corner of the extents.
 */
export const InspectedPartOutlineInputSchema = InspectedOutlineInputSchema.omit({ layerMap: true });
export type InspectedPartOutlineInput = z.infer<typeof InspectedPartOutlineInputSchema>;
