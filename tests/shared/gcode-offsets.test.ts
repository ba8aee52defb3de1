import { describe, expect, it } from 'vitest';
import { parseLine, parseStringSync } from 'gcode-parser';
import { WORK_OFFSET_CODES, commentText, planStations, registerOf, sharedOffsetCode, writeOffsetFile, type OffsetFileRequest } from '../../shared/gcode/offsets';
import { familyFromAlias } from '../../shared/gcode/control-families';
import { evaluateTemplate } from '../../shared/stations/evaluate-template';
import type { Station } from '../../shared/schemas/template';
import { content } from './station-fixtures';

type Parsed = { line: string; words: Array<[string, number]>; comments?: string[] };
const source = { templateName: 'Rail set (east)', version: 3, state: 'released', contentHash: 'sha256:0f1e2d' };
const station = (number: number, x: number, y: number, z = 0, c = 0): Station => ({ id: `P${number}:0`, number, placement: `P${number}`, stop: 0, x, y, z, c, nominalWidth: null });
const word = (p: Parsed, letter: string) => p.words.find(([l]) => l === letter)?.[1];
const codeLines = (text: string) => (parseStringSync(text) as Parsed[]).filter((p) => p.words.length);
const blocks = (text: string, g: number) => codeLines(text).filter((p) => word(p, 'G') === g);

// The hand-worked layout: rail A on hole (2,3) at 0°, rail B on hole (10,1) at 90°, shared offset on hole (6,5).
const layout = evaluateTemplate(content({
  numbering: { order: 'by-rail' },
  placements: [
    { id: 'A', component: 'CR-8', hole: { col: 2, row: 3 }, rotation: 0, stopsInUse: [0, 1, 2, 3] },
    { id: 'B', component: 'CR-8', hole: { col: 10, row: 1 }, rotation: 90, stopsInUse: [0, 1] },
  ],
}));
const railA = layout.stations.slice(0, 4); // stations 1–4: (−7.5 + k, −3.625), C 0
const base = { x: -20.1234, y: -10.5, z: -3.25 }; // a probed machine position
const write = (req: Partial<OffsetFileRequest> & Pick<OffsetFileRequest, 'family'>) => writeOffsetFile({ source, unit: 'in', stations: railA, ...req });
const text = (req: Partial<OffsetFileRequest> & Pick<OffsetFileRequest, 'family'>) => {
  const r = write(req);
  if (!r.ok) throw new Error(r.error.message);
  return r.text;
};

describe('registers of the shared offset', () => {
  it.each([
    // work offset, register — LinuxCNC G-code reference "G10 L2": P1–P9 are G54–G59.3; NISTIR 6556 §3.5.5
    ['G54', 1], ['G55', 2], ['G56', 3], ['G57', 4], ['G58', 5], ['G59', 6], ['G59.1', 7], ['G59.2', 8], ['G59.3', 9],
  ] as const)('%s is register %d', (code, p) => {
    expect(registerOf(sharedOffsetCode(code))).toBe(p);
    expect(WORK_OFFSET_CODES[p - 1]).toBe(code);
  });

  it('takes a shared offset named otherwise as G54, register 1', () => {
    expect(sharedOffsetCode('hole (6, 5)')).toBe('G54');
    expect(sharedOffsetCode(undefined)).toBe('G54');
    expect(sharedOffsetCode(' g56 ')).toBe('G56');
  });

  it('starts the stations at the register after the shared one, station k at first + k − 1', () => {
    const r = planStations({ family: 'ngc-g10', unit: 'in', stations: railA, sharedOffsetName: 'G55', base });
    if (!r.ok) throw new Error(r.error.message);
    expect(r.plan.sharedRegister).toBe(2);
    expect(r.plan.stations.map((s) => s.register)).toEqual([3, 4, 5, 6]);
  });
});

