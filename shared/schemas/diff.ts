import { z } from 'zod';
import { UnitSchema } from './common';
import {
  HoleSchema, NumberingSchema, PlacementSchema, PlateRefSchema, ProblemSchema, RotationSchema, SharedOffsetSchema, StationSchema,
} from './template';

// The answer to "what changed between two versions of a template". Every length in it is in
// `unit` (the later version's template unit), every angle in degrees; deltas are later − earlier.

const PoseSchema = z.object({ hole: HoleSchema, rotation: RotationSchema });

/** A placement whose primary dowel hole or rotation differs; dx, dy is the primary dowel's shift. */
export const MovedPlacementSchema = z.object({
  id: z.string(),
  /** Equal unless the placement also took another component (then it is in `changed` too). */
  componentFrom: z.string(),
  componentTo: z.string(),
  from: PoseSchema,
  to: PoseSchema,
  dx: z.number(),
  dy: z.number(),
  /** Change of rotation, in (−180, 180]. */
  dRotation: z.number(),
});
export type MovedPlacement = z.infer<typeof MovedPlacementSchema>;

/** A placement that stayed under one id but holds a different component or uses other stops. */
export const ChangedPlacementSchema = z.object({
  id: z.string(),
  componentFrom: z.string(),
  componentTo: z.string(),
  stopsAdded: z.array(z.number().int()),
  stopsRemoved: z.array(z.number().int()),
});
export type ChangedPlacement = z.infer<typeof ChangedPlacementSchema>;

const TranslationSchema = z.object({ x: z.number(), y: z.number(), z: z.number(), c: z.number() });

/** A station (same id in both versions) whose translation moved by more than the comparison epsilon. */
export const ChangedStationSchema = z.object({
  id: z.string(),
  /** Number in the later version. */
  number: z.number().int(),
  previousNumber: z.number().int(),
  placement: z.string(),
  stop: z.number().int(),
  from: TranslationSchema,
  to: TranslationSchema,
  dx: z.number(),
  dy: z.number(),
  dz: z.number(),
  /** Change of C, in (−180, 180]. */
  dc: z.number(),
});
export type ChangedStation = z.infer<typeof ChangedStationSchema>;

/** A station that kept its id and its translation and only got another number. */
export const RenumberedStationSchema = z.object({ id: z.string(), from: z.number().int(), to: z.number().int() });
export type RenumberedStation = z.infer<typeof RenumberedStationSchema>;

/** A station whose nominal width held changed (a jaw rail moved, came or went), whether or not it moved. */
export const WidthChangedStationSchema = z.object({
  id: z.string(),
  number: z.number().int(),
  from: z.number().nullable(),
  to: z.number().nullable(),
});
export type WidthChangedStation = z.infer<typeof WidthChangedStationSchema>;

const OriginSchema = z.object({ x: z.number(), y: z.number(), z: z.number() });

export const SharedOffsetDiffSchema = z.object({
  /** The definition differs, or its origin moved. */
  changed: z.boolean(),
  /** The origin moved by more than the comparison epsilon. */
  moved: z.boolean(),
  from: SharedOffsetSchema,
  to: SharedOffsetSchema,
  /** Origins in plate coordinates, in `unit`. */
  originFrom: OriginSchema,
  originTo: OriginSchema,
  dx: z.number(),
  dy: z.number(),
  dz: z.number(),
});
export type SharedOffsetDiff = z.infer<typeof SharedOffsetDiffSchema>;

/** One naming-convention finding, as the naming check reports it; `key` is its identity across versions. */
export const NamingFindingSchema = z.object({ key: z.string(), message: z.string() });
export type NamingFinding = z.infer<typeof NamingFindingSchema>;

const fieldChange = <T extends z.ZodType>(value: T) => z.object({ changed: z.boolean(), from: value, to: value });

export const VersionDiffSchema = z.object({
  /** Unit of every length in this answer: the later version's template unit. */
  unit: UnitSchema,
  template: z.object({
    name: fieldChange(z.string()),
    unit: fieldChange(UnitSchema),
    numbering: fieldChange(NumberingSchema),
  }),
  plate: fieldChange(PlateRefSchema).extend({
    /** Names of the plate fields that differ. */
    fields: z.array(z.string()),
  }),
  /** Component definitions carried in the template, by code. */
  components: z.object({
    added: z.array(z.string()),
    removed: z.array(z.string()),
    changed: z.array(z.string()),
  }),
  placements: z.object({
    added: z.array(PlacementSchema),
    removed: z.array(PlacementSchema),
    moved: z.array(MovedPlacementSchema),
    changed: z.array(ChangedPlacementSchema),
  }),
  stations: z.object({
    added: z.array(StationSchema),
    removed: z.array(StationSchema),
    changed: z.array(ChangedStationSchema),
    renumbered: z.array(RenumberedStationSchema),
    widthChanged: z.array(WidthChangedStationSchema),
    /** Stations in both versions with the same translation and number. */
    unchanged: z.number().int(),
  }),
  sharedOffset: SharedOffsetDiffSchema,
  /** Layout problems (the station engine's refusals). */
  problems: z.object({ introduced: z.array(ProblemSchema), resolved: z.array(ProblemSchema) }),
  naming: z.object({ introduced: z.array(NamingFindingSchema), resolved: z.array(NamingFindingSchema) }),
  summary: z.string(),
});
export type VersionDiff = z.infer<typeof VersionDiffSchema>;

export const STATION_VALUE_FIELDS = ['x', 'y', 'z', 'c', 'width'] as const;

/**
 * One value of one station, before → after (`unit` of the diff; C in degrees): each translation
 * component that moved and each nominal width held that changed (null where no jaw rail holds one).
 */
export const StationValueChangeSchema = z.object({
  id: z.string(),
  /** Number in the later version. */
  number: z.number().int(),
  previousNumber: z.number().int(),
  field: z.enum(STATION_VALUE_FIELDS),
  from: z.number().nullable(),
  to: z.number().nullable(),
});
export type StationValueChange = z.infer<typeof StationValueChangeSchema>;

/** GET /api/templates/:id/diff: the comparison plus every changed station value, listed one by one. */
export const VersionDiffAnswerSchema = VersionDiffSchema.extend({ stationValues: z.array(StationValueChangeSchema) });
export type VersionDiffAnswer = z.infer<typeof VersionDiffAnswerSchema>;
