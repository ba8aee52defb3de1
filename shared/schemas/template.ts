import { z } from 'zod';
import { UnitSchema, finite, nonNegative, plainText } from './common';
import { LIMITS, count } from './limits';
import { ComponentKindSchema, StopSchema, JawFaceSchema, ClampModelSchema } from './catalog';
import { OutlineSchema } from './geometry';
import { PointSchema } from './common';

/** The four rotations a pinned component can take on a square hole grid. */
export const RotationSchema = z.union([z.literal(0), z.literal(90), z.literal(180), z.literal(270)], {
  message: 'Rotation must be 0, 90, 180 or 270 degrees.',
});
export type Rotation = z.infer<typeof RotationSchema>;

const holeIndex = (label: string) =>
  z
    .number({ message: `${label} must be a whole number.` })
    .int(`${label} must be a whole number.`)
    .min(-LIMITS.holeIndex, `${label} must lie between -${count(LIMITS.holeIndex)} and ${count(LIMITS.holeIndex)}.`)
    .max(LIMITS.holeIndex, `${label} must lie between -${count(LIMITS.holeIndex)} and ${count(LIMITS.holeIndex)}.`);
export const HoleSchema = z.object({
  col: holeIndex('Hole column'),
  row: holeIndex('Hole row'),
});
export type Hole = z.infer<typeof HoleSchema>;

export const PlacementSchema = z.object({
  /** Stable identity across versions; stations are identified by placement id and stop index. */
  id: z.string().trim().min(1, 'Placement id is required.').max(40).regex(/^[A-Za-z0-9._-]+$/, 'Placement id may hold letters, digits, ".", "-" and "_".'),
  component: plainText('Placement component code', 40).min(1, 'Placement component code is required.'),
  hole: HoleSchema,
  rotation: RotationSchema,
  stopsInUse: z
    .array(z.number({ message: 'A stop in use must be a whole number.' }).int('A stop in use must be a whole number.').min(0, 'A stop in use must be zero or more.').max(LIMITS.stops - 1, `A stop in use must be below ${LIMITS.stops}.`))
    .max(LIMITS.stops, `A placement uses at most ${LIMITS.stops} stops.`)
    .default([]),
});
export type Placement = z.infer<typeof PlacementSchema>;

export const SharedOffsetSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('hole'), hole: HoleSchema, name: plainText('Shared offset name', 40).optional() }),
  z.object({ kind: z.literal('center'), name: plainText('Shared offset name', 40).optional() }),
  z.object({ kind: z.literal('point'), x: finite('Shared offset x'), y: finite('Shared offset y'), z: finite('Shared offset z').default(0), name: plainText('Shared offset name', 40).optional() }),
], { message: 'Shared offset kind must be "hole", "center" or "point".' });
export type SharedOffset = z.infer<typeof SharedOffsetSchema>;

export const NUMBERING_ORDERS = ['row-by-row', 'serpentine', 'by-rail', 'by-hand'] as const;
export const NumberingSchema = z.object({
  order: z.enum(NUMBERING_ORDERS, { message: `Numbering order must be one of ${NUMBERING_ORDERS.join(', ')}.` }),
  /** For by-hand: station ids ("placementId:stopIndex") in the order they are numbered. */
  manual: z.array(plainText('A station id', 80)).max(LIMITS.stations, `Numbering by hand lists at most ${count(LIMITS.stations)} stations.`).optional(),
});
export type Numbering = z.infer<typeof NumberingSchema>;

export const PlateRefSchema = z.object({
  code: plainText('Plate code', 40).min(1, 'Plate code is required.'),
  unit: UnitSchema,
  pitch: finite('Plate pitch').refine((v) => v > 0, 'Plate pitch must be greater than zero.'),
  // The catalog's own bounds (PlateInputSchema).
  columns: z.number({ message: 'Plate columns must be a whole number.' }).int('Plate columns must be a whole number.').min(1, 'A plate needs at least 1 column.').max(500, 'Plate columns must be 500 or fewer.'),
  rows: z.number({ message: 'Plate rows must be a whole number.' }).int('Plate rows must be a whole number.').min(1, 'A plate needs at least 1 row.').max(500, 'Plate rows must be 500 or fewer.'),
  holeDiameter: nonNegative('Plate hole diameter').optional(),
  edgeMargin: nonNegative('Plate edge margin').optional(),
  name: plainText('Plate name', 120).optional(),
});
export type PlateRef = z.infer<typeof PlateRefSchema>;

/** A component as carried inside a template file, so the file stands alone. */
export const TemplateComponentSchema = z.object({
  code: plainText('Component code', 40).min(1, 'Component code is required.'),
  kind: ComponentKindSchema,
  unit: UnitSchema,
  name: plainText('Component name', 120).optional(),
  // The catalog's own bounds (ComponentInputSchema).
  dowels: z.array(PointSchema).min(1, 'A component needs at least one locating dowel.').max(16, 'At most 16 dowels.'),
  stops: z.array(StopSchema).max(LIMITS.stops, `At most ${LIMITS.stops} stop positions.`).default([]),
  jawFaces: z.array(JawFaceSchema).max(8, 'At most 8 jaw faces.').default([]),
  outline: OutlineSchema.nullable().default(null),
  clamp: ClampModelSchema.nullable().optional(),
  layer: plainText('Layer', 255).optional(),
  /** Part seat above the plate deck; absent (0) in files written before it was kept. */
  seatHeight: nonNegative('Seat height').optional(),
  jawTop: nonNegative('Jaw top').nullable().optional(),
});
export type TemplateComponent = z.infer<typeof TemplateComponentSchema>;