describe('refusals: nothing written that a control would run wrong', () => {
  it('refuses a station register that is the shared offset\'s own', () => {
    const r = write({ family: 'ngc-g10', base, sharedOffsetName: 'G56', first: 1 }); // stations 1–4 → P1–P4, G56 is P3
    expect(r.ok ? null : r.error.code).toBe('register-is-shared-offset');
    expect(r.ok ? '' : r.error.message).toMatch(/Station 3 .*register 3 \(G56\)/);
  });

  it('refuses more stations than nine registers hold (G54–G59.3)', () => {
    const many = Array.from({ length: 9 }, (_, i) => station(i + 1, i, 0));
    const r = write({ family: 'ngc-g10', base, stations: many }); // shared G54: P2..P10 would be needed
    expect(r.ok ? null : r.error.code).toBe('too-many-stations');
    expect(r.ok ? '' : r.error.message).toContain('register 10');
  });

  it('refuses the extended family past the shop\'s register count', () => {
    const many = Array.from({ length: 12 }, (_, i) => station(i + 1, i, 0));
    expect(write({ family: 'ext-l20', base, stations: many, extendedRegisters: 12 }).ok).toBe(true);
    const r = write({ family: 'ext-l20', base, stations: many, extendedRegisters: 11 });
    expect(r.ok ? null : r.error.code).toBe('too-many-stations');
  });

  it('refuses offset families without the machine position of the shared offset', () => {
    for (const family of ['ngc-g10', 'ext-l20'] as const) expect(write({ family }).ok ? null : 'refused').toBe('refused');
    for (const family of ['ngc-g52', 'shift-rotate'] as const) expect(write({ family }).ok).toBe(true);
  });

  it('refuses turned stations in families that cannot turn, naming them', () => {
    for (const family of ['ngc-g52', 'ext-l20'] as const) {
      const r = write({ family, base, stations: layout.stations });
      expect(r.ok ? null : r.error.code).toBe('turned-station');
      expect(r.ok ? '' : r.error.message).toContain('Stations 5 (C90.000), 6 (C90.000) are turned');
    }
    expect(write({ family: 'shift-rotate', stations: layout.stations }).ok).toBe(true);
    expect(write({ family: 'ngc-g10', base, stations: layout.stations }).ok).toBe(true);
  });

  it('refuses repeated station numbers and an empty list', () => {
    expect((r => r.ok ? null : r.error.code)(write({ family: 'ngc-g52', stations: [station(1, 0, 0), station(1, 1, 0)] }))).toBe('bad-station-number');
    expect((r => r.ok ? null : r.error.code)(write({ family: 'ngc-g52', stations: [] }))).toBe('no-stations');
  });
});

describe('ngc-g10: G10 L2 P X Y Z R', () => {
  it('gives each station the shared offset machine position plus its translation, with every word', () => {
    const g10 = blocks(text({ family: 'ngc-g10', base }), 10);
    expect(g10).toHaveLength(4);
    g10.forEach((b, k) => {
      expect(word(b, 'L')).toBe(2);
      expect(word(b, 'P')).toBe(k + 2); // shared offset G54 = P1, so station 1 is P2
      // X = −20.1234 + (−7.5 + k); Y = −10.5 + (−3.625); Z = −3.25 + 0 (hand-worked translations)
      expect(word(b, 'X')).toBeCloseTo(-20.1234 - 7.5 + k, 4);
      expect(word(b, 'Y')).toBeCloseTo(-14.125, 4);
      expect(word(b, 'Z')).toBeCloseTo(-3.25, 4);
      expect(word(b, 'R')).toBe(0); // R0 written: a G10 keeps words it is not given (LinuxCNC "G10 L2")
    });
    expect(g10[0]!.line).toBe('G10 L2 P2 X-27.6234 Y-14.1250 Z-3.2500 R0.000');
  });

  it('writes R for a turned station', () => {
    const b = blocks(text({ family: 'ngc-g10', base: { x: 0, y: 0, z: 0 }, stations: layout.stations }), 10)[4]!;
    expect(b.line).toBe('G10 L2 P6 X7.6250 Y-7.5000 Z0.0000 R90.000'); // B:0 = (7.625, −7.5), C 90 (hand-worked)
  });
});

