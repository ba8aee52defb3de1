import { describe, expect, it } from 'vitest';
import { checkName } from '../../shared/naming/check-name';
import { DEFAULT_CONVENTION, DEMO_CONVENTION } from '../../shared/naming/conventions';
import { proposeName } from '../../shared/naming/propose-name';
import type { NamingRule } from '../../shared/schemas/naming';

// Source of every expectation: the derivations proposeName is specified to try (SYNTAX.md,
// "Suggested names"), with the demo convention; for layers the DXF R12 limits (DXF Reference,
// TABLES section: 31 characters of letters, digits, $ - _).
const demoLayer = DEMO_CONVENTION.layer;

describe('proposeName', () => {
  it.each([
    // name, target (the demo rule for it), proposal, how it is derived
    ['FX-CR-8', 'layer', 'FX-CR-8', 'already conforming: unchanged'],
    ['fx-cr-8', 'layer', 'FX-CR-8', 'capitals, as the rule asks'],
    ['fx cr 8', 'layer', 'FX-CR-8', 'spaces to "-", then capitals'],
    ['  FX  -  VS - 6 ', 'layer', 'FX-VS-6', 'runs of spaces and "-" become one "-"'],
    ['FX.JR.1000', 'layer', 'FX-JR-1000', 'dots to "-"'],
    ['Part 10452-A', 'layer', 'PART-10452-A', 'spaces to "-", then capitals'],
    ['part 10452#A', 'layer', 'PART-10452_A', 'a character DXF refuses to "_"'],
    ['fx-jrm-30', 'layer', 'FX-JRM-30', 'literals and list values as the pattern writes them'],
    ['FX-JR-1.000', 'layer', null, 'a decimal digit is never dropped (1.000 is not re-spelled 0001)'],
    ['CLAMP RAIL', 'layer', null, 'no simple change makes it fit'],
    ['jr-1.5', 'component', 'JR-1.500', 'a number padded to its format'],
    ['jr-s4-1', 'component', 'JR-S4-1.000', 'a number padded to its format'],
    ['vs 6', 'component', 'VS-6', 'a space to "-" and capitals'],
    ['JR-1.0005', 'component', null, 'a decimal digit is never dropped'],
    ['jr-s4-1.000', 'component', 'JR-S4-1.000', 'capitals; the code keeps its "."'],
  ] as const)('%s (%s) → %s: %s', (name, target, proposal, _how) => {
    const rule = DEMO_CONVENTION[target];
    const got = proposeName(rule, name, target);
    expect(got).toBe(proposal);
    if (got !== null) expect(checkName(rule, got, target).ok).toBe(true);
  });

  it('cuts a layer name to 31 characters (DXF R12) and drops a trailing separator', () => {
    const name = 'Station markers and numbers layer'; // 33 characters
    expect(proposeName(DEFAULT_CONVENTION.layer, name)).toBe('Station-markers-and-numbers-lay');
    expect(proposeName(DEFAULT_CONVENTION.layer, 'Outline of the plate edge and m')).toBe('Outline-of-the-plate-edge-and-m');
    // 31st character is the "-" before "more": cut, then the dangling "-" dropped
    expect(proposeName(DEFAULT_CONVENTION.layer, 'Outline of the plate edges and more')).toBe('Outline-of-the-plate-edges-and');
  });

  it('cuts to the rule\'s own limit when it is below 31', () => {
    const rule: NamingRule = { ...DEFAULT_CONVENTION.layer, maxLength: 10 };
    expect(proposeName(rule, 'long layer name')).toBe('long-layer');
  });

  it('never cuts a component code: a shorter code could name another component', () => {
    expect(proposeName(DEFAULT_CONVENTION.component, 'A'.repeat(41), 'component')).toBeNull();
    expect(proposeName(DEFAULT_CONVENTION.layer, 'A'.repeat(41), 'layer')).toBe('A'.repeat(31));
  });

  it('answers null for an empty name and for a rule that does not compile', () => {
    expect(proposeName(demoLayer, '')).toBeNull();
    expect(proposeName({ ...demoLayer, patterns: ['FX-{nope}'] }, 'FX-CR-8')).toBeNull();
  });

  it('maps a DXF file\'s layers onto the demo convention', () => {
    const layers = ['fx-cr-8', 'FX JR 1500', 'Part 7', 'grid holes', 'Dimensions'];
    expect(layers.map((l) => proposeName(demoLayer, l))).toEqual(['FX-CR-8', 'FX-JR-1500', 'PART-7', 'GRID-HOLES', null]);
  });
});
