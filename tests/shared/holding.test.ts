import { describe, expect, it } from 'vitest';
import { evaluateTemplate } from '../../shared/stations/evaluate-template';
import { blocksSaving } from '../../shared/schemas/template';
import { stopFacesOut } from '../../shared/stations/holding-checks';
import { centerRail, content, jawRail } from './station-fixtures';

/**
 * Does the layout hold every part? Hand-worked on the fixtures' 2.000 in grid (station-fixtures.ts):
 * a CR-8 on hole (c, r) has its fixed jaw face along y = 2r + 0.375 facing +Y (normal 90°), stop k at
 * x = 2c + 0.5 + k; a JR-1 on hole (c, r) at 0° has its clamp face along y = 2r − 0.375 facing −Y.
 * A part is pushed by the jaw rail's clamps against the fixed jaw (common practice for clamp rails).
 */
const clamp = { acceptBelow: 0.03, acceptAbove: 0.03, topHeight: 0.3, topSlope: 0.5, gripLow: 0.05, gripHigh: 0.2, gripSlope: 0.5, slotSlop: 0.01 };
const jawWithClamp = { ...jawRail(), clamp };
const cr = (id: string, col: number, row: number, stopsInUse = [0, 1]) => ({ id, component: 'CR-8', hole: { col, row }, rotation: 0 as const, stopsInUse });
const jr = (id: string, col: number, row: number, rotation: 0 | 180 = 0) => ({ id, component: 'JR-1', hole: { col, row }, rotation, stopsInUse: [] });
const evaluate = (placements: ReturnType<typeof cr | typeof jr>[], components: object[] = [centerRail(), jawWithClamp]) =>
  evaluateTemplate(content({ components: components as never, placements, numbering: { order: 'by-rail' } }));
const codes = (r: ReturnType<typeof evaluate>) => r.problems.map((p) => [p.code, p.station ?? p.placement]);

describe('a layout that holds its parts', () => {
  it('a center rail with its jaw rail one row out: every station held, nothing to fix', () => {
    // fixed face y = 6.375 (row 3), clamp face y = 8 − 0.375 = 7.625 (row 4): width 1.250 in
    const r = evaluate([cr('A', 2, 3), jr('J', 2, 4)]);
    expect(r.problems).toEqual([]);
    expect(r.stations.map((s) => s.nominalWidth)).toEqual([1.25, 1.25]);
  });
});

