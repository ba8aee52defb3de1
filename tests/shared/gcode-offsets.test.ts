import { describe, expect, it } from 'vitest';
import { parseLine, parseStringSync } from 'gcode-parser';
import { STANDARD_OFFSET_LIMIT, WORK_OFFSET_CODES, commentText, workOffsetCode, writeG10Offsets, writeG52Sequence, writeOffsetFile } from '../../shared/gcode/offsets';
import { evaluateTemplate } from '../../shared/stations/evaluate-template';
import type { Station } from '../../shared/schemas/template';
import { ALL_STOPS, content } from './station-fixtures';

type Parsed = { line: string; words: Array<[string, number]>; comments?: string[] };
const source = { templateName: 'Rail set (east)', version: 3, contentHash: 'sha256:0f1e2d' };
const station = (number: number, x: number, y: number, z = 0, c = 0): Station => ({ id: `P${number}:0`, number, placement: `P${number}`, stop: 0, x, y, z, c, nominalWidth: null });
const word = (p: Parsed, letter: string) => p.words.find(([l]) => l === letter)?.[1];
const blocks = (text: string, g: number) => (parseStringSync(text) as Parsed[]).filter((p) => word(p, 'G') === g);

// The hand-worked layout: rail A on hole (2,3) at 0°, rail B on hole (10,1) at 90°, shared offset on hole (6,5).
const layout = evaluateTemplate(content({
  numbering: { order: 'by-rail' },
  placements: [
    { id: 'A', component: 'CR-8', hole: { col: 2, row: 3 }, rotation: 0, stopsInUse: ALL_STOPS },
    { id: 'B', component: 'CR-8', hole: { col: 10, row: 1 }, rotation: 90, stopsInUse: ALL_STOPS },
  ],
}));
const railA = layout.stations.slice(0, 8); // stations 1–8: (−7.5 + k, −3.625)
const sharedOffsetAt = { x: -20.1234, y: -10.5, z: -3.25 }; // a probed machine position

describe('G10 L2 work offsets', () => {
  it.each([
    // P, work offset — LinuxCNC G-code reference "G10 L2 Set Coordinate System"; NISTIR 6556
    [1, 'G54'], [2, 'G55'], [3, 'G56'], [4, 'G57'], [5, 'G58'], [6, 'G59'], [7, 'G59.1'], [8, 'G59.2'], [9, 'G59.3'],
  ])('P%d is %s', (p, code) => {
    expect(workOffsetCode(p)).toBe(code);
    expect(WORK_OFFSET_CODES[p - 1]).toBe(code);
  });

  it('has no standard name past P9', () => {
    expect(STANDARD_OFFSET_LIMIT).toBe(9); // G54..G59.3 (NISTIR 6556: P1 to P9)
    expect(workOffsetCode(10)).toBeNull();
  });

  it('writes the NISTIR 6556 example: G10 L2 P1 X3.5 Y17.2 sets the G54 origin at X3.5 Y17.2', () => {
    const r = writeG10Offsets({ mode: 'g10', source, unit: 'in', stations: [station(1, 3.5, 17.2)], sharedOffsetAt: { x: 0, y: 0, z: 0 } });
    if (!r.ok) throw new Error(r.error.message);
    const [block] = blocks(r.text, 10);
    expect(block!.line).toBe('G10 L2 P1 X3.5000 Y17.2000 Z0.0000');
    expect(block!.words).toEqual([['G', 10], ['L', 2], ['P', 1], ['X', 3.5], ['Y', 17.2], ['Z', 0]]); // gcode-parser, independent tokenizer
    expect(r.text).toContain('(STATION 1 P1:0 = G54)');
  });

  it('gives each station the shared offset machine position plus its translation', () => {
    const r = writeOffsetFile({ mode: 'g10', source, unit: 'in', stations: railA, sharedOffsetAt });
    if (!r.ok) throw new Error(r.error.message);
    const g10 = blocks(r.text, 10);
    expect(g10).toHaveLength(8);
    g10.forEach((b, k) => {
      expect(word(b, 'L')).toBe(2);
      expect(word(b, 'P')).toBe(k + 1);
      // X = −20.1234 + (−7.5 + k); Y = −10.5 + (−3.625); Z = −3.25 + 0 (hand-worked translations)
      expect(word(b, 'X')).toBeCloseTo(-20.1234 - 7.5 + k, 4);
      expect(word(b, 'Y')).toBeCloseTo(-14.125, 4);
      expect(word(b, 'Z')).toBeCloseTo(-3.25, 4);
      expect(word(b, 'R')).toBeUndefined(); // C = 0: no rotation word
    });
  });

  it('adds R (rotation of XY about Z, LinuxCNC G10 L2) where C is not 0', () => {
    const r = writeG10Offsets({ mode: 'g10', source, unit: 'in', stations: layout.stations.slice(8, 9).map((s) => ({ ...s, number: 1 })), sharedOffsetAt: { x: 0, y: 0, z: 0 } });
    if (!r.ok) throw new Error(r.error.message);
    const [b] = blocks(r.text, 10);
    expect(b!.line).toBe('G10 L2 P1 X7.6250 Y-7.5000 Z0.0000 R90.000'); // B:0 = (7.625, −7.5), C 90 (hand-worked)
  });

  it('refuses more than 9 stations in the standard dialect', () => {
    const r = writeG10Offsets({ mode: 'g10', source, unit: 'in', stations: layout.stations, sharedOffsetAt });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.error.code).toBe('too-many-stations');
    expect(r.error.message).toContain('P1-P9');
  });

  it('writes P10 and above in the extended dialect, marked control-specific', () => {
    const r = writeG10Offsets({ mode: 'g10', source, unit: 'in', stations: layout.stations, sharedOffsetAt, dialect: 'extended' });
    if (!r.ok) throw new Error(r.error.message);
    const lines = r.text.trimEnd().split('\n');
    const g10 = blocks(r.text, 10);
    expect(g10.map((b) => word(b, 'P'))).toEqual(Array.from({ length: 16 }, (_, i) => i + 1));
    const marker = lines.findIndex((l) => l.startsWith('(P10 AND ABOVE ARE CONTROL-SPECIFIC'));
    expect(marker).toBeGreaterThan(lines.findIndex((l) => l.startsWith('G10 L2 P9 ')));
    expect(marker).toBeLessThan(lines.findIndex((l) => l.startsWith('G10 L2 P10 ')));
    expect(r.text).toContain('(DIALECT: EXTENDED');
  });

  it('refuses repeated or missing station numbers', () => {
    const r = writeG10Offsets({ mode: 'g10', source, unit: 'in', stations: [station(1, 0, 0), station(1, 1, 0)], sharedOffsetAt });
    expect(r.ok ? null : r.error.code).toBe('bad-station-number');
  });
});

