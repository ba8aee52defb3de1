import { afterEach, describe, expect, it } from 'vitest';
import { writeOffsetFile, type OffsetFileRequest } from '../../shared/gcode/offsets';
import { evaluateTemplate } from '../../shared/stations/evaluate-template';
import type { Station } from '../../shared/schemas/template';
import { content } from './station-fixtures';
import { G92_PARAMS, registerParams, rs274Session, type Rs274Session } from './rs274-params';

/**
 * Offset files read back by LinuxCNC's own interpreter (Debian's linuxcnc-uspace, `rs274`): what it
 * stores in each register and each local shift must equal the machine position of the shared offset
 * plus each station's translation, worked out here from the layout by hand — not by the project's
 * station engine. LinuxCNC G-code reference: "G10 L2" (P1–P9 = G54–G59.3, R rotates XY about Z),
 * "G52" (a local offset from the active work offset), "G92.1" (zeroes the G92/G52 offset), and
 * offsets persisting across programs in the parameter file; NISTIR 6556 §3.5.5 for G10 L2.
 */

// Pitch 2.000 in, shared offset on hole (6, 5) → origin (12, 10). The center rail's stop k sits at
// local (0.5 + k, 0.375) (tests/shared/station-fixtures.ts).
const PITCH = 2;
const ORIGIN = { x: 6 * PITCH, y: 5 * PITCH };
const RAILS: Record<string, { col: number; row: number; deg: 0 | 90 }> = { A: { col: 2, row: 3, deg: 0 }, B: { col: 10, row: 1, deg: 90 } };

/** Translation and C of station "A:k" / "B:k", from hole × pitch + R(θ)·stop − origin. */
function handWorked(id: string): { x: number; y: number; z: number; c: number } {
  const [rail, k] = [id.split(':')[0]!, Number(id.split(':')[1])];
  const r = RAILS[rail]!;
  const sx = 0.5 + k;
  const sy = 0.375;
  // R(0)·(sx, sy) = (sx, sy); R(90)·(sx, sy) = (−sy, sx)
  const [dx, dy] = r.deg === 0 ? [sx, sy] : [-sy, sx];
  return { x: r.col * PITCH + dx - ORIGIN.x, y: r.row * PITCH + dy - ORIGIN.y, z: 0, c: r.deg };
}

function layout(stops: { A?: number[]; B?: number[] }, name?: string) {
  const placements = [];
  if (stops.A) placements.push({ id: 'A', component: 'CR-8', hole: { col: 2, row: 3 }, rotation: 0 as const, stopsInUse: stops.A });
  if (stops.B) placements.push({ id: 'B', component: 'CR-8', hole: { col: 10, row: 1 }, rotation: 90 as const, stopsInUse: stops.B });
  return evaluateTemplate(content({ numbering: { order: 'by-rail' }, placements, sharedOffset: { kind: 'hole', hole: { col: 6, row: 5 }, name } })).stations;
}

const source = { templateName: 'Read-back layout', version: 2, state: 'released', contentHash: 'sha256:test' };
const file = (req: Partial<OffsetFileRequest> & Pick<OffsetFileRequest, 'family' | 'stations'>) => {
  const r = writeOffsetFile({ source, unit: 'in', ...req });
  if (!r.ok) throw new Error(r.error.message);
  return r.text;
};

let session: Rs274Session;
afterEach(() => session?.close());

