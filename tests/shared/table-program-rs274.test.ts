// The whole-table program read back by LinuxCNC's interpreter (rs274): every feed move of the table program is a feed
// move of the single-part program carried to its station, computed here with plain trigonometry (a rotation by C
// counter-clockwise about the part datum, then the station's translation), independently of shared/gcode.
// Canned cycles and arcs mean what the LinuxCNC G-code reference says (G81–G89, G73: X Y hole, R plane, Z depth;
// G2/G3 with I J from the start or R).
import { describe, expect, it } from 'vitest';
import { evaluateTemplate } from '../../shared/stations/evaluate-template';
import { readPartProgram } from '../../shared/gcode/read-part-program';
import { expandedProgram } from '../../shared/gcode/expand-program';
import { writeTableProgram, type ProgramOrder } from '../../shared/gcode/table-program';
import { offsetFrame } from '../../shared/gcode/offset-frames';
import type { ControlFamily as OffsetFamily } from '../../shared/gcode/control-families';
import type { Station } from '../../shared/schemas/template';
import type { Unit } from '../../shared/schemas/common';
import { centerRail, content } from './station-fixtures';
import { movesInStartFrame, movesOf, runRs274, type Move } from './rs274';

function prng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const TOOLS = [{ t: 1, z: 1.0, d: 0.25 }, { t: 2, z: 2.0, d: 0.125 }, { t: 3, z: 1.5, d: 0.25 }];

/** A random layout of 8 in center rails on the test plate, turned 0/90/180/270 (turned stations included). */
function randomStations(rand: () => number): Station[] {
  const slots = [
    ...[0, 2, 4, 6, 8].map((row) => (rand() < 0.5 ? { hole: { col: 0, row }, rotation: 0 as const } : { hole: { col: 4, row }, rotation: 180 as const })),
    ...[10, 12, 14].map((col) => (rand() < 0.5 ? { hole: { col, row: 0 }, rotation: 90 as const } : { hole: { col, row: 4 }, rotation: 270 as const })),
  ];
  const placements = slots.filter(() => rand() < 0.6).map((s, k) => ({ id: `P${k}`, component: 'CR-8', ...s, stopsInUse: [0, 1, 2, 3, 4, 5, 6, 7].filter(() => rand() < 0.35) }));
  if (!placements.some((p) => p.stopsInUse.length)) placements.push({ id: 'PX', component: 'CR-8', hole: { col: 12, row: 5 }, rotation: 90, stopsInUse: [1, 4] });
  const c = content({ components: [centerRail()], placements, sharedOffset: { kind: 'point', x: Math.round(rand() * 20) / 2, y: Math.round(rand() * 16) / 2, z: -Math.round(rand() * 8) / 8 } });
  return evaluateTemplate(c).stations;
}


/** A part program a CAM system might post: a contour with arcs (I J and R), G91 moves, drilling cycles, cutter compensation. */
function randomPart(rand: () => number, unit: Unit = 'in'): string {
  const r = (lo: number, hi: number) => lo + rand() * (hi - lo);
  // Every length is drawn in inches and written in the program's unit (1 in = 25.4 mm).
  const f = (v: number) => (unit === 'mm' ? (v * 25.4).toFixed(3) : v.toFixed(4));
  const x0 = r(0.1, 0.4), y0 = r(0.1, 0.4);
  const cx = x0 + r(0.2, 0.4), cy = y0;
  const rad = cx - x0;
  const a = r(0.3, 2.5);
  const ex = cx + rad * Math.cos(a), ey = cy + rad * Math.sin(a);
  const rr = r(0.3, 0.5);
  const lines = [
    '%', 'O0100 (RANDOM PART)', `${unit === 'mm' ? 'G21' : 'G20'} G17 G40 G49 G80 G90 G94`, 'G54',
    'T1 M6', 'S8000 M3', `G0 X${f(x0)} Y${f(y0)}`, `G43 H1 Z${f(0.5)}`, 'M8',
    `G1 Z${f(-r(0.02, 0.1))} F20.`,
    `G3 X${f(ex)} Y${f(ey)} I${f(rad)} J0.`,
    `G2 X${f(ex + rr)} Y${f(ey + 0.1)} R${f(rr)}`,
    `G91 G1 X${f(r(0.05, 0.2))} Y${f(-r(0.05, 0.2))}`,
    `X${f(r(0.05, 0.2))}`,
    'G90',
    `G1 Y${f(r(0.2, 0.8))}`,
    `G1 X${f(r(0.2, 0.8))} Y${f(r(0.2, 0.8))} Z${f(-r(0.02, 0.1))}`,
    `G0 Z${f(0.5)}`, 'M9', 'G91 G28 Z0', 'G90',
    'T2 M6', 'S3000 M3', `G0 X${f(r(0.1, 0.5))} Y${f(r(0.1, 0.5))}`, `G43 H2 Z${f(0.5)}`,
    `G98 G81 X${f(r(0.1, 0.9))} Y${f(r(0.1, 0.9))} Z${f(-r(0.2, 0.4))} R${f(0.1)} F10.`,
    `X${f(r(0.1, 0.9))} Y${f(r(0.1, 0.9))}`,
    `Y${f(r(0.1, 0.9))}`,
    `G99 G83 X${f(r(0.1, 0.9))} Y${f(r(0.1, 0.9))} Z${f(-0.5)} R${f(0.05)} Q${f(0.15)}`,
    `G73 X${f(r(0.1, 0.9))} Y${f(r(0.1, 0.9))} Z${f(-0.4)} R${f(0.05)} Q${f(0.1)}`,
    'G80', `G0 Z${f(0.5)}`,
    `G91 G81 X${f(0.2)} Y${f(r(-0.1, 0.1))} R${f(-0.4)} Z${f(-0.35)} L3`,
    'G90 G80', `G0 Z${f(0.5)}`, 'G53 G0 Z0',
    'T3 M6', 'S9000 M3', `G0 X${f(r(1.2, 1.4))} Y${f(r(0.2, 0.4))}`, `G43 H3 Z${f(0.5)}`, `G1 Z${f(-r(0.05, 0.1))} F15.`,
    `G41 D3 G1 X${f(1)} Y${f(0.2)}`, `G1 X${f(1)} Y${f(0.8)}`, `G2 X${f(1.4)} Y${f(0.8)} I${f(0.2)} J0.`, `G1 X${f(1.4)} Y${f(0.2)}`, `G40 G1 X${f(1.6)} Y${f(0.1)}`,
    `G0 Z${f(0.5)}`, 'M5', 'G91 G28 Z0', 'G90', 'M30', '%',
  ];
  return lines.join('\n') + '\n';
}

