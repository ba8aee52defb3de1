import { z } from 'zod';
import { ROW_ID_MAX, TOO_LARGE_ID, UnitSchema, finite, listOf, nonNegative, plainText, positive } from './common';
import { OutlineSchema } from './geometry';
import { PairingSchema, StationSchema } from './template';
import { MeasuredBarSchema, StockCheckRequestSchema, StockCheckResponseSchema } from './stock-check';
import { VersionStateSchema } from './template-api';
import { PartProgramInfoSchema } from './part-program';
import { BarsDraftSchema } from './bars-draft';

const text = (label: string, max: number) => plainText(label, max).trim().min(1, `${label} is required.`);

export const StockSizeSchema = z.object({
  width: positive('Stock width'),
  thickness: positive('Stock thickness'),
  length: positive('Stock length'),
  material: plainText('Material', 80).trim().default(''),
});

/** A job's own fields; lengths are in the pinned template's unit. */
export const JobInputSchema = z.object({
  name: text('Job name', 120),
  partNumber: text('Part number', 60),
  partRevision: plainText('Revision', 20).trim().default(''),
  templateId: z.number({ message: 'Choose a template.' }).int().positive('Choose a template.').max(ROW_ID_MAX, TOO_LARGE_ID),
  version: z.number({ message: 'Choose a released version.' }).int().positive('Choose a released version.').max(ROW_ID_MAX, TOO_LARGE_ID),
  stock: StockSizeSchema,
  carrier: positive('Carrier thickness'),
  clearance: nonNegative('Tool clearance'),
  minBite: positive('Minimum bite'),
  cycleMinutes: positive('Cycle time'),
  loadMinutes: nonNegative('Load time').default(0),
  notes: plainText('Notes', 4000, true).default(''),
  /** Quarter turn of the part outline about its datum at every station. */
  partRotation: z.union([z.literal(0), z.literal(90), z.literal(180), z.literal(270)], { message: 'Part rotation must be 0, 90, 180 or 270 degrees.' }).default(0),
});
export type JobInput = z.input<typeof JobInputSchema>;
export type JobFields = z.output<typeof JobInputSchema>;

export const PartFileSchema = z.object({ name: z.string(), size: z.number(), sha256: z.string(), unit: UnitSchema, datum: z.object({ x: finite('x'), y: finite('y') }) });

export const RailCheckSchema = z.object({
  jawPlacement: z.string(),
  jawComponent: z.string(),
  nominalOpening: z.number(),
  appliesTo: z.array(z.string()),
  result: StockCheckResponseSchema,
});
export type RailCheck = z.infer<typeof RailCheckSchema>;

export const JobProblemSchema = z.object({
  code: z.string(),
  message: z.string(),
  /** Station numbers, from 1. */
  stations: z.array(z.number().int()).optional(),
});

export const JobStockCheckSchema = z.object({
  id: z.number().int(),
  jawPlacement: z.string(),
  at: z.string(),
  by: z.string().nullable(),
  nominalOpening: z.number(),
  unit: UnitSchema,
  appliesTo: z.array(z.string()),
  bars: z.array(MeasuredBarSchema),
  result: StockCheckResponseSchema,
  /** Every rail checked, each against its own clamp (the first is `jawPlacement`/`result` above). */
  rails: z.array(RailCheckSchema).default([]),
  /** Rails the job uses that this check did not cover. */
  railsNotChecked: z.array(z.string()).default([]),
});
export type JobStockCheck = z.infer<typeof JobStockCheckSchema>;

export const JobSummarySchema = JobInputSchema.extend({
  id: z.number().int(),
  templateName: z.string(),
  unit: UnitSchema,
  versionState: VersionStateSchema,
  contentHash: z.string(),
  stations: z.number().int(),
  /** Numbers of the stations whose width held accepts the stock width (shared/jobs/stations-used.ts); runtime, drawing and package use only these. */
  stationsUsed: z.array(z.number().int()),
  runtimeMinutes: z.number(),
  /** A later released version of the same template, when there is one; the job stays pinned. */
  newerRelease: z.number().int().nullable(),
  hasPartOutline: z.boolean(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type JobSummary = z.infer<typeof JobSummarySchema>;
export const JobListSchema = listOf(JobSummarySchema);

export const JobDetailSchema = JobSummarySchema.extend({
  partOutline: OutlineSchema.nullable(),
  partFile: PartFileSchema.nullable(),
  stationList: z.array(StationSchema),
  pairings: z.array(PairingSchema),
  stockChecks: z.array(JobStockCheckSchema),
  /** What stands in the way of running the job as saved; empty when nothing does. */
  problems: z.array(JobProblemSchema),
  /** Jaw placements holding at least one used station. */
  railsUsed: z.array(z.string()),
  /** The single-part program, when one was uploaded. */
  partProgram: PartProgramInfoSchema.nullable().default(null),
  /** Measured bars typed and not yet checked (PUT /api/jobs/:id/bars-draft); null when none. */
  barsDraft: BarsDraftSchema.nullable().default(null),
});
export type JobDetail = z.infer<typeof JobDetailSchema>;

export const JobStockCheckInputSchema = z.object({
  /** Which jaw rail's clamp window to check against (a placement id from the pairing table); every rail the job uses when left out. */
  jawPlacement: z.string().max(40).optional(),
  bars: z.array(MeasuredBarSchema).min(1, 'bars must list at least one measured bar.').max(10_000, 'A stock check takes at most 10,000 bars: split the list into several checks.'),
  /** How closely the operator sets a rail, in the template's unit; the unit's default when left out. */
  settingAccuracy: StockCheckRequestSchema.shape.settingAccuracy,
});
