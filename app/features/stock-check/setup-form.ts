import { z } from 'zod';
import type { Unit } from '../../../shared/schemas/common';
import { StockCheckRequestSchema } from '../../../shared/schemas/stock-check';
import { convert, formatNumber } from '../../../shared/units/units';
import { parseDecimal } from '../../../shared/units/decimal';

/**
 * The setup form: the fields are text (so 1.0000 reads as typed and nothing jumps under a gloved
 * thumb), turned into numbers and checked by the request schema's own fields — one schema for the
 * form and the route.
 */
const R = StockCheckRequestSchema.shape;

/** Empty text is a missing value; text that is not a number passes on as text, so the schema says "not text". */
function fromText(text: string): unknown {
  const t = text.trim();
  if (t === '') return undefined;
  return parseDecimal(t) ?? t;
}

const lengthText = <S extends z.ZodType<number, number>>(schema: S) => z.string().transform(fromText).pipe(schema);

const stockSize = (label: string) =>
  z
    .string()
    .transform(fromText)
    .pipe(
      z
        .number({ error: `${label} must be a number greater than zero, or left empty.` })
        .refine((v) => v > 0, `${label} must be greater than zero, or left empty.`)
        .optional(),
    );

export const SetupFormSchema = z.object({
  railId: z
    .string()
    .min(1, 'Choose a jaw rail: its clamp model sets the window and its unit.')
    .transform(Number),
  nominalOpening: lengthText(R.nominalOpening),
  carrier: lengthText(R.carrier),
  clearance: lengthText(R.clearance),
  minBite: lengthText(R.minBite),
  // Empty: the unit's default (0.002 in / 0.05 mm), said beside the field.
  settingAccuracy: z.string().transform(fromText).pipe(R.settingAccuracy),
  stockWidth: stockSize('Nominal stock width'),
  stockThickness: stockSize('Nominal stock thickness'),
});
export type SetupFormText = z.input<typeof SetupFormSchema>;
export type SetupFormValues = z.output<typeof SetupFormSchema>;
export type SetupLengthField = 'nominalOpening' | 'carrier' | 'clearance' | 'minBite' | 'settingAccuracy' | 'stockWidth' | 'stockThickness';

/** What the operator reads beside each field, and in place of the JSON key in the schema's messages. */
export const SETUP_LABEL: Readonly<Record<SetupLengthField, string>> = {
  nominalOpening: 'Nominal opening',
  carrier: 'Carrier thickness',
  clearance: 'Tool clearance',
  minBite: 'Minimum bite',
  settingAccuracy: 'Rail setting accuracy (±)',
  stockWidth: 'Nominal stock width',
  stockThickness: 'Nominal stock thickness',
};

/** The shared messages name the JSON key ("minBite is required: …"); on the form, name the field. */
export function formMessage(field: SetupLengthField, message: string | undefined): string | undefined {
  if (!message) return message;
  return message.startsWith(`${field} `) ? `${SETUP_LABEL[field]}${message.slice(field.length)}` : message;
}

/**
 * No template pairing tells this screen the opening a rail holds, so the operator types it; the
 * default is the common 1 in bar, or 25 mm.
 */
export const DEFAULT_OPENING: Readonly<Record<Unit, number>> = { in: 1, mm: 25 };

export function defaultSetupText(unit: Unit = 'in'): SetupFormText {
  return { railId: '', nominalOpening: formatNumber(DEFAULT_OPENING[unit], unit), carrier: '', clearance: '', minBite: '', settingAccuracy: '', stockWidth: '', stockThickness: '' };
}

/**
 * A rail of the other unit was chosen: convert what was typed (1 in = 25.4 mm exactly) so every
 * number keeps its meaning; an untouched default opening becomes the other unit's default.
 */
export function convertSetupText(values: SetupFormText, from: Unit, to: Unit): SetupFormText {
  if (from === to) return values;
  const conv = (text: string) => {
    const v = parseDecimal(text);
    return v === null ? text : formatNumber(convert(v, from, to), to);
  };
  const opening = parseDecimal(values.nominalOpening);
  return {
    ...values,
    nominalOpening: opening === null || opening === DEFAULT_OPENING[from] ? formatNumber(DEFAULT_OPENING[to], to) : conv(values.nominalOpening),
    carrier: conv(values.carrier),
    clearance: conv(values.clearance),
    minBite: conv(values.minBite),
    settingAccuracy: conv(values.settingAccuracy),
    stockWidth: conv(values.stockWidth),
    stockThickness: conv(values.stockThickness),
  };
}
