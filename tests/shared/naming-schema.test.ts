import { describe, expect, it } from 'vitest';
import { checkName } from '../../shared/naming/check-name';
import { DEMO_CONVENTION } from '../../shared/naming/conventions';
import {
  NamingCheckInputSchema,
  NamingCheckResultSchema,
  NamingConventionSchema,
  NamingRuleSchema,
} from '../../shared/schemas/naming';

// Source of every expectation: the POST /api/naming/check contract (field names kept exactly),
// the convention's shape, and the schema's own messages, each naming what to fix.
function issues(schema: { safeParse(v: unknown): { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } } }, input: unknown) {
  const r = schema.safeParse(input);
  expect(r.success).toBe(false);
  return (r.error?.issues ?? []).map((i) => ({ path: i.path.join('.'), message: i.message }));
}

describe('NamingCheckInputSchema', () => {
  it('accepts {target, name} unchanged, without trimming the name', () => {
    expect(NamingCheckInputSchema.parse({ target: 'layer', name: ' FX-CR-8' })).toEqual({ target: 'layer', name: ' FX-CR-8' });
    expect(NamingCheckInputSchema.parse({ target: 'component', name: 'CR-8' })).toEqual({ target: 'component', name: 'CR-8' });
  });

  it.each([
    ['a missing target', { name: 'CR-8' }, 'target', 'target must be "layer" or "component".'],
    ['an unknown target', { target: 'code', name: 'CR-8' }, 'target', 'target must be "layer" or "component".'],
    ['a missing name', { target: 'layer' }, 'name', 'name is required'],
    ['an empty name', { target: 'layer', name: '' }, 'name', 'name is required'],
    ['a name that is not text', { target: 'layer', name: 8 }, 'name', 'name must be text.'],
    ['a name past 255 characters', { target: 'layer', name: 'A'.repeat(256) }, 'name', 'name must be 255 characters or fewer.'],
  ])('refuses %s', (_what, input, path, words) => {
    const found = issues(NamingCheckInputSchema, input);
    expect(found.some((i) => i.path === path && i.message.includes(words)), JSON.stringify(found)).toBe(true);
  });
});

describe('NamingCheckResultSchema', () => {
  it('is the exact shape checkName answers: {ok, problems: [{token, message}]}', () => {
    const r = checkName(DEMO_CONVENTION.component, 'JR-1.5', 'component');
    expect(NamingCheckResultSchema.parse(r)).toEqual(r);
    expect(Object.keys(r).sort()).toEqual(['ok', 'problems']);
    for (const p of r.problems) expect(Object.keys(p).sort()).toEqual(['message', 'token']);
    expect(r.problems.map((p) => p.token)).toEqual([null, 'width']);
  });

  it('refuses a problem without its token field', () => {
    expect(NamingCheckResultSchema.safeParse({ ok: false, problems: [{ message: 'x' }] }).success).toBe(false);
  });
});

describe('NamingConventionSchema', () => {
  it('fills the defaults of a rule: no tokens, any case, minLength 1', () => {
    expect(NamingRuleSchema.parse({ patterns: ['FX-ST'], maxLength: 31 })).toEqual({ patterns: ['FX-ST'], tokens: [], case: 'any', minLength: 1, maxLength: 31 });
  });

  it.each([
    ['a missing version', { ...DEMO_CONVENTION, version: undefined }, 'version', 'version must be a whole number.'],
    ['version 0', { ...DEMO_CONVENTION, version: 0 }, 'version', 'version must be 1 or more.'],
    ['a rule that is not an object', { ...DEMO_CONVENTION, component: 'CR-8' }, 'component', 'A naming rule must be an object'],
    ['no patterns', { ...DEMO_CONVENTION, layer: { ...DEMO_CONVENTION.layer, patterns: [] } }, 'layer.patterns', 'A rule needs at least one pattern'],
    ['a missing maxLength', { ...DEMO_CONVENTION, layer: { ...DEMO_CONVENTION.layer, maxLength: undefined } }, 'layer.maxLength', 'maxLength must be a whole number.'],
    ['an unknown case', { ...DEMO_CONVENTION, layer: { ...DEMO_CONVENTION.layer, case: 'title' } }, 'layer.case', 'Case must be "upper"'],
    ['an unknown token type', { ...DEMO_CONVENTION, component: { ...DEMO_CONVENTION.component, tokens: [{ name: 'x', type: 'date' }] } }, 'component.tokens.0.type', 'A token type must be "list", "number" or "regex".'],
    ['a token that is not an object', { ...DEMO_CONVENTION, component: { ...DEMO_CONVENTION.component, tokens: [5] } }, 'component.tokens.0', 'Each token must be an object with a name and a type.'],
    // what the pieces mean together, from compileRule, on the same paths
    ['an unknown token in a pattern', { ...DEMO_CONVENTION, layer: { ...DEMO_CONVENTION.layer, patterns: [...DEMO_CONVENTION.layer.patterns, 'FX-{nope}'] } }, 'layer.patterns.7', 'Pattern 8 uses {nope}'],
    // DXF Reference, R12 names: at most 31 characters
    ['a layer maxLength past 31', { ...DEMO_CONVENTION, layer: { ...DEMO_CONVENTION.layer, maxLength: 40 } }, 'layer.maxLength', 'at most 31 characters'],
  ])('refuses %s', (_what, input, path, words) => {
    const found = issues(NamingConventionSchema, input);
    expect(found.some((i) => i.path === path && i.message.includes(words)), JSON.stringify(found)).toBe(true);
  });

  it('a component rule may be longer than 31 characters; a layer rule may not', () => {
    const long = { ...DEMO_CONVENTION.component, maxLength: 40 };
    expect(NamingConventionSchema.safeParse({ ...DEMO_CONVENTION, component: long }).success).toBe(true);
    expect(NamingConventionSchema.safeParse({ ...DEMO_CONVENTION, layer: { ...DEMO_CONVENTION.layer, maxLength: 32 } }).success).toBe(false);
  });
});
