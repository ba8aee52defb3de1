import { describe, expect, it } from 'vitest';
import { checkName } from '../../shared/naming/check-name';
import { DEFAULT_CONVENTION } from '../../shared/naming/conventions';
import { DXF_NAME_MAX_LENGTH, dxfBadChars } from '../../shared/naming/dxf-names';
import type { NamingRule } from '../../shared/schemas/naming';

// Source of every limit here: DXF Reference, TABLES section (symbol-table names such as LAYER),
// held to the R12 rules: at most 31 characters, each a letter, a digit, "$", "-" or "_".
const layer = DEFAULT_CONVENTION.layer;

/** A layer rule that lets anything through, so only the fixed DXF rule can refuse. */
const anything: NamingRule = {
  patterns: ['{any}'],
  tokens: [{ name: 'any', type: 'regex', regex: '[\\s\\S]+' }],
  case: 'any',
  minLength: 1,
  maxLength: 31,
};

describe('DXF R12 symbol-table names, checked on every layer name', () => {
  it('31 is the limit', () => {
    expect(DXF_NAME_MAX_LENGTH).toBe(31); // DXF Reference, R12 names: at most 31 characters
  });

  it.each([
    // name, source
    ['FX$1', 'DXF R12 names: "$" allowed'],
    ['FX-CR_8', 'DXF R12 names: "-" and "_" allowed'],
    ['0', 'DXF R12 names: digits allowed (layer 0 is every drawing\'s default layer)'],
    ['A'.repeat(31), 'DXF R12 names: 31 characters is the limit, inclusive'],
    ['fx-cr-8', 'DXF R12 names: letters; case is the convention\'s business, not the DXF rule\'s'],
    ['$-_', 'DXF R12 names: only the three special characters'],
  ])('accepts %j (%s)', (name) => {
    expect(checkName(layer, name, 'layer')).toEqual({ ok: true, problems: [] });
  });

  it.each([
    // name, the words the one problem must hold, source
    ['A'.repeat(32), `at most 31 characters (DXF R12 symbol-table names); "${'A'.repeat(32)}" has 32.`, 'DXF R12: over 31 characters'],
    ['A B', '"A B" has a space', 'DXF R12: a space is not in the set'],
    ['FX.1', '"FX.1" has "."', 'DXF R12: "." is not in the set'],
    ['LAYER#1', '"LAYER#1" has "#"', 'DXF R12: "#" is not in the set'],
    ['A/B\\C', 'has "/" and "\\"', 'DXF R12: slashes are not in the set'],
    ['ÄRGER', 'has "Ä"', 'DXF R12: letters means A–Z, not accented letters'],
    ['TAB\tX', 'has a tab', 'DXF R12: control characters are not in the set'],
    ['a,b;c=d?e*f|g', 'has ",", ";", "=", "?", "*" and others.', 'DXF R12: punctuation; five are named, then "others"'],
  ])('refuses %j', (name, words) => {
    const r = checkName(anything, name, 'layer');
    expect(r.ok).toBe(false);
    expect(r.problems).toHaveLength(1);
    expect(r.problems[0]!.token).toBeNull();
    expect(r.problems[0]!.message).toContain(words);
  });

  it('reports length and characters together, both with token null', () => {
    const r = checkName(anything, 'A '.repeat(20), 'layer');
    expect(r.problems.map((p) => p.token)).toEqual([null, null]);
    expect(r.problems[0]!.message).toContain('at most 31 characters');
    expect(r.problems[1]!.message).toContain('has a space');
  });

  it('is a layer rule only: a component code is not held to it', () => {
    // Same rule, same name: refused as a layer, accepted as a component code.
    expect(checkName({ ...anything, maxLength: 40 }, 'A B.C', 'component')).toEqual({ ok: true, problems: [] });
    expect(checkName(anything, 'A B.C', 'layer').ok).toBe(false);
  });

  it('a stricter rule length wins over 31 and says so without naming DXF', () => {
    const r = checkName({ ...anything, maxLength: 20 }, 'A'.repeat(25), 'layer');
    expect(r.problems).toEqual([{ token: null, message: `A layer name must be at most 20 characters; "${'A'.repeat(25)}" has 25.` }]);
  });

  it('dxfBadChars lists each offending character once, in order of first use', () => {
    expect(dxfBadChars('A B.C D.')).toEqual([' ', '.']); // DXF R12 set: letters, digits, $ - _
    expect(dxfBadChars('FX$-_9z')).toEqual([]);
  });
});
