import { describe, expect, it } from 'vitest';
import { checkName } from '../../shared/naming/check-name';
import type { NamingRule, NamingToken } from '../../shared/schemas/naming';

// Source of every expectation: the naming syntax (shared/naming/SYNTAX.md) and the sentences the
// checker is specified to say; each problem names the token that fails, or null for text, length
// and case.
const kind: NamingToken = { name: 'kind', type: 'list', values: ['CR', 'JR', 'SR', 'VS', 'ST'] };
const size: NamingToken = { name: 'size', type: 'number', format: '0.000', min: 0.25, max: 12 };
const rule = (over: Partial<NamingRule> = {}): NamingRule => ({
  patterns: ['FX-{kind}-{size}'],
  tokens: [kind, size],
  case: 'any',
  minLength: 1,
  maxLength: 40,
  ...over,
});
const check = (r: NamingRule, name: string) => checkName(r, name, 'component');

describe('token failures: the literal text fits, each failing token is named', () => {
  it.each([
    // name, [token, message]...
    ['FX-CLMP-1.000', [['kind', 'kind: "CLMP" is not one of CR, JR, SR, VS, ST.']]],
    ['FX-JR-1.5', [['size', 'size: "1.5" must be a number written like 1.000 (3 decimals).']]],
    ['FX-JR-1', [['size', 'size: "1" must be a number written like 1.000 (3 decimals).']]],
    ['FX-JR-01.000', [['size', 'size: "01.000" must be a number written like 1.000 (3 decimals).']]],
    ['FX-JR-0.125', [['size', 'size: "0.125" is below the smallest allowed, 0.250.']]],
    ['FX-JR-12.500', [['size', 'size: "12.500" is above the largest allowed, 12.000.']]],
    ['FX-XX-X', [['kind', 'kind: "XX" is not one of CR, JR, SR, VS, ST.'], ['size', 'size: "X" must be a number written like 1.000 (3 decimals).']]],
  ] as const)('%s', (name, expected) => {
    const r = check(rule(), name);
    expect(r.ok).toBe(false);
    expect(r.problems).toEqual(expected.map(([token, message]) => ({ token, message })));
  });

  it('accepts the bounds themselves (min and max are inclusive)', () => {
    expect(check(rule(), 'FX-JR-0.250').ok).toBe(true);
    expect(check(rule(), 'FX-JR-12.000').ok).toBe(true);
  });

  it.each([
    // format, accepted, refused, the words of the refusal
    ['0', ['8', '12', '200'], ['08', '1.5', '-1', '+1', '1e3', ' 1'], 'like 1 (a whole number)'],
    ['000', ['008', '050', '200', '1250'], ['8', '0050', '50'], 'like 001 (a whole number of at least 3 digits, zero-padded)'],
    ['0.000', ['1.000', '12.500', '0.125'], ['1.5', '1', '.500', '1.0000', '1,000'], 'like 1.000 (3 decimals)'],
    ['0.0##', ['0.5', '0.25', '0.375', '1.50'], ['0', '0.3750', '1.'], 'like 1.0 (1 to 3 decimals)'],
    ['0.##', ['3', '3.5', '3.25'], ['3.125', '3.'], 'like 1 (a whole number or up to 2 decimals)'],
    ['00.0', ['05.5', '12.5'], ['5.5', '005.5'], 'like 01.0 (1 decimal, at least 2 digits before the point, zero-padded)'],
  ] as const)('number format %s', (format, good, bad, words) => {
    const r = rule({ patterns: ['N{n}'], tokens: [{ name: 'n', type: 'number', format }] });
    for (const v of good) expect(check(r, `N${v}`), v).toEqual({ ok: true, problems: [] });
    for (const v of bad) expect(check(r, `N${v}`).problems, v).toEqual([{ token: 'n', message: `n: "${v}" must be a number written ${words}.` }]);
  });

  it('a regex token says its hint, or its expression when it has none', () => {
    const part = (hint?: string): NamingRule =>
      rule({ patterns: ['PART-{part}'], tokens: [{ name: 'part', type: 'regex', regex: '[0-9]{5}(-[A-Z])?', ...(hint ? { hint } : {}) }] });
    expect(check(part(), 'PART-10452-A').ok).toBe(true);
    expect(check(part(), 'PART-1045').problems).toEqual([{ token: 'part', message: 'part: "1045" does not match [0-9]{5}(-[A-Z])?.' }]);
    expect(check(part('a five-digit part number, then -A to -Z for a revision'), 'PART-1045').problems).toEqual([
      { token: 'part', message: 'part: "1045" must be a five-digit part number, then -A to -Z for a revision.' },
    ]);
  });

  it('a regular expression must match the whole value, not a piece of it', () => {
    const r = rule({ patterns: ['P{n}'], tokens: [{ name: 'n', type: 'regex', regex: '[0-9]+' }] });
    expect(check(r, 'P12').ok).toBe(true);
    expect(check(r, 'P12A').problems.map((p) => p.token)).toEqual(['n']);
  });

  it('a long list is cut after a dozen values', () => {
    const values = Array.from({ length: 15 }, (_, i) => `V${i + 1}`);
    const r = rule({ patterns: ['{v}'], tokens: [{ name: 'v', type: 'list', values }] });
    expect(check(r, 'X').problems[0]!.message).toBe('v: "X" is not one of V1, V2, V3, V4, V5, V6, V7, V8, V9, V10, V11, V12 and 3 more.');
  });
});

