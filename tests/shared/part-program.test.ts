import { describe, expect, it } from 'vitest';
import { parseLine } from 'gcode-parser';
import { lineWords } from '../../shared/gcode/program-words';
import { MAX_PROGRAM_LINES, readPartProgram } from '../../shared/gcode/read-part-program';
import { expandedProgram } from '../../shared/gcode/expand-program';
import type { Station } from '../../shared/schemas/template';
import { movesOf, runRs274 } from './rs274';

const header = { templateName: 'Hand', version: 1, state: 'released', contentHash: 'c', jobId: 1, jobName: 'J', partNumber: 'P', programSha256: 's', family: 'EXPANDED', skipped: [] };

describe('line words, checked against the gcode-parser tokenizer (npm gcode-parser 2)', () => {
  const sample = [
    'N10 G0 G90 G54 X1.25 Y-0.5', 'g1 x 1.0 y2. z-.25 f 12.5 (feed)', 'G2 X1 Y1 I-0.5 J0.0 ; arc', 'T12 M6', 'G98 G83 X0.5 Y0.5 Z-0.75 R0.1 Q0.05',
    'G43 H12 Z1.', 'M3 S12000', 'G91 G28 Z0', 'O0100 (PROGRAM NAME)', 'G4 P0.5', '(ONLY A COMMENT)',
  ];
  for (const line of sample) {
    it(`reads "${line}" as gcode-parser does`, () => {
      const ours = lineWords(line);
      if (!ours.ok) throw new Error(ours.message);
      const theirs = parseLine(line) as { words: [string, number][]; ln?: number };
      const words = ours.line.words.filter((w) => !(w.letter === 'N'));
      expect(words.map((w) => [w.letter, w.value])).toEqual(theirs.words);
      if (theirs.ln !== undefined) expect(ours.line.words.find((w) => w.letter === 'N')?.value).toBe(theirs.ln);
    });
  }
});

describe('hand-worked example: one arc and one drilled hole at a station turned 90°', () => {
  // Part: arc G3 from (1, 0) about (0, 0) to (0, 1); hole G81 at (2, 1), Z-0.25, R0.1 (LinuxCNC G-code reference, G2/G3 and G81).
  const part = ['G20 G17 G90 G54', 'T1 M6', 'G0 X1 Y0', 'G43 H1 Z0.1', 'G1 Z-0.1 F10', 'G3 X0 Y1 I-1 J0', 'G0 Z0.1', 'G98 G81 X2 Y1 Z-0.25 R0.1 F5', 'G80', 'M30', ''].join('\n');
  // Station at X10 Y5 Z0.5 turned C90: a part point (x, y) goes to (10 − y, 5 + x), Z to Z + 0.5.
  //   arc start (1, 0) → (10, 6); end (0, 1) → (9, 5); center (0, 0) → (10, 5), so I = 10 − 10 = 0, J = 5 − 6 = −1.
  //   feed depth Z-0.1 → Z0.4; hole (2, 1) → (9, 7), Z-0.25 → Z0.25, R0.1 → R0.6.
  const station: Station = { id: 'S:0', number: 1, placement: 'S', stop: 0, x: 10, y: 5, z: 0.5, c: 90, nominalWidth: null };
  it('writes the turned center and end, and rs274 reads them back', () => {
    const read = readPartProgram(part, 'in');
    if (!read.ok) throw new Error(read.error.message);
    const out = expandedProgram({ program: read.program, unit: 'in', stations: [station], order: 'station', safeZ: 1, header });
    if (!out.ok) throw new Error(out.message);
    expect(out.text).toContain('G3 X9.0000 Y5.0000 I0.0000 J-1.0000');
    expect(out.text).toContain('G98 G81 X9.0000 Y7.0000 Z0.2500 R0.6000 F5');
    expect(out.text).toContain('G1 Z0.4000 F10');
    const { canon, errors } = runRs274(out.text, [{ t: 1, z: 1, d: 0.25 }]);
    expect(errors).toEqual([]);
    const { moves } = movesOf(canon);
    // ARC_FEED(x_end, y_end, x_center, y_center, turn, z_end): counter-clockwise (+1) kept by a rigid turn.
    expect(moves.find((m) => m.kind === 'arc')).toMatchObject({ x: 9, y: 5, cx: 10, cy: 5, turn: 1, z: 0.4 });
    // The hole: a feed straight down to Z0.25 at (9, 7).
    expect(moves.filter((m) => m.kind === 'feed').at(-1)).toMatchObject({ x: 9, y: 7, z: 0.25 });
    expect(out.text.trim().endsWith('M30')).toBe(true);
  });
});

