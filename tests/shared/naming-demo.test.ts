import { describe, expect, it } from 'vitest';
import { checkName } from '../../shared/naming/check-name';
import { compileRule } from '../../shared/naming/compile-rule';
import { DEFAULT_CONVENTION, DEMO_CONVENTION } from '../../shared/naming/conventions';
import { NamingConventionSchema } from '../../shared/schemas/naming';

// Source: the demo shop's catalog (each component's code and layer as the demo data seeds them).
const DEMO = [
  ['CR-8', 'FX-CR-8'],
  ['JR-1.000', 'FX-JR-1000'],
  ['JR-1.500', 'FX-JR-1500'],
  ['SR-4', 'FX-SR-4'],
  ['JR-S4-1.000', 'FX-JR-S4'],
  ['VS-6', 'FX-VS-6'],
  ['ST-0.5', 'FX-ST'],
  ['CR-M-200', 'FX-CRM-200'],
  ['JR-M-30', 'FX-JRM-30'],
] as const;

describe('the demo convention', () => {
  it('is a valid convention, and so is the default', () => {
    expect(NamingConventionSchema.safeParse(DEMO_CONVENTION).success).toBe(true);
    expect(NamingConventionSchema.safeParse(DEFAULT_CONVENTION).success).toBe(true);
    expect(compileRule(DEMO_CONVENTION.layer, 'layer').ok).toBe(true);
    expect(compileRule(DEMO_CONVENTION.component, 'component').ok).toBe(true);
  });

  it.each(DEMO)('passes the demo component %s and its layer %s', (code, layer) => {
    expect(checkName(DEMO_CONVENTION.component, code, 'component')).toEqual({ ok: true, problems: [] });
    expect(checkName(DEMO_CONVENTION.layer, layer, 'layer')).toEqual({ ok: true, problems: [] });
  });

  it.each([
    // the drawing's other layers: part outlines, plate and station marks (the demo convention)
    'PART-10452-A', 'PART-7', 'GRID-PLATE', 'GRID-HOLES', 'GRID-ORIGIN', 'GRID-STATIONS', 'GRID-NUMBERS', 'GRID-DRAFT',
  ])('passes the demo layer %s', (layer) => {
    expect(checkName(DEMO_CONVENTION.layer, layer, 'layer')).toEqual({ ok: true, problems: [] });
  });

  it.each([
    // name, target, the token that fails (null: text, case or DXF), words; source: the demo convention
    ['JR-1.5', 'component', 'width', 'width: "1.5" must be a number written like 1.000 (3 decimals).'],
    ['CLMP-8', 'component', 'kind', 'kind: "CLMP" is not one of CR, SR, VS.'],
    ['CR-100', 'component', 'size', 'size: "100" is above the largest allowed, 99.'],
    ['ST-0.3750', 'component', 'dia', 'dia: "0.3750" must be a number written like 1.0 (1 to 3 decimals).'],
    ['FX-JR-1.000', 'layer', null, 'A layer name may hold only letters, digits, "$", "-" and "_"'],
    ['FX-JR-0050', 'layer', 'width', 'width: "0050" is below the smallest allowed, 0100.'],
    ['GRID-DOTS', 'layer', 'what', 'what: "DOTS" is not one of PLATE, HOLES, ORIGIN, STATIONS, NUMBERS, DRAFT.'],
    ['PART-$1', 'layer', 'part', 'part: "$1" must be a part number such as 10452-A.'],
    ['fx-cr-8', 'layer', null, 'A layer name must be written in capitals: "FX-CR-8", not "fx-cr-8".'],
  ] as const)('refuses %s (%s)', (name, target, token, words) => {
    const r = checkName(DEMO_CONVENTION[target], name, target);
    expect(r.ok).toBe(false);
    const hit = r.problems.find((p) => p.message.includes(words));
    expect(hit, JSON.stringify(r.problems)).toBeDefined();
    expect(hit!.token).toBe(token);
  });
});

describe('the default convention', () => {
  it.each([
    // name, target, expected ok; source: DXF R12 names for layers, the catalog's code characters for codes
    ['Anything-Goes_$1', 'layer', true],
    ['A B', 'layer', false],
    ['JR-1.000', 'component', true],
    ['jr_1.000', 'component', true],
    ['-JR', 'component', false],
    ['JR 1', 'component', false],
  ] as const)('%j as a %s: ok %s', (name, target, ok) => {
    expect(checkName(DEFAULT_CONVENTION[target], name, target).ok).toBe(ok);
  });

  it('says what a code may hold', () => {
    expect(checkName(DEFAULT_CONVENTION.component, 'JR 1', 'component').problems).toEqual([
      { token: 'code', message: 'code: "JR 1" must be letters, digits, ".", "-" and "_", starting with a letter or digit.' },
    ]);
  });
});