/** Feed moves of the part program, by tool segment (split at CHANGE_TOOL). */
function partFeeds(text: string): Move[][] {
  const { canon, errors } = runRs274(text, TOOLS);
  expect(errors, 'rs274 reads the part program without error').toEqual([]);
  const { moves, changeIndex } = movesOf(canon);
  if (!changeIndex.length) return [moves.filter((m) => m.kind !== 'traverse')];
  const bounds = [...changeIndex, moves.length];
  const segments: Move[][] = [];
  for (let k = 0; k < changeIndex.length; k++) segments.push(moves.slice(bounds[k], bounds[k + 1]).filter((m) => m.kind !== 'traverse'));
  return segments;
}

/** The station's placement of a part point: R(C) p + (X, Y), Z + station Z. */
function carry(m: Move, s: Station): Move {
  const rad = (s.c * Math.PI) / 180;
  const cos = Math.cos(rad), sin = Math.sin(rad);
  const at = (x: number, y: number) => ({ x: s.x + cos * x - sin * y, y: s.y + sin * x + cos * y });
  const e = at(m.x, m.y);
  const out: Move = { kind: m.kind, x: e.x, y: e.y, z: m.z + s.z };
  if (m.kind === 'arc') {
    const c = at(m.cx!, m.cy!);
    out.cx = c.x; out.cy = c.y; out.turn = m.turn;
  }
  return out;
}

