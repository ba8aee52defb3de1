import { z } from 'zod';
import { CONTROL_FAMILIES, familyFromAlias, type ControlFamily } from '../gcode/control-families';
import { ROW_ID_MAX, TOO_LARGE_ID, listOf } from './common';
import {
  NumberingSchema, PairingSchema, PlacementSchema, ProblemSchema, SharedOffsetSchema, StationSchema,
  TemplateComponentSchema, TemplateContentFieldsSchema, PlateRefSchema, checkStationCount,
} from './template';
import { LIMITS, count } from './limits';
import { plainText } from './common';
import { UnitSchema } from './common';

export const VERSION_STATES = ['draft', 'in-review', 'released', 'retired'] as const;
export const VersionStateSchema = z.enum(VERSION_STATES);
export type VersionState = z.infer<typeof VersionStateSchema>;

/**
 * What a version shows: its state, except that a draft a reviewer sent back reads "changes
 * requested" until it is submitted again (decided by `versionStatus` in shared/review/lifecycle.ts).
 */
export const VERSION_STATUSES = ['draft', 'changes-requested', 'in-review', 'released', 'retired'] as const;
export const VersionStatusSchema = z.enum(VERSION_STATUSES);
export type VersionStatus = z.infer<typeof VersionStatusSchema>;

/** The reviewer's word on a version sent back: who, when and what to change. */
export const ChangesRequestedSchema = z.object({ comment: z.string(), by: z.string().nullable(), at: z.string() });
export type ChangesRequested = z.infer<typeof ChangesRequestedSchema>;

export const CreateTemplateInputSchema = z.object({
  name: plainText('Template name', 120).trim().min(1, 'Template name is required.'),
  plateId: z.number({ message: 'Choose a plate.' }).int().positive('Choose a plate.').max(ROW_ID_MAX, TOO_LARGE_ID),
});
export type CreateTemplateInput = z.infer<typeof CreateTemplateInputSchema>;

/** PUT of a draft: the template.json shape with the revision it was read at. */
export const SaveVersionInputSchema = z.object({
  revision: z.number({ message: 'revision is required: send the revision the draft was read at.' }).int().min(1),
  placements: z.array(PlacementSchema).max(LIMITS.placements, `A template holds at most ${count(LIMITS.placements)} placements.`),
  sharedOffset: SharedOffsetSchema,
  numbering: NumberingSchema.default({ order: 'row-by-row' }),
  /** Copies of components the version carries; codes not listed are taken from the catalog. */
  components: z.array(TemplateComponentSchema).max(LIMITS.templateComponents, `A template carries at most ${count(LIMITS.templateComponents)} components.`).optional(),
}).passthrough().superRefine((v, ctx) => checkStationCount(v.placements, ctx));
export type SaveVersionInput = z.infer<typeof SaveVersionInputSchema>;

export const VersionSummarySchema = z.object({
  number: z.number().int(),
  state: VersionStateSchema,
  contentHash: z.string(),
  placements: z.number().int(),
  updatedAt: z.string(),
  status: VersionStatusSchema,
  /** Set while the version is a draft sent back by a reviewer and not yet submitted again. */
  changesRequested: ChangesRequestedSchema.nullable(),
  /** Who started this version; they may not approve it. */
  authorId: z.number().int().nullable(),
});
export type VersionSummary = z.infer<typeof VersionSummarySchema>;

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
export const TemplateVersionSchema = TemplateContentFieldsSchema.extend({
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
  status: VersionStatusSchema,
  changesRequested: ChangesRequestedSchema.nullable().default(null),
});
export type TemplateVersion = z.infer<typeof TemplateVersionSchema>;

export const StationsAnswerSchema = z.object({
  unit: UnitSchema,
  sharedOffset: SharedOffsetSchema,
  stations: z.array(StationSchema.pick({ number: true, x: true, y: true, z: true, c: true, nominalWidth: true, placement: true, stop: true, id: true })),
});
export type StationsAnswer = z.infer<typeof StationsAnswerSchema>;

export const ReleaseInputSchema = z.object({
  waiver: plainText('The waiver', 2000, true).trim().min(10, 'A waiver needs a written reason of at least 10 characters.').optional(),
});

export const NewVersionInputSchema = z.object({ from: z.number({ message: 'from must be the number of the version to copy.' }).int().min(1).max(ROW_ID_MAX, TOO_LARGE_ID) });

const familyWords = CONTROL_FAMILIES.join(', ');
const coordinate = /^\s*-?\d+(\.\d+)?\s*$/;

/**
 * offsets.nc?family=F&base=x,y,z&first=P. `dialect` is another name for `family`; the old
 * mode=g10|g52 and dialect=standard|extended stay as aliases (extended is the ext-l20 family,
 * never G10 L2 above P9).
 */
export const OffsetsQuerySchema = z
  .object({
    family: z.string().max(40).optional(),
    dialect: z.string().max(40).optional(),
    mode: z.string().max(10).optional(),
    base: z
      .string()
      .max(120)
      .refine((v) => { const parts = v.split(','); return parts.length === 3 && parts.every((p) => coordinate.test(p)); }, 'base must be three numbers x,y,z: the machine position of the shared offset, e.g. base=-20.5,-12.25,-14.0.')
      .transform((v) => { const [x, y, z] = v.split(',').map((p) => Number(p.trim())); return { x: x!, y: y!, z: z! }; })
      .optional(),
    first: z.coerce.number({ message: 'first must be a whole register number, e.g. first=2.' }).int('first must be a whole register number, e.g. first=2.').min(1, 'first must be 1 or more.').max(999, 'first must be 999 or less.').optional(),
  })
  .transform((q, ctx) => {
    const family = familyFromAlias(q);
    if (!family) {
      ctx.addIssue({ code: 'custom', path: ['family'], message: `Name the control family the file is for: family=${familyWords}.` });
      return z.NEVER;
    }
    if (!(CONTROL_FAMILIES as readonly string[]).includes(family)) {
      ctx.addIssue({ code: 'custom', path: ['family'], message: `family must be one of ${familyWords}; ${family} is not a family Gridset writes.` });
      return z.NEVER;
    }
    return { family: family as ControlFamily, base: q.base, first: q.first };
  });
export type OffsetsQuery = z.output<typeof OffsetsQuerySchema>;