describe('file header', () => {
  it.each([
    ['in', 'G20', 'X-27.6234'], // −20.1234 − 7.5, four decimals
    ['mm', 'G21', 'X-27.623'], // three decimals in mm
  ] as const)('%s: names template, version, hash, unit, dialect and the caution', (unit, g, x) => {
    const r = writeG10Offsets({ mode: 'g10', source, unit, stations: railA, sharedOffsetAt });
    if (!r.ok) throw new Error(r.error.message);
    const lines = r.text.trimEnd().split('\n');
    const firstCode = lines.findIndex((l) => !l.startsWith('('));
    const head = lines.slice(0, firstCode).join('\n');
    expect(head).toContain('(TEMPLATE: Rail set [east])'); // parentheses would end the comment early
    expect(head).toContain('(VERSION: 3)');
    expect(head).toContain('(CONTENT HASH: sha256:0f1e2d)');
    expect(head).toContain(g);
    expect(head).toContain('(DIALECT: STANDARD');
    expect(head).toMatch(/CAUTION: CHECK EVERY BLOCK AGAINST THE PROGRAMMING MANUAL/);
    expect(lines[firstCode]).toBe(`${g} G90`);
    expect(r.text).toContain(`G10 L2 P1 ${x}`);
  });

  it('keeps every comment a single, closed parenthesis comment that gcode-parser reads as one', () => {
    const r = writeG52Sequence({ mode: 'g52', source: { ...source, templateName: 'Bad (name) ) é\nnext' }, unit: 'in', stations: railA });
    for (const line of r.trimEnd().split('\n')) {
      if (!line.startsWith('(')) continue;
      expect(line).toMatch(/^\([\x20-\x27\x2A-\x7E]*\)$/);
      const parsed = parseLine(line) as Parsed;
      expect(parsed.words).toEqual([]);
      expect(parsed.comments).toHaveLength(1);
    }
    expect(commentText('a (b) c')).toBe('a [b] c');
  });
});

describe('G52 station sequence', () => {
  it('shifts to each station in order, leaves a place for the part program, and clears the shift', () => {
    const text = writeG52Sequence({ mode: 'g52', source, unit: 'in', stations: layout.stations });
    const g52 = blocks(text, 52);
    expect(g52).toHaveLength(17); // 16 stations + the cancel
    layout.stations.forEach((s, i) => {
      // G52 is relative to the active (shared) work offset: the translation itself
      expect(word(g52[i]!, 'X')).toBeCloseTo(s.x, 4);
      expect(word(g52[i]!, 'Y')).toBeCloseTo(s.y, 4);
      expect(word(g52[i]!, 'Z')).toBeCloseTo(s.z, 4);
    });
    expect(g52[0]!.line).toBe('G52 X-7.5000 Y-3.6250 Z0.0000'); // A:0 hand-worked
    expect(g52[16]!.line).toBe('G52 X0 Y0 Z0');
    const lines = text.trimEnd().split('\n');
    expect(lines[lines.length - 1]).toBe('G52 X0 Y0 Z0');
    expect(lines.filter((l) => l.includes('PART PROGRAM FOR STATION'))).toHaveLength(16);
    // each station: a naming comment before its shift, the part-program line after it
    const first = lines.indexOf('G52 X-7.5000 Y-3.6250 Z0.0000');
    expect(lines[first - 1]).toBe('(STATION 1 A:0)');
    expect(lines[first + 1]).toBe('(PART PROGRAM FOR STATION 1 GOES HERE)');
  });

  it('flags turned stations, since G52 does not rotate', () => {
    const text = writeG52Sequence({ mode: 'g52', source, unit: 'in', stations: layout.stations });
    expect(text).toContain('(STATION 9 IS TURNED C90.000');
    expect(text).not.toContain('(STATION 8 IS TURNED');
  });

  it('names its dialect', () => {
    const text = writeG52Sequence({ mode: 'g52', source, unit: 'mm', stations: railA });
    expect(text).toContain('(DIALECT: STANDARD - G52 LOCAL OFFSET AS IN LINUXCNC)');
    expect(text).toContain('(UNIT: MILLIMETER - G21)');
    expect(text).toContain('G52 X-7.500 Y-3.625 Z0.000'); // three decimals in mm
  });

  it('is not limited to nine stations', () => {
    const r = writeOffsetFile({ mode: 'g52', source, unit: 'in', stations: layout.stations });
    expect(r.ok).toBe(true);
  });
});
