import { describe, expect, it } from 'vitest';
import { compileRule, hasNestedRepeat } from '../../shared/naming/compile-rule';
import type { NamingRule, NamingTarget, NamingToken } from '../../shared/schemas/naming';

// Source of every expectation: the naming syntax (shared/naming/SYNTAX.md); for layer rules also
// the DXF Reference (TABLES section), R12 symbol-table names: 31 characters of letters, digits, $ - _.
const kind: NamingToken = { name: 'kind', type: 'list', values: ['CR', 'JR'] };
const size: NamingToken = { name: 'size', type: 'number', format: '000' };
const base: NamingRule = { patterns: ['FX-{kind}-{size}'], tokens: [kind, size], case: 'upper', minLength: 1, maxLength: 31 };

function problems(over: Partial<NamingRule>, target?: NamingTarget) {
  const r = compileRule({ ...base, ...over }, target);
  expect(r.ok).toBe(false);
  return r.ok ? [] : r.problems;
}

describe('compileRule accepts', () => {
  it.each([
    ['the base rule', {}],
    ['several patterns sharing tokens', { patterns: ['FX-{kind}-{size}', '{kind}{size}'] }],
    ['a token used twice in one pattern', { patterns: ['{kind}-{size}-{size}'] }],
    ['a pattern of literal text only, with no tokens', { patterns: ['FX-ST'], tokens: [] }],
    ['two tokens side by side (matched with backtracking)', { patterns: ['{kind}{size}'] }],
    ['a regex token', { patterns: ['P-{p}'], tokens: [{ name: 'p', type: 'regex', regex: '[A-Z0-9][A-Z0-9-]*' }] }],
  ] as const)('%s', (_what, over) => {
    const r = compileRule({ ...base, ...(over as Partial<NamingRule>) }, 'layer');
    expect(r.ok, r.ok ? '' : JSON.stringify(r.problems)).toBe(true);
  });
});