describe('literal failures: what text was expected where', () => {
  it.each([
    // name, message
    ['FX_JR-1.000', 'Expected "-" after "FX", found "_".'],
    ['FXJR-1.000', 'Expected "-" after "FX", found "J".'],
    ['GX-JR-1.000', 'Expected "FX-" at the start, found "GX-".'],
    ['FX', 'Expected "-" after "FX", but the name ends there.'],
    ['FX-JR1.000', 'Expected "-" after "FX-JR", found "1".'],
  ])('%s', (name, message) => {
    expect(check(rule(), name).problems).toEqual([{ token: null, message }]);
  });

  it('a missing token value is reported on that token', () => {
    expect(check(rule(), 'FX-').problems).toEqual([{ token: 'kind', message: 'Expected a value for {kind} after "FX-", but the name ends there.' }]);
  });

  it('text after a pattern that ends in literal text', () => {
    const r = rule({ patterns: ['FX-ST'], tokens: [] });
    expect(check(r, 'FX-STX').problems).toEqual([{ token: null, message: 'Expected the name to end after "FX-ST", found "X".' }]);
  });

  it('letters of the literal text match regardless of case; the case rule judges case', () => {
    expect(check(rule(), 'fx-jr-1.000')).toEqual({ ok: true, problems: [] }); // case: any
  });
});

describe('several patterns: a name passes if any fits; problems are given for the closest', () => {
  const multi = rule({
    patterns: ['{kind}-{n}', 'JR-{size}', 'JR-S{n}-{size}'],
    tokens: [{ name: 'kind', type: 'list', values: ['CR', 'SR'] }, { name: 'n', type: 'number', format: '0' }, size],
  });

  it.each(['CR-8', 'JR-1.000', 'JR-S4-1.000'])('%s passes', (name) => {
    expect(check(multi, name)).toEqual({ ok: true, problems: [] });
  });

  it.each([
    // name, closest, the problem for it
    ['JR-1.5', 'JR-{size}', { token: 'size', message: 'size: "1.5" must be a number written like 1.000 (3 decimals).' }],
    // JR-{size} fits the text too (size "S4-1.5"), with as few failing tokens; the longer literal text wins
    ['JR-S4-1.5', 'JR-S{n}-{size}', { token: 'size', message: 'size: "1.5" must be a number written like 1.000 (3 decimals).' }],
    ['VS-6', '{kind}-{n}', { token: 'kind', message: 'kind: "VS" is not one of CR, SR.' }],
    ['JR_1', 'JR-{size}', { token: null, message: 'Expected "-" after "JR", found "_".' }],
  ] as const)('%s: closest is %s', (name, closest, problem) => {
    expect(check(multi, name).problems).toEqual([
      { token: null, message: `"${name}" fits none of the 3 component-code patterns; the closest is ${closest}.` },
      problem,
    ]);
  });

  it('names every start when the patterns share none', () => {
    const r = rule({ patterns: ['FX-{kind}', 'PART-{p}', 'GRID-{p}'], tokens: [kind, { name: 'p', type: 'regex', regex: '[A-Z]+' }] });
    expect(check(r, 'XY-1').problems).toEqual([
      { token: null, message: '"XY-1" fits none of the 3 component-code patterns.' },
      { token: null, message: 'Expected "FX-", "PART-" or "GRID-" at the start, found "XY-1".' },
    ]);
  });

  it('cuts several expected texts to what they share', () => {
    const r = rule({ patterns: ['FX-{kind}', 'FX-ST'], tokens: [kind] });
    expect(check(r, 'FX_ST').problems[1]).toEqual({ token: null, message: 'Expected "-" after "FX", found "_".' });
  });
});