export const StationSchema = z.object({
  /** Identity that survives renumbering: "placementId:stopIndex". */
  id: z.string(),
  number: z.number().int(),
  placement: z.string(),
  stop: z.number().int(),
  x: z.number(),
  y: z.number(),
  z: z.number(),
  c: z.number(),
  nominalWidth: z.number().nullable(),
});
export type Station = z.infer<typeof StationSchema>;

/** The content of a template version: the body of template.json without derived fields. */
/** Stations are placements × stops in use: bounded as a total, so a file of few placements cannot make a million. */
export function checkStationCount(placements: readonly { stopsInUse: readonly number[] }[], ctx: z.RefinementCtx): void {
  const stations = placements.reduce((n, p) => n + p.stopsInUse.length, 0);
  if (stations > LIMITS.stations) {
    ctx.addIssue({ code: 'custom', path: ['placements'], message: `The layout has ${count(stations)} stations (stops in use); a template holds at most ${count(LIMITS.stations)}.` });
  }
}

/** The fields of TemplateContentSchema, for schemas that extend it (refined schemas cannot be extended). */
export const TemplateContentFieldsSchema = z.object({
  name: plainText('Template name', 120).trim().min(1, 'Template name is required.'),
  unit: UnitSchema,
  plate: PlateRefSchema,
  components: z.array(TemplateComponentSchema).max(LIMITS.templateComponents, `A template carries at most ${count(LIMITS.templateComponents)} components.`),
  placements: z.array(PlacementSchema).max(LIMITS.placements, `A template holds at most ${count(LIMITS.placements)} placements.`),
  sharedOffset: SharedOffsetSchema,
  numbering: NumberingSchema.default({ order: 'row-by-row' }),
});
export const TemplateContentSchema = TemplateContentFieldsSchema.superRefine((c, ctx) => checkStationCount(c.placements, ctx));
export type TemplateContent = z.infer<typeof TemplateContentSchema>;

// ---------- evaluation results (added for the station engine in shared/stations) ----------

export const PROBLEM_CODES = [
  'duplicate-placement-id',
  'duplicate-component-code',
  'unknown-component',
  'bad-rotation',
  'dowel-off-grid',
  'dowel-off-plate',
  'hole-taken',
  'off-plate',
  'overlap',
  'stop-out-of-range',
  'duplicate-stop',
  'shared-offset-off-plate',
  'numbering-unknown-station',
  'numbering-duplicate-station',
  'no-stations',
  'no-facing-clamp',
  'jaw-rail-faces-nothing',
  'stop-faces-away',
] as const;
export const ProblemCodeSchema = z.enum(PROBLEM_CODES);

/**
 * Problems of a layout still being built — a center rail placed before its jaw rail, a draft with
 * no stop ticked yet — block submit and release, not saving the draft. Every other problem is a
 * placement that cannot be built at all, and blocks saving too.
 */
export const RELEASE_ONLY_PROBLEMS: ReadonlySet<string> = new Set(['no-stations', 'no-facing-clamp', 'jaw-rail-faces-nothing', 'stop-faces-away']);
export const blocksSaving = (p: { code: string }) => !RELEASE_ONLY_PROBLEMS.has(p.code);
export type ProblemCode = z.infer<typeof ProblemCodeSchema>;

/** A reason a template cannot be released as laid out; the message names what and where. */
export const ProblemSchema = z.object({
  code: ProblemCodeSchema,
  message: z.string(),
  /** Id of the placement at fault. */
  placement: z.string().optional(),
  /** Index into the component's dowels (0 is the primary dowel; messages count from 1). */
  dowel: z.number().int().optional(),
  /** The grid hole concerned: the nearest hole for an off-grid dowel. */
  hole: HoleSchema.optional(),
  /** Index into the component's stops, for stop problems. */
  stop: z.number().int().optional(),
  /** The other placement of an overlap or a shared hole. */
  otherPlacement: z.string().optional(),
  /** The station id, for numbering problems. */
  station: z.string().optional(),
});
export type Problem = z.infer<typeof ProblemSchema>;

/** One row of the pairing table: which jaw rail, on which grid hole, holds which width against which fixed face. */
export const PairingSchema = z.object({
  fixedPlacement: z.string(),
  fixedComponent: z.string(),
  /** Index into the fixed component's jaw faces. */
  fixedFace: z.number().int(),
  jawPlacement: z.string(),
  jawComponent: z.string(),
  /** Index into the jaw rail's jaw faces. */
  jawFace: z.number().int(),
  /** The grid hole under the jaw rail's primary dowel. */
  jawHole: HoleSchema,
  /** Distance between the faces, in the template's unit. */
  width: z.number(),
  /** Station ids held by this pair, in numbering order. */
  stations: z.array(z.string()),
});
export type Pairing = z.infer<typeof PairingSchema>;
