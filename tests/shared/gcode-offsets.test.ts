import { describe, expect, it } from 'vitest';
import { parseLine, parseStringSync } from 'gcode-parser';
import { STANDARD_OFFSET_LIMIT, WORK_OFFSET_CODES, commentText, endingLines, sharedRegister, stationLines, workOffsetCode, writeOffsetFile, type OffsetFileRequest } from '../../shared/gcode/offsets';
import { evaluateTemplate } from '../../shared/stations/evaluate-template';
import type { Station } from '../../shared/schemas/template';
import { ALL_STOPS, content } from './station-fixtures';

type Parsed = { line: string; words: Array<[string, number]>; comments?: string[] };
const source = { templateName: 'Rail set (east)', version: 3, state: 'released', contentHash: 'sha256:0f1e2d' };
const station = (number: number, x: number, y: number, z = 0, c = 0): Station => ({ id: `P${number}:0`, number, placement: `P${number}`, stop: 0, x, y, z, c, nominalWidth: null });
const word = (p: Parsed, letter: string) => p.words.find(([l]) => l === letter)?.[1];
const words = (p: Parsed, letter: string) => p.words.filter(([l]) => l === letter).map(([, v]) => v);
const parsed = (text: string) => parseStringSync(text) as Parsed[];
const blocks = (text: string, g: number) => parsed(text).filter((p) => words(p, 'G').includes(g));
const write = (req: OffsetFileRequest) => {
  const r = writeOffsetFile(req);
  if (!r.ok) throw new Error(r.error.message);
  return r.text;
};

// Hand-worked layout: rail A on hole (2,3) at 0°, rail B on hole (10,1) at 90°, shared offset on hole (6,5).
// A: translation (−7.5 + k, −3.625); B: R90·(0.5+k, 0.375) + (20,2) − (12,10) = (7.625, −7.5 + k).
const layout = evaluateTemplate(content({
  numbering: { order: 'by-rail' },
  placements: [
    { id: 'A', component: 'CR-8', hole: { col: 2, row: 3 }, rotation: 0, stopsInUse: ALL_STOPS },
    { id: 'B', component: 'CR-8', hole: { col: 10, row: 1 }, rotation: 90, stopsInUse: ALL_STOPS },
  ],
}));
const railA = layout.stations.slice(0, 8); // stations 1–8, unturned
const sharedOffsetAt = { x: -20.1234, y: -10.5, z: -3.25 }; // a probed machine position

describe('work offset registers', () => {
  it.each([
    // P, work offset — LinuxCNC G-code reference "G10 L2 Set Coordinate System"; NISTIR 6556 §3.5.5
    [1, 'G54'], [2, 'G55'], [3, 'G56'], [4, 'G57'], [5, 'G58'], [6, 'G59'], [7, 'G59.1'], [8, 'G59.2'], [9, 'G59.3'],
  ])('P%d is %s', (p, code) => {
    expect(workOffsetCode(p)).toBe(code);
    expect(WORK_OFFSET_CODES[p - 1]).toBe(code);
    expect(sharedRegister(code)).toBe(p);
  });

  it('has no NGC name past P9 and reads any other shared-offset name as G54', () => {
    expect(STANDARD_OFFSET_LIMIT).toBe(9); // NISTIR 6556: P1 to P9
    expect(workOffsetCode(10)).toBeNull();
    expect(sharedRegister('hole (6, 5)')).toBe(1);
    expect(sharedRegister(undefined)).toBe(1);
  });
});

