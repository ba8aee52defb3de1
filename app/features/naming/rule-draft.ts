import { NAMING_CASES, NAMING_TARGETS, SaveConventionInputSchema, type NamingCase, type NamingConvention, type NamingRule, type NamingTarget, type SaveConventionInput } from '../../../shared/schemas/naming';
import { zodIssues, type FieldIssue } from '../../../shared/schemas/issues';
import { parseDecimal } from '../../../shared/units/decimal';

/**
 * The naming rules as the form holds them while the lead edits: every field as the text typed,
 * every list as rows with a key of their own, every token keeping the fields of all three types so
 * switching a token's type and back loses nothing. Rows keep their order, so an issue's path
 * (`layer.tokens.2.values.4`) names the same row here as in the rules sent.
 */

export const TOKEN_TYPES = ['list', 'number', 'regex'] as const;
export type TokenType = (typeof TOKEN_TYPES)[number];

export interface Row { key: string; text: string }
export interface TokenDraft {
  key: string;
  name: string;
  type: TokenType;
  values: Row[];
  format: string;
  min: string;
  max: string;
  regex: string;
  hint: string;
}
export interface RuleDraft {
  patterns: Row[];
  tokens: TokenDraft[];
  case: NamingCase;
  minLength: string;
  maxLength: string;
}
export type RulesDraft = Record<NamingTarget, RuleDraft>;

let seq = 0;
const newKey = () => `k${++seq}`;
const row = (text: string): Row => ({ key: newKey(), text });
const numText = (v: number | undefined) => (v === undefined ? '' : String(v));

export function emptyToken(): TokenDraft {
  return { key: newKey(), name: '', type: 'list', values: [row('')], format: '0', min: '', max: '', regex: '', hint: '' };
}

function tokenDraft(t: NamingRule['tokens'][number]): TokenDraft {
  const base = emptyToken();
  if (t.type === 'list') return { ...base, name: t.name, type: 'list', values: t.values.map(row) };
  if (t.type === 'number') return { ...base, name: t.name, type: 'number', values: [], format: t.format, min: numText(t.min), max: numText(t.max) };
  return { ...base, name: t.name, type: 'regex', values: [], regex: t.regex, hint: t.hint ?? '' };
}

export function ruleDraft(rule: NamingRule): RuleDraft {
  return { patterns: rule.patterns.map(row), tokens: rule.tokens.map(tokenDraft), case: rule.case, minLength: numText(rule.minLength), maxLength: numText(rule.maxLength) };
}

export const rulesDraft = (c: Pick<NamingConvention, NamingTarget>): RulesDraft => ({ layer: ruleDraft(c.layer), component: ruleDraft(c.component) });

/** A typed number: blank is left out (the schema's default or its "required" sentence), anything else read as RS274 decimals; NaN for text the schema then refuses. */
const num = (text: string): number | undefined => (text.trim() === '' ? undefined : parseDecimal(text.trim()) ?? Number.NaN);

function tokenInput(t: TokenDraft) {
  if (t.type === 'list') return { name: t.name, type: 'list' as const, values: t.values.map((v) => v.text) };
  if (t.type === 'number') return { name: t.name, type: 'number' as const, format: t.format, min: num(t.min), max: num(t.max) };
  return { name: t.name, type: 'regex' as const, regex: t.regex, ...(t.hint.trim() ? { hint: t.hint } : {}) };
}

function ruleInput(r: RuleDraft) {
  return { patterns: r.patterns.map((p) => p.text), tokens: r.tokens.map(tokenInput), case: r.case, minLength: num(r.minLength), maxLength: num(r.maxLength) as number };
}

/** What PUT /api/naming/convention takes (without the revision). */
export const rulesInput = (d: RulesDraft): Omit<SaveConventionInput, 'revision'> => ({ layer: ruleInput(d.layer), component: ruleInput(d.component) });

/** The form's rules checked with the schema the server uses: the issues on their paths, none when they would save. */
export function checkRules(d: RulesDraft): FieldIssue[] {
  const parsed = SaveConventionInputSchema.safeParse(rulesInput(d));
  return parsed.success ? [] : zodIssues(parsed.error);
}

/** The rules as JSON a lead can keep or send, the same shape the API takes and answers (without version). */
export function rulesJson(d: RulesDraft): string {
  const drop = (v: unknown) => JSON.parse(JSON.stringify(v)) as unknown; // leaves out undefined min/max
  return JSON.stringify(drop(rulesInput(d)), null, 2);
}

type Loaded = { ok: true; rules: RulesDraft } | { ok: false; message: string };

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
const text = (v: unknown) => (v === undefined || v === null ? '' : String(v));
const TARGET_WORDS: Record<NamingTarget, string> = { layer: 'layer', component: 'component' };

/**
 * Rules pasted or read from a file, into the form. Only the shape is checked here (objects, lists,
 * a known token type), with a sentence naming the place; what the rules mean is checked by the form
 * as for typed rules, on their fields. A saved convention's `version` is ignored.
 */
