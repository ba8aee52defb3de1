import { z } from 'zod';
import { UnitSchema } from './common';
import { LIMITS, count, hasControl } from './limits';
import { ClampModelSchema } from './catalog';

/**
 * Stock check: measured bars checked against one clamp model's window, and grouped into as few
 * jaw-rail settings as possible. This request/response shape is a
 * contract external scripts rely on: keep the field names.
 *
 * All lengths are in `unit`; slopes are unitless (rise per unit of width).
 */

/** The most bars one stock check takes; the computation is O(n log n), the cap keeps bodies small. */
export const MAX_STOCK_CHECK_BARS = 10_000;

/** Why a bar is refused at the nominal rail setting (shift 0), in the order they are tested. */
export const STOCK_CHECK_REASONS = ['too-narrow', 'too-wide', 'thinner-than-carrier', 'clamp-above-carrier', 'short-bite'] as const;
export const StockCheckReasonSchema = z.enum(STOCK_CHECK_REASONS, {
  message: `A reason must be one of ${STOCK_CHECK_REASONS.join(', ')}.`,
});
export type StockCheckReason = z.infer<typeof StockCheckReasonSchema>;

type Bound = 'positive' | 'nonNegative';

/**
 * A length field. Messages name the field by its JSON key (what an external script must fix) and
 * say what to enter; a missing value and a value of the wrong kind get different sentences.
 */
function length(field: string, what: string, bound: Bound) {
  return z
    .number({
      error: (iss) =>
        iss.input === undefined
          ? `${field} is required: enter ${what} as a number.`
          : typeof iss.input === 'number'
            ? `${field} must be a finite number: enter ${what}.`
            : `${field} must be a number, not ${describe(iss.input)}: enter ${what}.`,
    })
    .refine(
      (v) => (bound === 'positive' ? v > 0 : v >= 0),
      bound === 'positive'
        ? `${field} must be greater than zero: enter ${what}.`
        : `${field} must be zero or more: enter ${what}.`,
    )
    .refine((v) => v <= LIMITS.coordinate, `${field} must be ${count(LIMITS.coordinate)} or less: enter ${what}.`);
}

function describe(input: unknown): string {
  if (input === null) return 'null';
  if (Array.isArray(input)) return 'a list';
  if (typeof input === 'string') return 'text';
  return `a ${typeof input}`;
}

/** Bar ids are text; numbers are accepted and turned into text, so 7 and "7" are the same id. */
const BarIdSchema = z
  .union([z.string(), z.number()], {
    error: (iss) =>
      iss.input === undefined
        ? 'id is required: give each bar an id (text or a number).'
        : 'id must be text or a number: give each bar an id such as "B1" or 1.',
  })
  .transform((v) => String(v).trim())
  .pipe(
    z
      .string()
      .min(1, 'id must not be empty: give each bar an id.')
      .max(64, 'id must be 64 characters or fewer: shorten the bar id.')
      .refine((s) => !hasControl(s), 'id must not hold control characters such as tabs or line breaks: retype the bar id.'),
  );

export const MeasuredBarSchema = z.object(
  {
    id: BarIdSchema,
    width: length('width', "the bar's measured width", 'positive'),
    thickness: length('thickness', "the bar's measured thickness", 'positive'),
    cornerRadius: length('cornerRadius', "the radius on the bar's edges (0 for a sharp corner)", 'nonNegative'),
  },
  { error: 'Each bar must be an object with id, width, thickness and cornerRadius.' },
);
export type MeasuredBarInput = z.input<typeof MeasuredBarSchema>;
export type MeasuredBar = z.output<typeof MeasuredBarSchema>;

/**
 * The clamp model is the catalog's (so a component's clamp can be sent as is); it is wrapped only
 * to give a missing or malformed clamp a sentence that says what to send.
 */
const ClampFieldSchema = z
  .custom<z.input<typeof ClampModelSchema>>((v) => typeof v === 'object' && v !== null && !Array.isArray(v), {
    error: 'clamp is required: give the clamp model as an object with acceptBelow, acceptAbove, topHeight, topSlope, gripLow, gripHigh, gripSlope and slotSlop.',
  })
  .pipe(ClampModelSchema);

