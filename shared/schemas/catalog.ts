import { z } from 'zod';
import { UnitSchema, finite, positive, nonNegative, PointSchema, listOf, plainText } from './common';
import { LIMITS } from './limits';
import { OutlineSchema } from './geometry';

const code = z
  .string({ message: 'Code is required.' })
  .trim()
  .min(1, 'Code is required.')
  .max(40, 'Code must be 40 characters or fewer.')
  .regex(/^[A-Za-z0-9][A-Za-z0-9._-]*$/, 'Code may hold letters, digits, ".", "-" and "_", and must start with a letter or digit.');
const name = plainText('Name', 120).trim().min(1, 'Name is required.');
const notes = plainText('Notes', 2000, true).default('');

// ---------- plates ----------
export const PlateInputSchema = z.object({
  code,
  name,
  unit: UnitSchema,
  pitch: positive('Pitch'),
  columns: z.number({ message: 'Columns must be a whole number.' }).int('Columns must be a whole number.').min(1, 'A plate needs at least 1 column.').max(500, 'Columns must be 500 or fewer.'),
  rows: z.number({ message: 'Rows must be a whole number.' }).int('Rows must be a whole number.').min(1, 'A plate needs at least 1 row.').max(500, 'Rows must be 500 or fewer.'),
  holeDiameter: positive('Hole diameter'),
  thread: plainText('Thread', 40).trim().default(''),
  /** Distance from the outermost hole centers to the plate edge; half a pitch when left out. */
  edgeMargin: nonNegative('Edge margin').optional(),
  notes,
});
export type PlateInput = z.input<typeof PlateInputSchema>;
export type PlateFields = z.output<typeof PlateInputSchema>;

export const PlateSchema = PlateInputSchema.extend({
  id: z.number().int(),
  edgeMargin: nonNegative('Edge margin'),
  usedBy: z.number().int().default(0),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Plate = z.infer<typeof PlateSchema>;
export const PlateListSchema = listOf(PlateSchema);

// ---------- components ----------
export const COMPONENT_KINDS = ['center-rail', 'jaw-rail', 'short-rail', 'vise', 'stop', 'subplate', 'other'] as const;
export const ComponentKindSchema = z.enum(COMPONENT_KINDS, { message: `Kind must be one of ${COMPONENT_KINDS.join(', ')}.` });
export type ComponentKind = z.infer<typeof ComponentKindSchema>;

/** A stop position: where a part's datum corner rests, with the station's local angle in degrees. */
export const StopSchema = z.object({
  x: finite('Stop x'),
  y: finite('Stop y'),
  z: finite('Stop z').optional(),
  angle: finite('Stop angle').optional(),
  /** Index into jawFaces of the face this stop sits against, when the component has several. */
  face: z.number().int().min(0).optional(),
});
export type Stop = z.infer<typeof StopSchema>;

/**
 * A jaw face: a point on the clamping face and the direction (degrees, counter-clockwise from
 * local +X) of its outward normal, i.e. the side the part sits on. For a jaw rail it is the
 * clamp's face at its nominal opening.
 */
export const JawFaceSchema = z.object({
  x: finite('Jaw face x'),
  y: finite('Jaw face y'),
  normal: finite('Jaw face normal'),
});
export type JawFace = z.infer<typeof JawFaceSchema>;

/** Edge-clamp model; lengths in the component's unit, slopes are unitless (rise per unit of width). */
export const ClampModelSchema = z.object({
  acceptBelow: nonNegative('acceptBelow'),
  acceptAbove: nonNegative('acceptAbove'),
  topHeight: nonNegative('topHeight'),
  topSlope: finite('topSlope'),
  gripLow: nonNegative('gripLow'),
  gripHigh: nonNegative('gripHigh'),
  gripSlope: finite('gripSlope'),
  slotSlop: nonNegative('slotSlop'),
}).refine((c) => c.gripHigh >= c.gripLow, { message: 'gripHigh must be at or above gripLow.', path: ['gripHigh'] });
export type ClampModel = z.infer<typeof ClampModelSchema>;

export const ComponentInputSchema = z
  .object({
    code,
    kind: ComponentKindSchema,
    name,
    unit: UnitSchema,
    /** Locating dowels in local coordinates; the first is the primary dowel and sits at the local origin. */
    dowels: z.array(PointSchema).min(1, 'A component needs at least one locating dowel.').max(16, 'At most 16 dowels.'),
    stops: z.array(StopSchema).max(LIMITS.stops, `At most ${LIMITS.stops} stop positions.`).default([]),
    jawFaces: z.array(JawFaceSchema).max(8, 'At most 8 jaw faces.').default([]),
    clamp: ClampModelSchema.nullable().default(null),
    outline: OutlineSchema.nullable().default(null),
    layer: plainText('Layer', 255).trim().default(''),
    /** Height of the part's seat above the plate deck: station Z, measured from the deck. */
    seatHeight: nonNegative('Seat height').default(0),
    /** Height of the fixed jaw's (or stop's) top above the part seat, when known: it must stay below the cut. */
    jawTop: nonNegative('Jaw top').nullable().default(null),
    notes,
  })
  .superRefine((c, ctx) => {
    const p = c.dowels[0];
    if (p && (Math.abs(p.x) > 1e-9 || Math.abs(p.y) > 1e-9)) {
      ctx.addIssue({ code: 'custom', path: ['dowels', 0], message: 'The first dowel is the primary dowel and must sit at the local origin (0, 0).' });
    }
    c.stops.forEach((s, i) => {
      if (s.face !== undefined && s.face >= c.jawFaces.length) {
        ctx.addIssue({ code: 'custom', path: ['stops', i, 'face'], message: `Stop ${i + 1} names jaw face ${s.face + 1}, but the component has ${c.jawFaces.length}.` });
      }
    });
  });
export type ComponentInput = z.input<typeof ComponentInputSchema>;
export type ComponentFields = z.output<typeof ComponentInputSchema>;

export const ComponentSchema = z.object({
  id: z.number().int(),
  code: z.string(),
  kind: ComponentKindSchema,
  name: z.string(),
  unit: UnitSchema,
  dowels: z.array(PointSchema),
  stops: z.array(StopSchema),
  jawFaces: z.array(JawFaceSchema),
  clamp: ClampModelSchema.nullable(),
  outline: OutlineSchema.nullable(),
  layer: z.string(),
  notes: z.string(),
  seatHeight: z.number().default(0),
  jawTop: z.number().nullable().default(null),
  /** The DXF the outline was read from, when it came from one. */
  outlineFile: z.object({ name: z.string(), size: z.number(), sha256: z.string(), unit: z.string() }).nullable().default(null),
  usedBy: z.number().int().default(0),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Component = z.infer<typeof ComponentSchema>;
export const ComponentListSchema = listOf(ComponentSchema);
