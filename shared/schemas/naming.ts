import { z } from 'zod';
import { ROW_ID_MAX, TOO_LARGE_ID } from './common';
import { compileRule } from '../naming/compile-rule';
import { hasControl } from './limits';

/**
 * The shop's naming convention: one rule for DXF layer names, one for component codes. A rule is
 * one or more patterns of literal text and {tokens}, the tokens' allowed values, a case rule and
 * length limits; shared/naming/SYNTAX.md explains it for the lead. The shapes are checked here;
 * what the pieces mean together (a pattern naming a token that is not defined, a regular
 * expression that does not compile, ...) is checked by compileRule and reported on the same paths.
 */

export const NAMING_TARGETS = ['layer', 'component'] as const;
export const NamingTargetSchema = z.enum(NAMING_TARGETS, { message: 'target must be "layer" or "component".' });
export type NamingTarget = z.infer<typeof NamingTargetSchema>;

export const NAMING_CASES = ['upper', 'lower', 'any'] as const;
export const NamingCaseSchema = z.enum(NAMING_CASES, {
  message: 'Case must be "upper" (capitals only), "lower" (lower case only) or "any".',
});
export type NamingCase = z.infer<typeof NamingCaseSchema>;

const text = (label: string, max: number) =>
  z
    .string({ message: `${label} must be text.` })
    .max(max, `${label} must be ${max} characters or fewer.`)
    .refine((s) => !hasControl(s), `${label} must not hold control characters such as tabs or line breaks.`);

const tokenName = text('A token name', 32).min(1, 'Each token needs a name, such as kind or size.');

export const ListTokenSchema = z.object({
  name: tokenName,
  type: z.literal('list'),
  /** The allowed values; a name's value is matched regardless of case, the case rule judges case. */
  values: z.array(text('A list value', 40), { message: 'values must be a list of the allowed values.' }).max(200, 'A list token takes at most 200 values.'),
});

export const NumberTokenSchema = z.object({
  name: tokenName,
  type: z.literal('number'),
  /** 0 = a required digit, # = an optional decimal: "0", "000" (zero-padded), "0.000", "0.0##". */
  format: text('A number format', 20),
  min: z.number({ message: 'min must be a number.' }).optional(),
  max: z.number({ message: 'max must be a number.' }).optional(),
});

export const RegexTokenSchema = z.object({
  name: tokenName,
  type: z.literal('regex'),
  /** A regular expression the whole value must match (anchored for you, letters match regardless of case). */
  regex: text('A regular expression', 200),
  /** What the values look like, said for a machinist: "a part number such as 10452-A". */
  hint: text('A hint', 120).optional(),
});

export const NamingTokenSchema = z.discriminatedUnion('type', [ListTokenSchema, NumberTokenSchema, RegexTokenSchema], {
  error: (iss) =>
    iss.code === 'invalid_union' ? 'A token type must be "list", "number" or "regex".' : 'Each token must be an object with a name and a type.',
});
export type ListToken = z.infer<typeof ListTokenSchema>;
export type NumberToken = z.infer<typeof NumberTokenSchema>;
export type RegexToken = z.infer<typeof RegexTokenSchema>;
export type NamingToken = z.infer<typeof NamingTokenSchema>;

const whole = (label: string) =>
  z.number({ message: `${label} must be a whole number.` }).int(`${label} must be a whole number.`);

const RuleShapeSchema = z.object({
  /** A name passes when it fits any one of these. */
  patterns: z
    .array(text('A pattern', 100), { message: 'patterns must be a list of patterns, such as ["FX-{kind}-{size}"].' })
    .min(1, 'A rule needs at least one pattern, such as FX-{kind}-{size}.')
    .max(20, 'A rule takes at most 20 patterns.'),
  tokens: z.array(NamingTokenSchema, { message: 'tokens must be a list.' }).max(50, 'A rule takes at most 50 tokens.').default([]),
  case: NamingCaseSchema.default('any'),
  minLength: whole('minLength').default(1),
  maxLength: whole('maxLength'),
}, { error: 'A naming rule must be an object with patterns, tokens, case, minLength and maxLength.' });

/** Adds compileRule's problems as issues on the same paths, so a form shows each where it belongs. */
function withMeaning(target?: NamingTarget) {
  return RuleShapeSchema.superRefine((rule, ctx) => {
    const compiled = compileRule(rule, target);
    if (!compiled.ok) for (const p of compiled.problems) ctx.addIssue({ code: 'custom', path: p.path, message: p.message });
  });
}

/** A rule checked on its own; the layer and component rules add their target's limits. */
export const NamingRuleSchema = withMeaning();
export const LayerRuleSchema = withMeaning('layer');
export const ComponentRuleSchema = withMeaning('component');
export type NamingRuleInput = z.input<typeof RuleShapeSchema>;
export type NamingRule = z.output<typeof RuleShapeSchema>;

export const NamingConventionSchema = z.object({
  /** Raised by one each time the lead saves a change, so a check can say which rules it used. */
  version: z.number({ message: 'version must be a whole number.' }).int('version must be a whole number.').min(1, 'version must be 1 or more.').max(ROW_ID_MAX, TOO_LARGE_ID),
  layer: LayerRuleSchema,
  component: ComponentRuleSchema,
}, { error: 'The naming convention must be an object with version, layer and component.' });
export type NamingConventionInput = z.input<typeof NamingConventionSchema>;
export type NamingConvention = z.output<typeof NamingConventionSchema>;

/**
 * PUT /api/naming/convention: the two rules, and optionally `revision`, the convention version the
 * edit started from; when given and another version was saved since, the save is refused with 409.
 */
export const SaveConventionInputSchema = z.object({
  layer: LayerRuleSchema,
  component: ComponentRuleSchema,
  revision: z.number({ message: 'revision must be a whole number: the convention version you edited.' }).int('revision must be a whole number: the convention version you edited.').min(1, 'revision must be 1 or more.').max(ROW_ID_MAX, TOO_LARGE_ID).optional(),
}, { error: 'The naming convention must be an object with layer and component.' });
export type SaveConventionInput = z.input<typeof SaveConventionInputSchema>;

/** The most characters a checked name may have: the DXF limit for symbol-table names since R2000. */
export const MAX_CHECKED_NAME_LENGTH = 255;

/** POST /api/naming/check — a contract external scripts rely on: keep the field names. */
export const NamingCheckInputSchema = z.object({
  target: NamingTargetSchema,
  name: z
    .string({
      error: (iss) =>
        iss.input === undefined ? 'name is required: enter the layer name or component code to check.' : 'name must be text.',
    })
    .min(1, 'name is required: enter the layer name or component code to check.')
    .max(MAX_CHECKED_NAME_LENGTH, `name must be ${MAX_CHECKED_NAME_LENGTH} characters or fewer.`),
});
export type NamingCheckInput = z.infer<typeof NamingCheckInputSchema>;

export const NamingProblemSchema = z.object({
  /** The token that fails, or null for literal text, length, case and DXF problems. */
  token: z.string().nullable(),
  message: z.string(),
});
export type NamingProblem = z.infer<typeof NamingProblemSchema>;

export const NamingCheckResultSchema = z.object({
  ok: z.boolean(),
  problems: z.array(NamingProblemSchema),
});
export type NamingCheckResult = z.infer<typeof NamingCheckResultSchema>;