export const StockCheckRequestSchema = z.object(
  {
    unit: UnitSchema,
    nominalOpening: length('nominalOpening', "the clamp's nominal opening (the width the rail holds at its nominal setting)", 'positive'),
    clamp: ClampFieldSchema,
    carrier: length('carrier', 'the carrier thickness left at the bottom of the part', 'positive'),
    clearance: length('clearance', 'the tool clearance to keep above the clamp tops (0 for none)', 'nonNegative'),
    // A minimum bite of zero would accept a clamp that does not touch the flat face at all.
    minBite: length('minBite', 'the least flat face the clamp must grip', 'positive'),
    /** How closely the operator can set a rail; every bar's range of settings is narrowed by it on each side. */
    settingAccuracy: length('settingAccuracy', 'how closely a rail can be set (0.002 in / 0.05 mm is common)', 'nonNegative').optional(),
    /** Top of the fixed jaw or stop above the part seat, when known: it must stay the clearance below the carrier too. */
    fixedTop: length('fixedTop', "the height of the fixed jaw's top above the part seat", 'nonNegative').optional(),
    bars: z
      .array(MeasuredBarSchema, {
        error: (iss) =>
          iss.input === undefined
            ? 'bars is required: list the measured bars, each with id, width, thickness and cornerRadius.'
            : 'bars must be a list of measured bars, each with id, width, thickness and cornerRadius.',
      })
      .min(1, 'bars must list at least one measured bar.')
      .max(MAX_STOCK_CHECK_BARS, `A stock check takes at most ${MAX_STOCK_CHECK_BARS.toLocaleString('en-US')} bars: split the list into several checks.`)
      .superRefine((bars, ctx) => {
        const seen = new Map<string, number>();
        bars.forEach((bar, i) => {
          const first = seen.get(bar.id);
          if (first === undefined) seen.set(bar.id, i);
          else {
            ctx.addIssue({
              code: 'custom',
              path: [i, 'id'],
              message: `Bar id "${bar.id}" is already used by bar ${first + 1}: give each bar its own id.`,
            });
          }
        });
      }),
  },
  { error: 'The stock check must be an object with unit, nominalOpening, clamp, carrier, clearance, minBite and bars.' },
);
export type StockCheckRequestInput = z.input<typeof StockCheckRequestSchema>;
export type StockCheckRequest = z.output<typeof StockCheckRequestSchema>;

/** A closed interval of rail shifts [min, max], in the request's unit; positive opens the jaw. */
export const ShiftRangeSchema = z.tuple([z.number(), z.number()]);

export const StockCheckBarResultSchema = z.object({
  id: z.string(),
  /** True when the bar is accepted at the nominal rail setting (shift 0). */
  ok: z.boolean(),
  reasons: z.array(StockCheckReasonSchema),
  /** Every rail shift within the slot slop at which the bar is accepted; null when there is none. */
  shiftRange: ShiftRangeSchema.nullable(),
  // Additive fields (beyond the contract), all at shift 0:
  /** Measured width − nominal opening. */
  d: z.number(),
  /** Height of the clamp top above the deck. */
  topHeight: z.number(),
  /** Length of the grip band that lands on the flat face. */
  bite: z.number(),
  /** Index into `settings` of the rail setting that serves this bar; null when unplaceable. */
  setting: z.number().int().min(0).nullable(),
  /** shiftRange narrowed by the setting accuracy on each side: where a rail set that closely still holds the bar. */
  // Checks stored before these were answered lack them (read back as null / absent).
  settableRange: ShiftRangeSchema.nullable().default(null),
  /** How far the bar's setting may be off either way before the bar leaves its settable range; null when unplaceable. */
  room: z.number().nullable().default(null),
});
export type StockCheckBarResult = z.infer<typeof StockCheckBarResultSchema>;

export const RailSettingSchema = z.object({
  /** The rail shift to set, in the request's unit; positive opens the jaw. */
  shift: z.number(),
  bars: z.array(z.string()),
  /** The opening to set: nominal opening + shift. */
  targetOpening: z.number().optional(),
  /** ± how far the rail may be set off the target and still hold every bar of this setting (beyond the setting accuracy already allowed). */
  room: z.number().optional(),
});
export type RailSetting = z.infer<typeof RailSettingSchema>;

export const StockCheckResponseSchema = z.object({
  bars: z.array(StockCheckBarResultSchema),
  settings: z.array(RailSettingSchema),
  unplaceable: z.array(z.string()),
  /** The setting accuracy the plan allowed for (given, or the default for the unit). */
  settingAccuracy: z.number().optional(),
  /** Cautions about the setup as a whole, e.g. a fixed jaw whose top is above the carrier less the clearance. */
  warnings: z.array(z.object({ code: z.string(), message: z.string() })).default([]),
});
export type StockCheckResponse = z.infer<typeof StockCheckResponseSchema>;
