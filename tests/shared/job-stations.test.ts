import { describe, expect, it } from 'vitest';
import { jobRails, stationsUsed } from '../../shared/jobs/stations-used';
import { partOverlapProblems, turnOutline } from '../../shared/jobs/job-problems';
import type { Station } from '../../shared/schemas/template';

const clamp = (below: number, above: number) => ({ acceptBelow: below, acceptAbove: above, topHeight: 0.16, topSlope: 0.5, gripLow: 0.04, gripHigh: 0.16, gripSlope: 0.5, slotSlop: 0.015 });
const station = (number: number, x: number, nominalWidth: number | null, c = 0): Station => ({ id: `P:${number}`, number, placement: 'P', stop: number - 1, x, y: 0, z: 0, c, nominalWidth });

describe('stationsUsed: the stations whose width held accepts the stock (clamp accept window, shared/clamps/clamp-window.ts "fits")', () => {
  // A demo-like layout: stations 1–4 hold 1.000 in on a rail accepting 0.030 in either way, 5–8 hold 1.500 in on a
  // rail accepting 0.035 in either way (invented figures; the window is nominal − below … nominal + above, common practice).
  const stations = [1, 2, 3, 4].map((n) => station(n, n, 1)).concat([5, 6, 7, 8].map((n) => station(n, n, 1.5)));
  const v = {
    unit: 'in' as const,
    components: [{ code: 'J1', unit: 'in' as const, clamp: clamp(0.03, 0.03) }, { code: 'J15', unit: 'in' as const, clamp: clamp(0.035, 0.035) }],
    pairings: [
      { fixedPlacement: 'F', fixedComponent: 'F', fixedFace: 0, jawPlacement: 'A-JR', jawComponent: 'J1', jawFace: 0, jawHole: { col: 0, row: 0 }, width: 1, stations: ['P:1', 'P:2', 'P:3', 'P:4'] },
      { fixedPlacement: 'F', fixedComponent: 'F', fixedFace: 0, jawPlacement: 'B-JR', jawComponent: 'J15', jawFace: 0, jawHole: { col: 0, row: 0 }, width: 1.5, stations: ['P:5', 'P:6', 'P:7', 'P:8'] },
    ],
  };
  const rails = jobRails(v);
  it('1.000 in stock: 0.970 ≤ 1.000 ≤ 1.030 takes stations 1–4; 1.465 > 1.000 leaves 5–8', () => {
    expect(stationsUsed(stations, rails, 1.0)).toEqual([1, 2, 3, 4]);
  });
  it('edges of the windows: 1.030 in is in (1.000 + 0.030), 1.031 in is out; 1.465 in (1.500 − 0.035) takes 5–8', () => {
    expect(stationsUsed(stations, rails, 1.03)).toEqual([1, 2, 3, 4]);
    expect(stationsUsed(stations, rails, 1.031)).toEqual([]);
    expect(stationsUsed(stations, rails, 1.465)).toEqual([5, 6, 7, 8]);
  });
  it('a station no jaw rail clamps (no width held) is always used', () => {
    expect(stationsUsed([...stations, station(9, 9, null)], rails, 1.5)).toEqual([5, 6, 7, 8, 9]);
  });
  it('converts a clamp model in mm into an inch template: 0.762 mm = 0.030 in (25.4 mm/in, NIST SP 811)', () => {
    const mm = jobRails({ ...v, components: [{ code: 'J1', unit: 'mm' as const, clamp: clamp(0.762, 0.762) }, v.components[1]!] });
    expect(stationsUsed(stations, mm, 1.03)).toEqual([1, 2, 3, 4]);
    expect(stationsUsed(stations, mm, 1.031)).toEqual([]);
  });
});

describe('part overlap (footprints from shared/geometry/outline.ts)', () => {
  // A 2.5 × 0.9 in part, datum at its lower-left corner, on stops 1.000 in apart along x (C = 0).
  const part = { paths: [{ closed: true, points: [{ x: 0, y: 0 }, { x: 2.5, y: 0 }, { x: 2.5, y: 0.9 }, { x: 0, y: 0.9 }] }], circles: [] };
  const layout = { unit: 'in' as const, plate: { unit: 'in' as const, pitch: 1 }, placements: [], components: [] };
  const stations = [station(1, 0, 1), station(2, 1, 1), station(3, 2, 1)];
  it('unturned: station k covers x ∈ [k − 1, k + 1.5]; 1–2 overlap by 1.5 in, 1–3 by 0.5 in, 2–3 by 1.5 in', () => {
    const problems = partOverlapProblems(layout, { x: 0, y: 0 }, stations, part, 0);
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatchObject({ code: 'part-overlap', stations: [1, 2, 3] });
    expect(problems[0]!.message).toContain('station 1 and station 2; station 1 and station 3; station 2 and station 3');
  });
  it('turned 90° about the datum: (x, y) → (−y, x), so the part covers x ∈ [−0.9, 0] + k − 1: gaps of 0.1 in, no problem', () => {
    const turned = turnOutline(part, 90);
    const xs = turned.paths[0]!.points.map((p) => p.x);
    expect(Math.min(...xs)).toBeCloseTo(-0.9, 12);
    expect(Math.max(...xs)).toBeCloseTo(0, 12);
    expect(partOverlapProblems(layout, { x: 0, y: 0 }, stations, part, 90)).toEqual([]);
  });
  it('a component outline under the parts is named; one that only touches their edge is not', () => {
    const rail = (y0: number, y1: number) => ({ code: 'R', kind: 'center-rail' as const, unit: 'in' as const, dowels: [{ x: 0, y: 0 }], stops: [], jawFaces: [], outline: { paths: [{ closed: true, points: [{ x: -1, y: y0 }, { x: 4, y: y0 }, { x: 4, y: y1 }, { x: -1, y: y1 }] }], circles: [] } });
    const on = (y0: number, y1: number) => ({ ...layout, components: [rail(y0, y1)], placements: [{ id: 'R1', component: 'R', hole: { col: 0, row: 0 }, rotation: 0 as const, stopsInUse: [] }] });
    expect(partOverlapProblems(on(-0.75, 0), { x: 0, y: 0 }, stations, part, 90)).toEqual([]);
    const under = partOverlapProblems(on(-0.75, 0.2), { x: 0, y: 0 }, stations, part, 90);
    expect(under).toHaveLength(1);
    expect(under[0]!.message).toContain('placement R1 (R)');
  });
});