describe('ngc-g10', () => {
  it('writes G10 L2 P X Y Z R with every word, stations from the register after the shared one', () => {
    const text = write({ family: 'ngc-g10', source, unit: 'in', stations: railA, sharedOffsetAt });
    const g10 = blocks(text, 10);
    expect(g10).toHaveLength(8);
    g10.forEach((b, k) => {
      expect(word(b, 'L')).toBe(2);
      expect(word(b, 'P')).toBe(k + 2); // shared offset G54 = P1, so station 1 → P2 (G55)
      expect(word(b, 'X')).toBeCloseTo(-20.1234 - 7.5 + k, 4);
      expect(word(b, 'Y')).toBeCloseTo(-10.5 - 3.625, 4);
      expect(word(b, 'Z')).toBeCloseTo(-3.25, 4);
      expect(word(b, 'R')).toBe(0); // a G10 keeps omitted words (LinuxCNC G10 L2), so R0 is written
    });
    expect(text).toContain('(STATION 1 A:0 = G55)');
  });

  it('writes the NISTIR 6556 example values G10 L2 P1 X3.5 Y17.2 with first=1 under a G59.3 shared offset', () => {
    const text = write({ family: 'ngc-g10', source, unit: 'in', stations: [station(1, 3.5, 17.2)], sharedOffsetAt: { x: 0, y: 0, z: 0 }, sharedOffsetName: 'G59.3', first: 1 });
    expect(blocks(text, 10)[0]!.line).toBe('G10 L2 P1 X3.5000 Y17.2000 Z0.0000 R0.000');
  });

  it('writes R = C for a turned station (LinuxCNC G10 L2 R, rotation about Z)', () => {
    const b9 = layout.stations[8]!; // B:0 = (7.625, −7.5), C 90
    const [line] = stationLines({ family: 'ngc-g10', source, unit: 'in', stations: [b9], sharedOffsetAt: { x: 0, y: 0, z: 0 }, first: 2 }, b9).filter((l) => l.startsWith('G10'));
    expect(line).toBe('G10 L2 P10 X7.6250 Y-7.5000 Z0.0000 R90.000'); // station 9 → register first + 9 − 1
  });

  it.each([
    ['more stations than P9', { stations: layout.stations }, 'too-many-stations', 422],
    ['a station on the shared register', { stations: railA, first: 1 }, 'register-collision', 422],
    ['no base', { stations: railA, sharedOffsetAt: undefined }, 'missing-base', 400],
  ] as const)('refuses %s', (_, over, code, status) => {
    const r = writeOffsetFile({ family: 'ngc-g10', source, unit: 'in', sharedOffsetAt, ...over });
    expect(r.ok ? null : [r.error.code, r.error.status]).toEqual([code, status]);
    if (!r.ok) expect(r.error.message.trim().split(/[.;]\s+[A-Z]/)).toHaveLength(1); // one sentence
  });
});

describe('ext-l20 (extended work offsets, syntax from memory)', () => {
  it('sets G10 L20 P<n> without R and is wrapped in percent signs', () => {
    const text = write({ family: 'ext-l20', source, unit: 'in', stations: railA, sharedOffsetAt, extRegisters: 48 });
    const lines = text.trimEnd().split('\n');
    expect(lines[0]).toBe('%');
    expect(lines.at(-1)).toBe('%');
    expect(lines.at(-2)).toBe('M30');
    const l20 = blocks(text, 10);
    expect(l20.map((b) => word(b, 'L'))).toEqual(Array(8).fill(20)); // from memory: L20 for extended offsets
    expect(l20.map((b) => word(b, 'P'))).toEqual([2, 3, 4, 5, 6, 7, 8, 9]);
    expect(l20.every((b) => word(b, 'R') === undefined)).toBe(true);
    expect(text).not.toMatch(/G10 L2 /); // never P10+ under L2 (rs274 refuses it)
    expect(text).toContain('(STATION 1 A:0 = G54.1 P2)');
  });

  it('refuses more stations than the shop setting and turned stations', () => {
    const few = writeOffsetFile({ family: 'ext-l20', source, unit: 'in', stations: railA, sharedOffsetAt, extRegisters: 8 });
    expect(few.ok ? null : few.error.code).toBe('too-many-stations');
    const turned = writeOffsetFile({ family: 'ext-l20', source, unit: 'in', stations: layout.stations, sharedOffsetAt });
    expect(turned.ok ? null : turned.error.message).toMatch(/Stations 9, 10, .*16 are turned.*ngc-g10 or shift-rotate/);
  });
});