describe('compileRule refuses, on the path of the field to fix', () => {
  it.each([
    // what, rule change, target, path, words the message must hold
    ['an unknown token in a pattern', { patterns: ['FX-{kinf}-{size}', '{kind}'] }, undefined, 'patterns.0', 'Pattern 1 uses {kinf}, but no token is named kinf; define it or fix the spelling.'],
    ['a token name in the wrong case', { patterns: ['FX-{Kind}-{size}', '{kind}'] }, undefined, 'patterns.0', 'did you mean {kind}?'],
    ['a token defined twice', { tokens: [kind, size, { ...kind, values: ['SR'] }] }, undefined, 'tokens.2.name', 'Token kind is defined twice (tokens 1 and 3)'],
    ['a token no pattern uses', { tokens: [kind, size, { name: 'spare', type: 'list', values: ['A'] }] }, undefined, 'tokens.2.name', 'Token spare is not used by any pattern'],
    ['a bad token name', { tokens: [kind, size, { name: '2x', type: 'list', values: ['A'] }] }, undefined, 'tokens.2.name', 'Token name "2x" must start with a letter'],
    ['an empty list', { tokens: [{ ...kind, values: [] }, size] }, undefined, 'tokens.0.values', 'Token kind has no values; list at least one allowed value.'],
    ['an empty list value', { tokens: [{ ...kind, values: ['CR', ''] }, size] }, undefined, 'tokens.0.values.1', 'Token kind has an empty value (value 2)'],
    ['a list value twice, in any case', { tokens: [{ ...kind, values: ['CR', 'JR', 'cr'] }, size] }, undefined, 'tokens.0.values.2', 'Token kind lists "cr" twice (values 1 and 3'],
    ['a list value against the case rule', { tokens: [{ ...kind, values: ['CR', 'Jr'] }, size] }, undefined, 'tokens.0.values.1', 'the rule asks for capitals; write "JR"'],
    ['literal text against the case rule', { patterns: ['fx-{kind}-{size}'] }, undefined, 'patterns.0', 'Pattern 1 has the text "fx-", but the rule asks for capitals; write "FX-".'],
    ['a bad regex', { tokens: [kind, size, { name: 'p', type: 'regex', regex: '[A-Z' }], patterns: ['FX-{kind}-{size}', '{p}'] }, undefined, 'tokens.2.regex', 'Token p has a regular expression that does not compile'],
    ['a regex that would close the anchoring group', { tokens: [kind, size, { name: 'p', type: 'regex', regex: 'A)|(B' }], patterns: ['FX-{kind}-{size}', '{p}'] }, undefined, 'tokens.2.regex', 'does not compile'],
    ['an empty regex', { tokens: [kind, size, { name: 'p', type: 'regex', regex: '' }], patterns: ['FX-{kind}-{size}', '{p}'] }, undefined, 'tokens.2.regex', 'Token p has an empty regular expression'],
    ['a nested repeat', { tokens: [kind, size, { name: 'p', type: 'regex', regex: '(A+)+' }], patterns: ['FX-{kind}-{size}', '{p}'] }, undefined, 'tokens.2.regex', 'repeats a group that itself repeats'],
    ['a bad number format', { tokens: [kind, { ...size, format: '0.0.0' }] }, undefined, 'tokens.1.format', 'Token size has the format "0.0.0"; write it like 0, 000, 0.000 or 0.0##'],
    ['a format with # before the point', { tokens: [kind, { ...size, format: '#0' }] }, undefined, 'tokens.1.format', 'has the format "#0"'],
    ['a format with a point and no decimals', { tokens: [kind, { ...size, format: '0.' }] }, undefined, 'tokens.1.format', 'has the format "0."'],
    ['max below min', { tokens: [kind, { ...size, min: 10, max: 5 }] }, undefined, 'tokens.1.max', 'Token size has max 5 below min 10; no value could pass.'],
    ['a min that is not finite', { tokens: [kind, { ...size, min: Number.NaN }] }, undefined, 'tokens.1.min', 'Token size has a min that is not a finite number'],
    ['an unknown token type', { tokens: [kind, { name: 'size', type: 'date' } as unknown as NamingToken] }, undefined, 'tokens.1.type', 'use "list", "number" or "regex"'],
    ['an empty pattern', { patterns: ['FX-{kind}-{size}', ''] }, undefined, 'patterns.1', 'Pattern 2 is empty'],
    ['an unclosed brace', { patterns: ['FX-{kind-{size}'] }, undefined, 'patterns.0', 'Pattern 1 has a "{" at character 4 with no "}" after it'],
    ['a stray closing brace', { patterns: ['FX-{kind}}-{size}'] }, undefined, 'patterns.0', 'Pattern 1 has a "}" at character 10 with no "{" before it'],
    ['an empty token', { patterns: ['FX-{kind}-{size}{}'] }, undefined, 'patterns.0', 'Pattern 1 has an empty token {}'],
    ['a pattern twice', { patterns: ['FX-{kind}-{size}', 'FX-{kind}-{size}'] }, undefined, 'patterns.1', 'Pattern 2 is the same as pattern 1; remove one.'],
    ['a pattern longer than maxLength', { patterns: ['FX-{kind}-{size}-TOO-LONG'], maxLength: 12 }, undefined, 'patterns.0', 'Pattern 1 needs at least 15 characters, more than maxLength (12) allows.'],
    ['maxLength below minLength', { minLength: 10, maxLength: 5 }, undefined, 'maxLength', 'maxLength (5) is below minLength (10); no name could pass.'],
    ['minLength zero', { minLength: 0 }, undefined, 'minLength', 'minLength must be a whole number, 1 or more.'],
    ['maxLength past 255', { maxLength: 256 }, undefined, 'maxLength', 'maxLength must be a whole number from 1 to 255.'],
    ['an unknown case', { case: 'title' as NamingRule['case'] }, undefined, 'case', 'Case must be "upper"'],
    // DXF R12: at most 31 characters
    ['a layer maxLength past 31', { maxLength: 32 }, 'layer', 'maxLength', 'a layer name can be at most 31 characters (DXF R12 symbol-table names)'],
    // DXF R12: letters, digits, $ - _ only
    ['layer text DXF cannot hold', { patterns: ['FX {kind}-{size}'] }, 'layer', 'patterns.0', 'Pattern 1 has the text "FX ", but a layer name cannot hold a space'],
    ['a layer list value DXF cannot hold', { tokens: [{ ...kind, values: ['CR', 'J.R'] }, size] }, 'layer', 'tokens.0.values.1', 'a layer name cannot hold "."'],
    ['a layer number with decimals', { tokens: [kind, { ...size, format: '0.000' }] }, 'layer', 'tokens.1.format', 'write the number without a point, as in 0000 for thousandths'],
  ] as const)('%s', (_what, over, target, path, words) => {
    const found = problems(over as Partial<NamingRule>, target);
    const hit = found.find((p) => p.path.join('.') === path && p.message.includes(words));
    expect(hit, JSON.stringify(found)).toBeDefined();
  });

  it('the DXF limits apply to layer rules only', () => {
    const rule = { ...base, patterns: ['FX {kind}-{size}'], maxLength: 40 };
    expect(compileRule(rule, 'component').ok).toBe(true);
    expect(compileRule(rule).ok).toBe(true);
    expect(compileRule(rule, 'layer').ok).toBe(false);
  });

  it('a broken token is reported once, on the token, not again on the pattern that uses it', () => {
    const found = problems({ tokens: [{ ...kind, values: [] }, size] });
    expect(found).toEqual([{ path: ['tokens', 0, 'values'], message: 'Token kind has no values; list at least one allowed value.' }]);
  });
});

describe('hasNestedRepeat', () => {
  it.each([
    // regex, nested?  Source: a group holding a repeat of varying count, itself repeated, is the
    // shape that sends a backtracking engine exponential (common practice in regex review).
    ['(A+)+', true],
    ['(\\d*-?)*', true],
    ['([A-Z]{2,})+', true],
    ['((A)+)*', true],
    ['[A-Z0-9]+(-[A-Z0-9]+)*', true], // safe in fact; refused by the simple scan, SYNTAX.md says how to write it
    ['(AB){2}', false],
    ['(A{3})+', false],
    ['(A+){2}', false],
    ['[(+]+', false],
    ['\\(A+\\)+', false],
    ['(?:A|B)+', false],
    ['[A-Z0-9][A-Z0-9-]*', false],
  ])('%s → %s', (regex, nested) => {
    expect(hasNestedRepeat(regex)).toBe(nested);
  });
});