describe('every file: cleared, modal, named, ended', () => {
  it.each([
    ['ngc-g10', ['G20 G90 G17 G40 G49 G80', 'G92.1', 'G54'], false],
    ['ngc-g52', ['G20 G90 G17 G40 G49 G80', 'G92.1', 'G54'], false],
    ['ext-l20', ['G20 G90 G17 G40 G49 G80', 'G52 X0 Y0 Z0', 'G54'], true],
    ['shift-rotate', ['G20 G90 G17 G40 G49 G80', 'G69', 'G52 X0 Y0 Z0', 'G54'], true],
  ] as const)('%s starts by clearing shifts and setting the modal state, and ends the program', (family, start, percent) => {
    const lines = text({ family, base }).trimEnd().split('\n');
    const code = lines.filter((l) => !l.startsWith('('));
    expect(code.slice(percent ? 1 : 0, start.length + (percent ? 1 : 0))).toEqual(start);
    // RS274/NGC ends a program with M2 or M30 (NISTIR 6556 §3.6.1); percent signs frame a tape file (common practice)
    expect(code.slice(-2)).toEqual(percent ? ['M30', '%'] : [code.at(-2), 'M30']);
    if (percent) expect(lines[0]).toBe('%');
    else expect(lines.includes('%')).toBe(false);
  });

  it('names family, template, version and state, hash, unit, where Z0 is, and the cautions', () => {
    const head = text({ family: 'ngc-g10', base, sharedOffsetName: 'G54' });
    expect(head).toContain('(CONTROL FAMILY: ngc-g10');
    expect(head).toContain('(TEMPLATE: Rail set [east])'); // a parenthesis would end the comment early
    expect(head).toContain('(VERSION: 3 - RELEASED)');
    expect(head).toContain('(CONTENT HASH: sha256:0f1e2d)');
    expect(head).toContain('(UNIT: INCH - G20)');
    expect(head).toMatch(/\(Z0: THE SHARED OFFSET Z0/);
    expect(head).toMatch(/CAUTION: ADVICE ONLY - CHECK EVERY BLOCK AGAINST THE PROGRAMMING MANUAL/);
    expect(head).not.toContain('NOT RELEASED');
  });

  it('marks a draft so no one mistakes it for a released file', () => {
    const t = writeOffsetFile({ family: 'ngc-g52', source: { ...source, state: 'draft' }, unit: 'mm', stations: railA });
    if (!t.ok) throw new Error(t.error.message);
    expect(t.text).toContain('(VERSION: 3 - DRAFT)');
    // The first line, a comment (NISTIR 6556, "Comments and Messages"), names the state and the content hash.
    const first = t.text.split('\n')[0]!;
    expect(first).toMatch(/^\(NOT RELEASED.*\)$/);
    expect(first).toContain('DRAFT');
    expect(first).toContain(source.contentHash);
    expect(t.text).toContain('G21 G90');
    expect(t.text).toContain('G52 X-7.500 Y-3.625 Z0.000'); // three decimals in mm
  });

  it('keeps every comment a single, closed parenthesis comment that gcode-parser reads as one', () => {
    const t = writeOffsetFile({ family: 'ngc-g52', source: { ...source, templateName: 'Bad (name) ) é\nnext' }, unit: 'in', stations: railA });
    if (!t.ok) throw new Error(t.error.message);
    for (const line of t.text.trimEnd().split('\n')) {
      if (!line.startsWith('(')) continue;
      expect(line).toMatch(/^\([\x20-\x27\x2A-\x7E]*\)$/);
      const parsed = parseLine(line) as Parsed;
      expect(parsed.words).toEqual([]);
      expect(parsed.comments).toHaveLength(1);
    }
    expect(commentText('a (b) c')).toBe('a [b] c');
  });
});

describe('ext-l20 and shift-rotate (syntax from memory: no interpreter here implements them)', () => {
  it('ext-l20 sets G10 L20 P1… and names the G54.1 P selection, with no rotation word', () => {
    const t = text({ family: 'ext-l20', base });
    const set = codeLines(t).filter((p) => word(p, 'G') === 10);
    expect(set.map((b) => [word(b, 'L'), word(b, 'P'), word(b, 'R')])).toEqual([[20, 1, undefined], [20, 2, undefined], [20, 3, undefined], [20, 4, undefined]]);
    expect(t).toContain('(STATION 1 A:0 = G54.1 P1)');
  });

  it('shift-rotate cancels rotation, shifts, then rotates about the station datum, R0 included', () => {
    const lines = text({ family: 'shift-rotate', stations: layout.stations }).split('\n');
    const at = lines.indexOf('(STATION 5 B:0 TURNED C90.000)');
    expect(lines.slice(at + 1, at + 4)).toEqual(['G69', 'G52 X7.6250 Y-7.5000 Z0.0000', 'G68 X0 Y0 R90.000']);
    const a0 = lines.indexOf('(STATION 1 A:0)');
    expect(lines.slice(a0 + 1, a0 + 4)).toEqual(['G69', 'G52 X-7.5000 Y-3.6250 Z0.0000', 'G68 X0 Y0 R0.000']);
    expect(lines.slice(-6)).toEqual(['G69', 'G52 X0 Y0 Z0', 'G54', 'M30', '%', '']);
  });
});

describe('query aliases', () => {
  it.each([
    [{ mode: 'g10' }, 'ngc-g10'],
    [{ mode: 'g52' }, 'ngc-g52'],
    [{ mode: 'g10', dialect: 'standard' }, 'ngc-g10'],
    [{ mode: 'g10', dialect: 'extended' }, 'ext-l20'], // never again G10 L2 above P9
    [{ dialect: 'shift-rotate' }, 'shift-rotate'],
    [{ family: 'ngc-g52', mode: 'g10' }, 'ngc-g52'],
    [{}, undefined],
  ])('%o → %s', (q, family) => {
    expect(familyFromAlias(q)).toBe(family);
  });
});