describe('cutter compensation left on at the program end', () => {
  // LinuxCNC refuses M6 while cutter compensation is on; M30 clears it in the part program, so the next station's tool change must not inherit it.
  it('cancels it before the next station\'s tool change in station order; rs274 reads the file without error', () => {
    const part = ['G20 G17 G90 G54', 'T1 M6', 'G0 X0 Y0', 'G43 H1 Z0.1', 'G1 Z-0.1 F10', 'X1', 'T2 M6', 'G0 X0 Y0', 'G43 H2 Z0.1', 'G1 Z-0.1 F10', 'G41 D2 G1 X0.5 Y0.2', 'G1 X1', 'M30', ''].join('\n');
    const read = readPartProgram(part, 'in');
    if (!read.ok) throw new Error(read.error.message);
    const st = (number: number, x: number): Station => ({ id: `S:${number}`, number, placement: 'S', stop: 0, x, y: 0, z: 0, c: 0, nominalWidth: null });
    const out = expandedProgram({ program: read.program, unit: 'in', stations: [st(1, 0), st(2, 3)], order: 'station', safeZ: 1, header });
    if (!out.ok) throw new Error(out.message);
    expect(runRs274(part, [{ t: 1, z: 1, d: 0.25 }, { t: 2, z: 1, d: 0.25 }]).errors).toEqual([]);
    expect(runRs274(out.text, [{ t: 1, z: 1, d: 0.25 }, { t: 2, z: 1, d: 0.25 }]).errors).toEqual([]);
  });
});

describe('the supported subset: everything outside it is refused with its line number', () => {
  const start = ['G20 G17 G90 G54', 'T1 M6', 'G0 X0 Y0', 'G43 H1 Z0.5'];
  const cases: [string, string, RegExp][] = [
    ['G53 in X', 'G53 G0 X0 Z0', /G53 may only lift Z/],
    ['G28 in X Y', 'G91 G28 X0 Y0 Z0', /G28 may only lift Z/],
    ['G28 under G90', 'G28 Z0', /G91 G28 Z0/],
    ['G92', 'G92 X0 Y0', /G92/],
    ['G10', 'G10 L2 P1 X0 Y0', /G10/],
    ['G68', 'G68 X0 Y0 R45', /G68/],
    ['M98 call', 'M98 P100', /subprogram/],
    ['M99', 'M99', /subprogram/],
    ['O-word call', 'O100 call', /O-word/],
    ['O-word sub', 'o<part> sub', /O-word/],
    ['G18', 'G18', /XY plane/],
    ['G19', 'G19', /XY plane/],
    ['polar', 'G16', /polar/],
    ['scaling', 'G51 X0 Y0 P2', /scaling/],
    ['units differing from the job', 'G21', /millimetres/],
    ['parameters', '#1 = 5', /parameters/],
    ['expressions', 'G1 X[1+2] F10', /expressions/],
    ['rotary axis', 'G1 A90 F10', /rotary axes/],
    ['a second work offset', 'G55', /one work offset/],
    ['a line too long', `G1 X1 F10 (${'x'.repeat(260)})`, /255/],
    ['G90.1 arc centers', 'G90.1', /arc centers/],
    ['a canned cycle started without R', 'G81 X1 Y1 Z-0.2 F5', /both R and Z/],
  ];
  for (const [what, bad, message] of cases) {
    it(`refuses ${what} on line ${start.length + 1}`, () => {
      const r = readPartProgram([...start, bad, 'M30'].join('\n'), 'in');
      expect(r.ok).toBe(false);
      if (r.ok) return;
      expect(r.error.line).toBe(start.length + 1);
      expect(r.error.message).toMatch(message);
      expect(r.error.message).toMatch(new RegExp(`^Line ${start.length + 1}`));
    });
  }
  it(`refuses more than ${MAX_PROGRAM_LINES.toLocaleString('en-US')} lines before reading any`, () => {
    const r = readPartProgram('G0 X0 Y0\n'.repeat(MAX_PROGRAM_LINES + 1), 'in');
    expect(r).toMatchObject({ ok: false, error: { line: null } });
  });
  it('refuses a file over the size bound', () => {
    const r = readPartProgram(`(${'x'.repeat(200)})\n`.repeat(45_000), 'in');
    expect(r).toMatchObject({ ok: false, error: { line: null, message: expect.stringMatching(/MB/) } });
  });
  it('refuses a move before the first tool change when the program changes tools later', () => {
    const r = readPartProgram(['G20 G90', 'G0 X0 Y0', 'T1 M6', 'G0 X1 Y1', 'M30'].join('\n'), 'in');
    expect(r).toMatchObject({ ok: false, error: { line: 2 } });
  });
  it('reads the summary: tools in order, lines, extents', () => {
    const r = readPartProgram(['%', 'G20 G17 G90 G54', 'T3 M6', 'G0 X0 Y0', 'G43 H3 Z0.5', 'G1 Z-0.1 F10', 'G2 X2 Y0 I1 J0', 'T1 M6', 'G0 X0.5 Y0.5', 'G81 X0.5 Y0.5 Z-0.3 R0.1', 'G80', 'M30', '%'].join('\n'), 'in');
    if (!r.ok) throw new Error(r.error.message);
    expect(r.program.summary).toMatchObject({ tools: [3, 1], lines: 13, workOffset: 'G54', arcs: 1, holes: 1, segments: 2 });
    // The clockwise half circle from (0, 0) to (2, 0) about (1, 0) passes through (1, 1) at the top (G2 seen from +Z).
    expect(r.program.summary.extents).toEqual({ min: { x: 0, y: 0, z: -0.3 }, max: { x: 2, y: 1, z: 0.5 } });
  });
});