describe('ngc-g10 read back by rs274', () => {
  it.each([
    ['in', 1, 'G54'],
    ['mm', 25.4, 'G55'],
  ] as const)('%s: every register equals base + translation, R equals C (shared %s)', (unit, perInch, sharedName) => {
    session = rs274Session();
    const stations = layout({ A: [0, 1, 2, 3], B: [0, 1] }, sharedName);
    const stationsInUnit: Station[] = stations.map((s) => ({ ...s, x: s.x * perInch, y: s.y * perInch, z: s.z * perInch }));
    const base = { x: -20.1234 * perInch, y: -10.5 * perInch, z: -3.25 * perInch };
    const run = session.run(file({ family: 'ngc-g10', unit, stations: stationsInUnit, base, sharedOffsetName: sharedName }));
    expect(run.errors).toEqual([]);
    const params = session.params();
    const sharedRegister = sharedName === 'G54' ? 1 : 2;
    for (const s of stations) {
      const p = registerParams(sharedRegister + s.number); // first defaults to the register after the shared one
      const want = handWorked(s.id);
      // This build of rs274 keeps offsets in inches whatever G20/G21 says (STACK-NOTES).
      expect(params.get(p.x)! * perInch).toBeCloseTo(base.x + want.x * perInch, unit === 'in' ? 4 : 2);
      expect(params.get(p.y)! * perInch).toBeCloseTo(base.y + want.y * perInch, unit === 'in' ? 4 : 2);
      expect(params.get(p.z)! * perInch).toBeCloseTo(base.z + want.z * perInch, unit === 'in' ? 4 : 2);
      expect(params.get(p.r)).toBeCloseTo(want.c, 6);
    }
    // The shared offset's own register is never written.
    expect(params.get(registerParams(sharedRegister).x) ?? 0).toBe(0);
    // The file ends its program and leaves no local shift.
    expect(run.canon.some((c) => c.name === 'PROGRAM_END')).toBe(true);
    expect([G92_PARAMS.x, G92_PARAMS.y, G92_PARAMS.z].map((k) => params.get(k) ?? 0)).toEqual([0, 0, 0]);
  });

  it('leaves no rotation behind: a turned station, then another layout with that register unturned', () => {
    session = rs274Session();
    // First file: stations 1–2 on rail A, 3–4 on rail B turned 90° → P2..P5, P4 and P5 at R90.
    const first = layout({ A: [0, 1], B: [0, 1] });
    expect(session.run(file({ family: 'ngc-g10', stations: first, base: { x: 0, y: 0, z: 0 } })).errors).toEqual([]);
    expect(session.params().get(registerParams(4).r)).toBe(90);
    // Second file: four unturned stations on rail A → P2..P5, every one at R0.
    const second = layout({ A: [0, 1, 2, 3] });
    const run = session.run(file({ family: 'ngc-g10', stations: second, base: { x: 0, y: 0, z: 0 } }));
    expect(run.errors).toEqual([]);
    for (const p of [2, 3, 4, 5]) expect(session.params().get(registerParams(p).r)).toBe(0);
    // And a program selecting station 3 of the second layout (G57 = P4) turns nothing.
    const select = session.run('G20 G90\nG57\nG0 X0 Y0\nM30\n');
    expect(select.errors).toEqual([]);
    const rotations = select.canon.filter((c) => c.name === 'SET_XY_ROTATION').map((c) => c.args[0]);
    expect(rotations.at(-1)).toBe(0);
  });
});

describe('ngc-g52 read back by rs274', () => {
  it('shifts to each station by its translation and clears the shift at the end', () => {
    session = rs274Session();
    const stations = layout({ A: [0, 1, 2, 3, 4, 5, 6, 7] });
    // A shift an aborted earlier run left behind: the file must clear it before its first station.
    session.run('G20 G90\nG52 X5 Y5 Z0\nM30\n');
    expect(session.params().get(G92_PARAMS.x)).toBe(5);
    const run = session.run(file({ family: 'ngc-g52', stations }));
    expect(run.errors).toEqual([]);
    const shifts = run.canon.filter((c) => c.name === 'SET_G92_OFFSET').map((c) => c.args.slice(0, 3));
    // rs274 announces the stored offset at start-up, then G92.1's zero, then one shift per station, then the clear.
    const body = shifts.slice(shifts.findIndex((s, i) => i > 0 && s.every((v) => v === 0)) + 1);
    expect(body).toHaveLength(stations.length + 1);
    stations.forEach((s, i) => {
      const want = handWorked(s.id);
      expect(body[i]![0]).toBeCloseTo(want.x, 4);
      expect(body[i]![1]).toBeCloseTo(want.y, 4);
      expect(body[i]![2]).toBeCloseTo(want.z, 4);
    });
    expect(body.at(-1)).toEqual([0, 0, 0]);
    expect([G92_PARAMS.x, G92_PARAMS.y, G92_PARAMS.z].map((k) => session.params().get(k))).toEqual([0, 0, 0]);
    expect(run.canon.some((c) => c.name === 'PROGRAM_END')).toBe(true);
  });
});