describe('ngc-g52 and shift-rotate', () => {
  it('ngc-g52: G52 per station from the shared offset with a part-program line, then clears and ends', () => {
    const text = write({ family: 'ngc-g52', source, unit: 'in', stations: railA });
    const lines = text.trimEnd().split('\n');
    const g52 = blocks(text, 52);
    expect(g52).toHaveLength(9); // 8 stations + the clear at the end (G92.1 clears at the start)
    railA.forEach((s, k) => expect(g52[k]!.line).toBe(`G52 X${(-7.5 + k).toFixed(4)} Y-3.6250 Z0.0000`));
    const first = lines.indexOf('G52 X-7.5000 Y-3.6250 Z0.0000');
    expect(lines[first - 1]).toBe('(STATION 1 A:0)');
    expect(lines[first + 1]).toBe('(PART PROGRAM FOR STATION 1 GOES HERE)');
    expect(lines.slice(-2)).toEqual(['G52 X0 Y0 Z0', 'M30']);
  });

  it('ngc-g52 refuses turned stations, naming them and the families that turn', () => {
    const r = writeOffsetFile({ family: 'ngc-g52', source, unit: 'in', stations: layout.stations });
    expect(r.ok ? null : r.error.message).toMatch(/^Stations 9, 10, 11, 12, 13, 14, 15, 16 are turned .*ngc-g10 or shift-rotate\.$/);
  });

  it('shift-rotate: per station G69, G52 shift, G68 X0 Y0 R<c> (trade syntax from memory; LinuxCNC has no G68)', () => {
    const text = write({ family: 'shift-rotate', source, unit: 'mm', stations: layout.stations });
    const per = (n: number) => { const lines = text.split('\n'); const i = lines.indexOf(`(STATION ${n} ${layout.stations[n - 1]!.id})`); return lines.slice(i + 1, i + 5); };
    expect(per(1)).toEqual(['G69', 'G52 X-7.500 Y-3.625 Z0.000', 'G68 X0 Y0 R0.000', '(PART PROGRAM FOR STATION 1 GOES HERE)']);
    expect(per(9)).toEqual(['G69', 'G52 X7.625 Y-7.500 Z0.000', 'G68 X0 Y0 R90.000', '(PART PROGRAM FOR STATION 9 GOES HERE)']);
    // from memory: a rotation is cancelled (G69) before a shift changes, and at the end
    expect(endingLines({ family: 'shift-rotate' })).toEqual(['G69', '(CLEAR THE LOCAL SHIFT)', 'G52 X0 Y0 Z0', 'M30']);
    expect(text.split('\n').slice(0, 20)).toContain('G69');
  });
});

describe('file header', () => {
  it.each([['in', 'G20'], ['mm', 'G21']] as const)('%s: names family, template, version and state, hash, unit, Z0 and the cautions, then sets modal state', (unit, g) => {
    const text = write({ family: 'ngc-g10', source, unit, stations: railA, sharedOffsetAt });
    const lines = text.trimEnd().split('\n');
    const head = lines.slice(0, lines.findIndex((l) => !l.startsWith('('))).join('\n');
    expect(head).toContain('FAMILY NGC-G10');
    expect(head).toContain('(TEMPLATE: Rail set [east])'); // parentheses would end the comment early (NISTIR 6556 comments)
    expect(head).toContain('(VERSION: 3 STATE: RELEASED)');
    expect(head).toContain('(CONTENT HASH: sha256:0f1e2d)');
    expect(head).toContain(g);
    expect(head).toMatch(/Z0 IS THE SHARED OFFSET Z0/);
    for (const c of ['CHECK EVERY BLOCK', 'PROVE OUT WITHOUT STOCK', 'CHECKS EVERY CLAMP BEFORE CYCLE START', "MACHINE BUILDER'S INSTRUCTIONS"]) expect(head).toContain(c);
    const code = lines.filter((l) => !l.startsWith('('));
    expect(code.slice(0, 3)).toEqual(['G92.1', `${g} G90 G17 G40 G49 G80`, 'G54']);
    expect(code.at(-1)).toBe('M30');
  });

  it('marks a draft unmistakably', () => {
    const text = write({ family: 'ngc-g52', source: { ...source, state: 'draft' }, unit: 'in', stations: railA });
    expect(text.split('\n')[1]).toMatch(/^\(DRAFT - NOT RELEASED/);
  });

  it('keeps every comment a single, closed parenthesis comment that gcode-parser reads as one', () => {
    const text = write({ family: 'ngc-g52', source: { ...source, templateName: 'Bad (name) ) é\nnext' }, unit: 'in', stations: railA });
    for (const line of text.trimEnd().split('\n')) {
      if (!line.startsWith('(')) continue;
      expect(line).toMatch(/^\([\x20-\x27\x2A-\x7E]*\)$/);
      const p = parseLine(line) as Parsed;
      expect(p.words).toEqual([]);
      expect(p.comments).toHaveLength(1);
    }
    expect(commentText('a (b) c')).toBe('a [b] c');
  });
});