function checkTable(opts: { part: string; stations: Station[]; skip: number[]; order: ProgramOrder; unit: Unit; safeZ: number; tol: number; tools?: number[] }) {
  const read = readPartProgram(opts.part, opts.unit);
  if (!read.ok) throw new Error(JSON.stringify(read.error));
  const used = opts.stations.filter((s) => !opts.skip.includes(s.number)).sort((a, b) => a.number - b.number);
  const table = expandedProgram({ program: read.program, unit: opts.unit, stations: used, order: opts.order, safeZ: opts.safeZ, header: { templateName: 'Random', version: 1, state: 'released', contentHash: 'x', jobId: 1, jobName: 'J', partNumber: 'P', programSha256: 'y', family: 'EXPANDED', skipped: opts.skip } });
  if (!table.ok) throw new Error(table.message);
  const { canon, errors } = runRs274(table.text, TOOLS);
  expect(errors, 'rs274 reads the whole-table program without error').toEqual([]);
  expect(canon.at(-2)?.kind === 'PROGRAM_END' || canon.some((c) => c.kind === 'PROGRAM_END')).toBe(true);
  const segs = partFeeds(opts.part);
  // The expected sequence of (station, segment) groups.
  const groups: { station: Station; k: number; moves: Move[] }[] = [];
  if (opts.order === 'station') for (const s of used) segs.forEach((m, k) => groups.push({ station: s, k, moves: m.map((v) => carry(v, s)) }));
  else segs.forEach((m, k) => { for (const s of used) groups.push({ station: s, k, moves: m.map((v) => carry(v, s)) }); });
  const { moves, toolChanges } = movesOf(canon);
  // One tool change per segment in tool order; one per segment and station in station order.
  const tools = opts.tools ?? [1, 2, 3];
  expect(toolChanges).toEqual(opts.order === 'tool' ? tools : used.flatMap(() => tools));
  let g = 0, i = 0, boundary = true;
  let last: Move | null = null;
  const feeds = moves.filter((m) => m.kind !== 'traverse').length;
  expect(feeds).toBe(groups.reduce((n, gr) => n + gr.moves.length, 0));
  for (const m of moves) {
    const changesXY = !last || Math.abs(m.x - last.x) > 1e-9 || Math.abs(m.y - last.y) > 1e-9;
    if (boundary && changesXY) {
      // The first X Y move after a station change or tool change is a rapid at or above safe Z, start and end.
      expect(m.kind, `first X Y move of group ${g}`).toBe('traverse');
      expect(Math.min(last?.z ?? Infinity, m.z), `height of the rapid into group ${g}`).toBeGreaterThanOrEqual(opts.safeZ - opts.tol);
      boundary = false;
    }
    last = m;
    if (m.kind === 'traverse') continue;
    const want = groups[g]!.moves[i]!;
    const where = `station ${groups[g]!.station.number} segment ${groups[g]!.k + 1} feed ${i}`;
    expect(m.kind, where).toBe(want.kind);
    expect(Math.abs(m.x - want.x), `${where} x`).toBeLessThanOrEqual(opts.tol);
    expect(Math.abs(m.y - want.y), `${where} y`).toBeLessThanOrEqual(opts.tol);
    expect(Math.abs(m.z - want.z), `${where} z`).toBeLessThanOrEqual(opts.tol);
    if (m.kind === 'arc') {
      expect(Math.abs(m.cx! - want.cx!), `${where} center x`).toBeLessThanOrEqual(opts.tol);
      expect(Math.abs(m.cy! - want.cy!), `${where} center y`).toBeLessThanOrEqual(opts.tol);
      expect(m.turn, `${where} direction`).toBe(want.turn);
    }
    i++;
    while (g < groups.length && i >= groups[g]!.moves.length) { g++; i = 0; boundary = true; }
  }
  expect(g, 'every station of every segment appears once').toBe(groups.length);
  return { used, groups };
}