describe('problems that block submit and release', () => {
  it('no jaw rail at all: every station is unheld (the shop found 20 stations released with none)', () => {
    const r = evaluate([cr('A', 2, 3)]);
    expect(r.problems).toEqual([
      { code: 'no-facing-clamp', placement: 'A', stop: 0, station: 'A:0', message: 'Station 1 (placement A, stop 1) has no jaw-rail clamp facing its fixed jaw; place a jaw rail facing it, or take the stop out of use.' },
      { code: 'no-facing-clamp', placement: 'A', stop: 1, station: 'A:1', message: 'Station 2 (placement A, stop 2) has no jaw-rail clamp facing its fixed jaw; place a jaw rail facing it, or take the stop out of use.' },
    ]);
    expect(r.stations.every((s) => s.nominalWidth === null)).toBe(true);
  });

  it('never pairs a rail with the jaw rail behind the next rail: the search stops at the outline in between', () => {
    // A's jaw y 6.375; B (row 5) occupies y 9.625–10.375; J (row 6) clamps y 11.625 towards B's jaw at 10.375.
    // Without A's own jaw rail the nearest clamp facing A is J, 5.250 in away, straight through B.
    const r = evaluate([cr('A', 2, 3), cr('B', 2, 5), jr('J', 2, 6)]);
    expect(codes(r)).toEqual([['no-facing-clamp', 'A:0'], ['no-facing-clamp', 'A:1']]);
    expect(r.problems[0]!.message).toBe('Station 1 (placement A, stop 1) has no clamp it can reach: placement B lies between its fixed jaw and the nearest jaw rail facing it; place a jaw rail in front of it, or take the stop out of use.');
    expect(r.stations.filter((s) => s.placement === 'A').map((s) => s.nominalWidth)).toEqual([null, null]);
    // B is held by J: 11.625 − 10.375 = 1.250 in
    expect(r.stations.filter((s) => s.placement === 'B').map((s) => s.nominalWidth)).toEqual([1.25, 1.25]);
    expect(r.pairings.map((p) => [p.fixedPlacement, p.jawPlacement, p.width])).toEqual([['B', 'J', 1.25]]);
  });

  it('a jaw rail turned away faces no fixed jaw', () => {
    // J on (6, 4) turned 180°: dowels on (6, 4) and (2, 4); its clamp face (4, −0.375) → (12 − 4, 8 + 0.375) = (8, 8.375), normal 90° (+Y), away from A.
    const r = evaluate([cr('A', 2, 3), jr('J', 6, 4, 180)]);
    expect(codes(r)).toEqual([['no-facing-clamp', 'A:0'], ['no-facing-clamp', 'A:1'], ['jaw-rail-faces-nothing', 'J']]);
    expect(r.problems[2]!.message).toBe("Placement J (JR-1) on hole (6, 4) is a jaw rail that faces no fixed jaw, so its clamps would push on nothing; turn it to face a rail's jaw, or remove it.");
  });

  it('a jaw rail facing a rail whose stops are not in use still faces a jaw: no problem for it', () => {
    const r = evaluate([cr('A', 2, 3, []), cr('B', 2, 7), jr('J', 2, 4), jr('K', 2, 8)]);
    expect(codes(r)).toEqual([]);
  });

  it('a jaw rail with no clamp model holds nothing a bar can be checked against', () => {
    const r = evaluate([cr('A', 2, 3), jr('J', 2, 4)], [centerRail(), jawRail()]);
    expect(codes(r)).toEqual([['no-facing-clamp', 'A:0'], ['no-facing-clamp', 'A:1']]);
    expect(r.problems[0]!.message).toBe('Station 1 (placement A, stop 1) is faced by jaw rail J (JR-1), which has no clamp model, so no bar can be judged to fit; give JR-1 its clamp model in the catalog.');
  });

  it('a clamp that closes past the width held accepts no bar', () => {
    // width 1.250 in; a clamp closing 1.300 in below its opening would accept bars down to −0.050 in: none.
    const r = evaluate([cr('A', 2, 3, [0]), jr('J', 2, 4)], [centerRail(), { ...jawRail(), clamp: { ...clamp, acceptBelow: 1.3 } }]);
    expect(r.problems.map((p) => p.message)).toEqual(['Station 1 (placement A, stop 1) is faced by jaw rail J (JR-1) only 1.2500 in away, closer than its clamp can close (1.3000 in below its opening), so no bar fits; move the jaw rail out a hole.']);
  });

  it('a stop that faces into its jaw', () => {
    // Face normal 90° (+Y): a stop at 0° puts the part's +Y on the normal (out of the jaw); at 180° its +Y points −Y, into the rail.
    const turnedStops = { ...centerRail(), stops: centerRail().stops.map((s, k) => ({ ...s, angle: k === 1 ? 180 : 0 })) };
    const r = evaluate([cr('A', 2, 3), jr('J', 2, 4)], [turnedStops, jawWithClamp]);
    expect(codes(r)).toEqual([['stop-faces-away', 'A:1']]);
    expect(r.problems[0]!.message).toBe('Station 2 (placement A, stop 2) is set at 180° on a jaw face whose normal is 90°, so the part would lie inside the jaw; a stop faces out when its angle is the face normal less 90° — correct stop 2 of CR-8 in the catalog.');
  });

  it.each([
    [0, 90, true], [180, 270, true], [90, 180, true], [270, 0, true], [-90, 0, true],
    [180, 90, false], [0, 270, false], [90, 90, false], [0, 90.01, false],
  ])('stop at %d° on a face whose normal is %d°: faces out %s', (angle, normal, out) => {
    expect(stopFacesOut(angle, normal)).toBe(out);
  });

  it('an empty layout has no stations', () => {
    const r = evaluate([]);
    expect(r.problems).toEqual([{ code: 'no-stations', message: 'The layout has no stations: place a rail or vise and tick the stops in use.' }]);
  });

  it('these block submit and release, not saving a draft still being built', () => {
    const r = evaluate([cr('A', 2, 3), cr('B', 2, 5), jr('J', 2, 6), jr('K', 9, 4, 180)]);
    expect(r.problems.length).toBeGreaterThan(0);
    expect(r.problems.filter(blocksSaving)).toEqual([]);
  });
});

describe('station Z: the part seat above the shared offset Z0', () => {
  it("takes the fixed component's seat height, converted to the template unit, less the shared offset z", () => {
    // CR-8 seat 0.500 in; a point shared offset at z 0.125 in: Z = 0.500 − 0.125 = 0.375 in = 9.525 mm.
    const seated = { ...centerRail(), seatHeight: 0.5, stops: centerRail().stops.map((s, k) => (k === 1 ? { ...s, z: 0.75 } : s)) };
    const inch = evaluateTemplate(content({ components: [seated, jawWithClamp] as never, placements: [cr('A', 2, 3), jr('J', 2, 4)], sharedOffset: { kind: 'point', x: 12, y: 10, z: 0.125 } }));
    expect(inch.stations.map((s) => s.z)).toEqual([0.375, 0.625]); // stop 2 has its own z, 0.750 in: 0.750 − 0.125
    const mm = evaluateTemplate(content({ unit: 'mm', components: [seated, jawWithClamp] as never, placements: [cr('A', 2, 3), jr('J', 2, 4)], sharedOffset: { kind: 'point', x: 304.8, y: 254, z: 3.175 } }));
    expect(mm.stations[0]!.z).toBeCloseTo(9.525, 9); // 0.375 in × 25.4 mm/in (NIST SP 811, exact)
  });

  it('a component written before seat heights were kept sits at 0', () => {
    const r = evaluate([cr('A', 2, 3), jr('J', 2, 4)]);
    expect(r.stations.map((s) => s.z)).toEqual([0, 0]);
  });
});
