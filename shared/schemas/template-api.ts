import { z } from 'zod';
import { listOf } from './common';
import {
  NumberingSchema, PairingSchema, PlacementSchema, ProblemSchema, SharedOffsetSchema, StationSchema,
  TemplateComponentSchema, TemplateContentSchema, PlateRefSchema,
} from './template';
import { UnitSchema } from './common';

export const VERSION_STATES = ['draft', 'in-review', 'released', 'retired'] as const;
export const VersionStateSchema = z.enum(VERSION_STATES);
export type VersionState = z.infer<typeof VersionStateSchema>;

export const CreateTemplateInputSchema = z.object({
  name: z.string({ message: 'Template name is required.' }).trim().min(1, 'Template name is required.').max(120, 'Template name must be 120 characters or fewer.'),
  plateId: z.number({ message: 'Choose a plate.' }).int().positive('Choose a plate.'),
});
export type CreateTemplateInput = z.infer<typeof CreateTemplateInputSchema>;

/** PUT of a draft: the template.json shape with the revision it was read at. */
export const SaveVersionInputSchema = z.object({
  revision: z.number({ message: 'revision is required: send the revision the draft was read at.' }).int().min(1),
  placements: z.array(PlacementSchema).max(5000, 'A template holds at most 5,000 placements.'),
  sharedOffset: SharedOffsetSchema,
  numbering: NumberingSchema.default({ order: 'row-by-row' }),
  /** Copies of components the version carries; codes not listed are taken from the catalog. */
  components: z.array(TemplateComponentSchema).max(5000).optional(),
}).passthrough();
export type SaveVersionInput = z.infer<typeof SaveVersionInputSchema>;

export const VersionSummarySchema = z.object({
  number: z.number().int(),
  state: VersionStateSchema,
  contentHash: z.string(),
  placements: z.number().int(),
  updatedAt: z.string(),
});

export const TemplateSummarySchema = z.object({
  id: z.number().int(),
  name: z.string(),
  plateId: z.number().int(),
  plateCode: z.string(),
  unit: UnitSchema,
  versions: z.array(VersionSummarySchema),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type TemplateSummary = z.infer<typeof TemplateSummarySchema>;
export const TemplateListSchema = listOf(TemplateSummarySchema);

/** A version as the API answers it: the template.json fields plus state, revision and derived checks. */
export const TemplateVersionSchema = TemplateContentSchema.extend({
  format: z.literal('gridset-template'),
  formatVersion: z.literal(1),
  templateId: z.number().int(),
  version: z.number().int(),
  state: VersionStateSchema,
  revision: z.number().int(),
  contentHash: z.string(),
  stations: z.array(StationSchema),
  problems: z.array(ProblemSchema),
  pairings: z.array(PairingSchema),
  plate: PlateRefSchema,
  components: z.array(TemplateComponentSchema),
  updatedAt: z.string(),
  /** A lead's written reason for releasing despite naming problems, kept with the version. */
  namingWaiver: z.string().nullable().default(null),
  /** Who started this version; they may not approve it. */
  authorId: z.number().int().nullable().default(null),
});
export type TemplateVersion = z.infer<typeof TemplateVersionSchema>;

export const StationsAnswerSchema = z.object({
  unit: UnitSchema,
  sharedOffset: SharedOffsetSchema,
  stations: z.array(StationSchema.pick({ number: true, x: true, y: true, z: true, c: true, nominalWidth: true, placement: true, stop: true, id: true })),
});
export type StationsAnswer = z.infer<typeof StationsAnswerSchema>;

export const ReleaseInputSchema = z.object({
  waiver: z.string().trim().min(10, 'A waiver needs a written reason of at least 10 characters.').max(2000).optional(),
});

export const NewVersionInputSchema = z.object({ from: z.number({ message: 'from must be the number of the version to copy.' }).int().min(1) });

const FAMILY_VALUES = ['ngc-g10', 'ngc-g52', 'ext-l20', 'shift-rotate'] as const;
/**
 * Query of offsets.nc: family (or dialect) names the offset-file family; mode=g10|g52 and
 * dialect=standard|extended are older names (g10 → ngc-g10, g52 → ngc-g52, extended → ext-l20).
 */
export const OffsetsQuerySchema = z.object({
  family: z.enum(FAMILY_VALUES, { message: `family must be one of ${FAMILY_VALUES.join(', ')}.` }).optional(),
  dialect: z.enum([...FAMILY_VALUES, 'standard', 'extended'], { message: `dialect must be one of ${FAMILY_VALUES.join(', ')}.` }).optional(),
  mode: z.enum(['g10', 'g52'], { message: 'mode must be g10 or g52.' }).optional(),
  base: z
    .string()
    .max(100)
    .regex(/^\s*-?\d+(\.\d+)?\s*,\s*-?\d+(\.\d+)?\s*,\s*-?\d+(\.\d+)?\s*$/, 'base must be three numbers x,y,z: the machine position of the shared offset, e.g. base=-20.5,-12.25,-14.0.')
    .optional(),
  first: z.coerce.number({ message: 'first must be a whole register number.' }).int('first must be a whole register number.').min(1, 'first must be 1 or more.').max(1000, 'first must be 1000 or less.').optional(),
}).transform(({ family, dialect, mode, base, first }) => {
  const named = family ?? (dialect === 'extended' ? (mode === 'g52' ? 'ngc-g52' : 'ext-l20') : dialect === 'standard' ? undefined : dialect);
  return { family: named ?? (mode === 'g52' ? 'ngc-g52' : 'ngc-g10'), base, first } as { family: (typeof FAMILY_VALUES)[number]; base?: string; first?: number };
});
export type OffsetsQuery = z.output<typeof OffsetsQuerySchema>;