describe('whole-table program read back by rs274 (LinuxCNC interpreter)', () => {
  // 20 cases: random layouts and skip sets, both orders; 3 rs274 runs each (part, table, part again is cached below).
  for (let seed = 1; seed <= 10; seed++) {
    for (const order of ['station', 'tool'] as const) {
      it(`seed ${seed}, ${order} order: every feed is a part feed carried to its station; skipped stations never appear`, () => {
        const rand = prng(seed * 7919);
        const stations = randomStations(rand);
        const skip = stations.filter(() => rand() < 0.25).map((s) => s.number).slice(0, Math.max(0, stations.length - 1));
        const part = randomPart(rand);
        const { used, groups } = checkTable({ part, stations, skip, order, unit: 'in', safeZ: 1.25, tol: 1e-4 });
        expect(new Set(groups.map((gr) => gr.station.number))).toEqual(new Set(used.map((s) => s.number)));
        for (const n of skip) expect(used.some((s) => s.number === n)).toBe(false);
        if (order === 'tool') {
          // All of tool n's moves come before tool n+1's.
          const ks = groups.map((gr) => gr.k);
          expect([...ks].sort((a, b) => a - b)).toEqual(ks);
        }
      });
    }
  }

  // Stations at any angle, not only quarter turns, and a metric program: within 0.002 mm.
  for (const order of ['station', 'tool'] as const) {
    it(`millimetres, stations turned 30°, 135° and 0°, ${order} order`, () => {
      const rand = prng(order === 'tool' ? 4242 : 2424);
      const st = (number: number, x: number, y: number, z: number, c: number): Station => ({ id: `S:${number}`, number, placement: 'S', stop: 0, x, y, z, c, nominalWidth: null });
      const stations = [st(1, 0, 0, 0, 0), st(2, 120.5, 30.25, 6.35, 30), st(3, -80, 210, 0, 135), st(4, 300, -40, 12.7, 270)];
      checkTable({ part: randomPart(rand, 'mm'), stations, skip: [4], order, unit: 'mm', safeZ: 40, tol: 0.002 });
    });
  }

  // A program with no tool change (the tool already in the spindle), written in G91 after its first
  // position: incremental lines, an incremental I J arc and an R arc, all turned, never moved.
  it('a program without a tool change, incremental arcs included, at stations turned 90° and 180°', () => {
    const st = (number: number, x: number, y: number, z: number, c: number): Station => ({ id: `S:${number}`, number, placement: 'S', stop: 0, x, y, z, c, nominalWidth: null });
    const part = ['G20 G17 G90 G54', 'G0 X0.5 Y0.25 Z0.2', 'G1 Z-0.05 F12', 'G91 G1 X0.5 Y0.1', 'G3 X-0.3 Y0.3 I-0.3 J0', 'G2 X0.4 Y0 R0.25', 'G1 Y0.2 Z-0.02', 'X0.05', 'G90 G1 X0.1 Y0.9', 'G0 Z0.2', 'M30', ''].join('\n');
    checkTable({ part, stations: [st(1, 3, 1, 0.25, 90), st(2, -2, 4, 0, 180), st(3, 6, -1, 0, 0)], skip: [], order: 'station', unit: 'in', safeZ: 1, tol: 1e-4, tools: [] });
  });

  // Offset families: the part's own coordinates under each station's work offset (G10 L2 P R, LinuxCNC "G10 L2") or
  // local shift (G52); rs274 reports positions in the active system and the offsets apart, carried back here.
  const families: [OffsetFamily, boolean][] = [['ngc-g10', true], ['ngc-g52', false]];
  for (const [family, turned] of families) {
    for (const order of ['station', 'tool'] as const) {
      it(`${family}, ${order} order: every feed lands where the expanded family puts it${turned ? ', turned stations included' : ''}`, () => {
        const rand = prng(family.length * 31 + order.length);
        const st = (number: number, x: number, y: number, z: number, c: number): Station => ({ id: `S:${number}`, number, placement: 'S', stop: 0, x, y, z, c, nominalWidth: null });
        const stations = [st(1, 1, 1, 0, 0), st(2, 6, 1.5, 0.25, turned ? 90 : 0), st(3, 2, 7, 0, turned ? 270 : 0), st(4, 9, 8, 0.5, turned ? 30 : 0)];
        const base = { x: -5, y: -3, z: -2 };
        const part = randomPart(rand);
        const read = readPartProgram(part, 'in');
        if (!read.ok) throw new Error(read.error.message);
        const made = offsetFrame({ family, unit: 'in', stations, sharedOffsetName: 'G54', base });
        if (!made.ok) throw new Error(made.error.message);
        const safeZ = 1.25;
        const table = writeTableProgram({ program: read.program, unit: 'in', stations, order, safeZ, header: { templateName: 'T', version: 1, state: 'released', contentHash: 'h', jobId: 1, jobName: 'J', partNumber: 'P', programSha256: 's', family, skipped: [] } }, made.frame);
        if (!table.ok) throw new Error(table.message);
        const { canon, errors } = runRs274(table.text, TOOLS);
        expect(errors).toEqual([]);
        // rs274's G54 is at machine zero; G10 families set the stations from base, G52 shifts from the active G54.
        const shift = family === 'ngc-g10' ? base : { x: 0, y: 0, z: 0 };
        const feeds = movesInStartFrame(canon).filter((m) => m.kind !== 'traverse');
        const segs = partFeeds(part);
        const want: Move[] = [];
        if (order === 'station') for (const s of stations) segs.forEach((m) => want.push(...m.map((v) => carry(v, s))));
        else segs.forEach((m) => { for (const s of stations) want.push(...m.map((v) => carry(v, s))); });
        expect(feeds.length).toBe(want.length);
        feeds.forEach((m, i) => {
          const w = want[i]!;
          expect(Math.abs(m.x - shift.x - w.x), `feed ${i} x`).toBeLessThanOrEqual(1e-4);
          expect(Math.abs(m.y - shift.y - w.y), `feed ${i} y`).toBeLessThanOrEqual(1e-4);
          expect(Math.abs(m.z - shift.z - w.z), `feed ${i} z`).toBeLessThanOrEqual(1e-4);
          if (m.kind === 'arc') {
            expect(Math.abs(m.cx! - shift.x - w.cx!), `arc ${i} center x`).toBeLessThanOrEqual(1e-4);
            expect(Math.abs(m.cy! - shift.y - w.cy!), `arc ${i} center y`).toBeLessThanOrEqual(1e-4);
            expect(m.turn).toBe(w.turn);
          }
        });
      });
    }
  }
  it('a turned station in a family that cannot turn is refused, not approximated', () => {
    const s: Station = { id: 'S:1', number: 1, placement: 'S', stop: 0, x: 1, y: 1, z: 0, c: 90, nominalWidth: null };
    const made = offsetFrame({ family: 'ngc-g52', unit: 'in', stations: [s] });
    expect(made).toMatchObject({ ok: false, error: { code: 'turned-station' } });
  });
});