describe('ambiguous splits: fewest failing tokens, then the earlier token takes the longest value', () => {
  it('two tokens side by side are split where both are allowed', () => {
    const r = rule({
      patterns: ['{a}{b}'],
      tokens: [{ name: 'a', type: 'list', values: ['AB', 'A'] }, { name: 'b', type: 'list', values: ['BC'] }],
    });
    // Greedy alone would take a = "AB" and leave b = "C"; backtracking finds a = "A", b = "BC".
    expect(check(r, 'ABC')).toEqual({ ok: true, problems: [] });
  });

  it('a token whose values hold the "-" that follows it', () => {
    const r = rule({
      patterns: ['{part}-{rev}'],
      tokens: [{ name: 'part', type: 'regex', regex: '[0-9-]+' }, { name: 'rev', type: 'list', values: ['A', 'B'] }],
    });
    expect(check(r, '104-52-A')).toEqual({ ok: true, problems: [] });
    // No good split: the earlier token takes the longest value, so the last "-" is the separator.
    expect(check(r, '104-52-Q').problems).toEqual([{ token: 'rev', message: 'rev: "Q" is not one of A, B.' }]);
  });

  it('adjacent number tokens: the greedy split when both fit more than one way', () => {
    const r = rule({ patterns: ['{a}{b}'], tokens: [{ name: 'a', type: 'number', format: '0' }, { name: 'b', type: 'number', format: '0', max: 9 }] });
    expect(check(r, '123')).toEqual({ ok: true, problems: [] }); // a = 12, b = 3
    expect(check(r, '1')).toEqual({ ok: false, problems: [{ token: 'b', message: 'Expected a value for {b} after "1", but the name ends there.' }] });
  });
});

describe('case and length limits', () => {
  it.each([
    // case, name, problems
    ['upper', 'FX-JR-1.000', []],
    ['upper', 'fx-jr-1.000', ['A component code must be written in capitals: "FX-JR-1.000", not "fx-jr-1.000".']],
    ['upper', 'FX-Jr-1.000', ['A component code must be written in capitals: "FX-JR-1.000", not "FX-Jr-1.000".']],
    ['lower', 'fx-jr-1.000', []],
    ['lower', 'FX-jr-1.000', ['A component code must be written in lower case: "fx-jr-1.000", not "FX-jr-1.000".']],
    ['any', 'Fx-jR-1.000', []],
  ] as const)('case %s: %s', (c, name, messages) => {
    const values = c === 'lower' ? ['cr', 'jr'] : ['CR', 'JR'];
    const patterns = [c === 'lower' ? 'fx-{kind}-{size}' : 'FX-{kind}-{size}'];
    const r = rule({ case: c, patterns, tokens: [{ ...kind, values }, size] });
    expect(check(r, name).problems).toEqual(messages.map((message) => ({ token: null, message })));
  });

  it.each([
    // minLength, maxLength, name, problems
    [1, 12, 'FX-JR-1.000', []],
    [1, 10, 'FX-JR-1.000', ['A component code must be at most 10 characters; "FX-JR-1.000" has 11.']],
    [12, 40, 'FX-JR-1.000', ['A component code must be at least 12 characters; "FX-JR-1.000" has 11.']],
    [11, 11, 'FX-JR-1.000', []],
  ])('lengths %i to %i: %s', (minLength, maxLength, name, messages) => {
    expect(check(rule({ minLength, maxLength }), name).problems).toEqual(messages.map((message) => ({ token: null, message })));
  });

  it('an empty name gets one problem', () => {
    expect(check(rule(), '')).toEqual({ ok: false, problems: [{ token: null, message: 'The component code is empty; enter one.' }] });
    expect(checkName(rule({ maxLength: 31, patterns: ['FX-{kind}'], tokens: [kind] }), '', 'layer').problems[0]!.message).toBe('The layer name is empty; enter one.');
  });

  it('case, length and token problems are reported together', () => {
    const r = check(rule({ case: 'upper', maxLength: 8 }), 'fx-jr-1.5');
    expect(r.problems.map((p) => p.token)).toEqual([null, null, 'size']);
  });
});

describe('a rule that does not compile', () => {
  it('answers every name with its problems instead of throwing', () => {
    const r = check(rule({ patterns: ['FX-{kinf}-{size}'] }), 'FX-JR-1.000');
    expect(r.ok).toBe(false);
    expect(r.problems).toEqual([
      { token: null, message: 'The component-code rule cannot be used until it is fixed: Pattern 1 uses {kinf}, but no token is named kinf; define it or fix the spelling.' },
      { token: null, message: 'The component-code rule cannot be used until it is fixed: Token kind is not used by any pattern; use it as {kind} or remove it.' },
    ]);
  });
});