export function loadRulesJson(source: string): Loaded {
  let json: unknown;
  try {
    json = JSON.parse(source);
  } catch (e) {
    return { ok: false, message: `The text is not JSON the form can read (${(e as Error).message}); check the brackets, quotes and commas there.` };
  }
  if (!isObject(json)) return { ok: false, message: 'The JSON must be one object with "layer" and "component" rules.' };
  const out: Partial<RulesDraft> = {};
  for (const target of NAMING_TARGETS) {
    const r = json[target];
    if (!isObject(r)) return { ok: false, message: `The JSON has no "${target}" rule; it needs one object for layer names and one for component codes.` };
    if (!Array.isArray(r.patterns)) return { ok: false, message: `The ${TARGET_WORDS[target]} rule's "patterns" must be a list, such as ["FX-{kind}-{size}"].` };
    const tokens = r.tokens ?? [];
    if (!Array.isArray(tokens)) return { ok: false, message: `The ${TARGET_WORDS[target]} rule's "tokens" must be a list.` };
    const drafts: TokenDraft[] = [];
    for (const [i, t] of tokens.entries()) {
      if (!isObject(t) || !TOKEN_TYPES.includes(t.type as TokenType)) return { ok: false, message: `Token ${i + 1} of the ${TARGET_WORDS[target]} rule needs a "type" of "list", "number" or "regex".` };
      if (t.type === 'list' && !Array.isArray(t.values)) return { ok: false, message: `Token ${i + 1} of the ${TARGET_WORDS[target]} rule is a list, so its "values" must be a list of the allowed values.` };
      drafts.push({
        ...emptyToken(), name: text(t.name), type: t.type as TokenType,
        values: Array.isArray(t.values) ? t.values.map((v) => row(text(v))) : [],
        format: text(t.format ?? '0'), min: text(t.min), max: text(t.max), regex: text(t.regex), hint: text(t.hint),
      });
    }
    const ruleCase = NAMING_CASES.includes(r.case as NamingCase) ? (r.case as NamingCase) : r.case === undefined ? 'any' : null;
    if (!ruleCase) return { ok: false, message: `The ${TARGET_WORDS[target]} rule's "case" must be "upper", "lower" or "any".` };
    out[target] = { patterns: r.patterns.map((p) => row(text(p))), tokens: drafts, case: ruleCase, minLength: text(r.minLength), maxLength: text(r.maxLength) };
  }
  return { ok: true, rules: out as RulesDraft };
}

// ---------- editing ----------

export type TokenField = 'name' | 'type' | 'format' | 'min' | 'max' | 'regex' | 'hint';
export type RuleField = 'case' | 'minLength' | 'maxLength';

export type RulesAction =
  | { type: 'rule'; target: NamingTarget; field: RuleField; value: string }
  | { type: 'pattern'; target: NamingTarget; index: number; value: string }
  | { type: 'add-pattern'; target: NamingTarget }
  | { type: 'remove-pattern'; target: NamingTarget; index: number }
  | { type: 'token'; target: NamingTarget; index: number; field: TokenField; value: string }
  | { type: 'add-token'; target: NamingTarget }
  | { type: 'remove-token'; target: NamingTarget; index: number }
  | { type: 'value'; target: NamingTarget; token: number; index: number; value: string }
  | { type: 'add-value'; target: NamingTarget; token: number }
  | { type: 'remove-value'; target: NamingTarget; token: number; index: number }
  | { type: 'load'; rules: RulesDraft };

const replace = <T>(list: readonly T[], i: number, f: (x: T) => T): T[] => list.map((x, k) => (k === i ? f(x) : x));
const without = <T>(list: readonly T[], i: number): T[] => list.filter((_, k) => k !== i);

function editRule(r: RuleDraft, a: Exclude<RulesAction, { type: 'load' }>): RuleDraft {
  switch (a.type) {
    case 'rule': return a.field === 'case' ? { ...r, case: a.value as NamingCase } : { ...r, [a.field]: a.value };
    case 'pattern': return { ...r, patterns: replace(r.patterns, a.index, (p) => ({ ...p, text: a.value })) };
    case 'add-pattern': return { ...r, patterns: [...r.patterns, row('')] };
    case 'remove-pattern': return { ...r, patterns: without(r.patterns, a.index) };
    case 'token': return { ...r, tokens: replace(r.tokens, a.index, (t) => ({ ...t, [a.field]: a.value })) };
    case 'add-token': return { ...r, tokens: [...r.tokens, emptyToken()] };
    case 'remove-token': return { ...r, tokens: without(r.tokens, a.index) };
    case 'value': return { ...r, tokens: replace(r.tokens, a.token, (t) => ({ ...t, values: replace(t.values, a.index, (v) => ({ ...v, text: a.value })) })) };
    case 'add-value': return { ...r, tokens: replace(r.tokens, a.token, (t) => ({ ...t, values: [...t.values, row('')] })) };
    case 'remove-value': return { ...r, tokens: replace(r.tokens, a.token, (t) => ({ ...t, values: without(t.values, a.index) })) };
  }
}

export function editRules(d: RulesDraft, a: RulesAction): RulesDraft {
  if (a.type === 'load') return a.rules;
  return { ...d, [a.target]: editRule(d[a.target], a) };
}
