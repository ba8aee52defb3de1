import { describe, expect, it } from 'vitest';
import { evaluateTemplate } from '../../shared/stations/evaluate-template';
import { blocksSaving, type Station } from '../../shared/schemas/template';
import { ALL_STOPS, centerRail, content, jawRail, railBands, rect } from './station-fixtures';

const byId = (stations: Station[]) => new Map(stations.map((s) => [s.id, s]));
// These tests are about placing components; whether the layout holds its parts has its own tests (holding.test.ts).
const placementProblems = (r: ReturnType<typeof evaluateTemplate>) => r.problems.filter(blocksSaving);
const codes = (r: ReturnType<typeof evaluateTemplate>) => placementProblems(r).map((p) => p.code);

describe('hand-worked example: stations and translations', () => {
  // Plate pitch 2.000 in. Center rail: dowels (0,0),(8,0); stops (0.5+k, 0.375), k = 0..7.
  // Shared offset on hole (6, 5) = (12, 10).
  const layout = content({
    numbering: { order: 'by-rail' },
    placements: [
      { id: 'A', component: 'CR-8', hole: { col: 2, row: 3 }, rotation: 0, stopsInUse: ALL_STOPS },
      { id: 'B', component: 'CR-8', hole: { col: 10, row: 1 }, rotation: 90, stopsInUse: ALL_STOPS },
    ],
  });
  const result = evaluateTemplate(layout);
  const s = byId(result.stations);

  it('lays out without problems', () => {
    expect(placementProblems(result)).toEqual([]);
    expect(result.stations).toHaveLength(16);
    expect(result.origin).toEqual({ x: 12, y: 10, z: 0 });
  });

  it.each(ALL_STOPS)('rotation 0, stop %d', (k) => {
    // hole (2,3) = (4,6); datum = (4 + 0.5 + k, 6 + 0.375) = (4.5+k, 6.375); minus (12,10) = (−7.5+k, −3.625)
    expect(s.get(`A:${k}`)).toMatchObject({ placement: 'A', stop: k, x: -7.5 + k, y: -3.625, z: 0, c: 0 });
  });

  it.each(ALL_STOPS)('rotation 90, stop %d', (k) => {
    // hole (10,1) = (20,2); R90·(0.5+k, 0.375) = (−0.375, 0.5+k); datum = (19.625, 2.5+k);
    // minus (12,10) = (7.625, −7.5+k); C = 90 + 0
    expect(s.get(`B:${k}`)).toMatchObject({ placement: 'B', stop: k, x: 7.625, y: -7.5 + k, z: 0, c: 90 });
  });

  it('C = rotation + stop angle, in [0, 360)', () => {
    const turned = { ...centerRail('CR-T'), stops: [{ x: 0.5, y: 0.375, angle: 180 }, { x: 1.5, y: 0.375, angle: -90 }] };
    const r = evaluateTemplate(content({
      components: [turned],
      placements: [{ id: 'T', component: 'CR-T', hole: { col: 2, row: 3 }, rotation: 270, stopsInUse: [0, 1] }],
    }));
    const t = byId(r.stations);
    expect(t.get('T:0')!.c).toBe(90); // 270 + 180 = 450 → 90
    expect(t.get('T:1')!.c).toBe(180); // 270 − 90
  });

  it.each([
    // shared offset, origin, translation of A:0 whose datum is (4.5, 6.375), stop z 0
    [{ kind: 'center' }, { x: 15, y: 9, z: 0 }, { x: -10.5, y: -2.625, z: 0 }], // ((16−1)·2/2, (10−1)·2/2) = (15, 9)
    [{ kind: 'point', x: 1, y: 2, z: -1.25 }, { x: 1, y: 2, z: -1.25 }, { x: 3.5, y: 4.375, z: 1.25 }], // z = 0 − (−1.25)
    [{ kind: 'hole', hole: { col: 0, row: 0 } }, { x: 0, y: 0, z: 0 }, { x: 4.5, y: 6.375, z: 0 }], // the datum hole
  ] as const)('shared offset %o', (sharedOffset, origin, translation) => {
    const r = evaluateTemplate(content({ sharedOffset, placements: [{ id: 'A', component: 'CR-8', hole: { col: 2, row: 3 }, rotation: 0, stopsInUse: [0] }] }));
    expect(r.origin).toEqual(origin);
    expect(r.stations[0]).toMatchObject(translation);
  });

  it('stop z minus the origin z', () => {
    const raised = { ...centerRail('CR-Z'), stops: [{ x: 0.5, y: 0.375, z: 0.75 }] };
    const r = evaluateTemplate(content({
      components: [raised],
      sharedOffset: { kind: 'point', x: 12, y: 10, z: 0.25 },
      placements: [{ id: 'Z', component: 'CR-Z', hole: { col: 2, row: 3 }, rotation: 0, stopsInUse: [0] }],
    }));
    expect(r.stations[0]!.z).toBe(0.5); // 0.75 − 0.25
  });
});

describe('units', () => {
  it('converts a mm component onto an inch plate', () => {
    // 203.2 mm = 8 in; 12.7 mm = 0.5 in; 9.525 mm = 0.375 in (÷ 25.4, NIST SP 811)
    const mmRail = {
      ...centerRail('CR-MM', rect(-12.7, -9.525, 215.9, 9.525)),
      unit: 'mm' as const,
      dowels: [{ x: 0, y: 0 }, { x: 203.2, y: 0 }],
      stops: [{ x: 12.7, y: 9.525 }],
      jawFaces: [{ x: 0, y: 9.525, normal: 90 }],
    };
    const r = evaluateTemplate(content({ components: [mmRail], placements: [{ id: 'M', component: 'CR-MM', hole: { col: 2, row: 3 }, rotation: 0, stopsInUse: [0] }] }));
    expect(placementProblems(r)).toEqual([]);
    expect(r.stations[0]!.x).toBeCloseTo(-7.5, 12);
    expect(r.stations[0]!.y).toBeCloseTo(-3.625, 12);
  });

  it('reports stations in the template unit when the plate is in inches', () => {
    const r = evaluateTemplate(content({ unit: 'mm', placements: [{ id: 'A', component: 'CR-8', hole: { col: 2, row: 3 }, rotation: 0, stopsInUse: [0] }] }));
    expect(r.stations[0]!.x).toBeCloseTo(-190.5, 9); // −7.5 × 25.4
    expect(r.stations[0]!.y).toBeCloseTo(-92.075, 9); // −3.625 × 25.4
    expect(r.origin.x).toBeCloseTo(304.8, 9); // 12 × 25.4
  });
});

describe('refusals name the component, the dowel and the hole', () => {
  const offGridRail = (second: number) => ({ ...jawRail('JR-2', null), dowels: [{ x: 0, y: 0 }, { x: second, y: 0 }] });

  it('refuses an off-grid dowel', () => {
    // hole (3,3) = (6,6); dowel 2 at 6 + 8.25 = 14.25; nearest hole (7,3) at 14; 0.25 off
    const r = evaluateTemplate(content({ components: [offGridRail(8.25)], placements: [{ id: 'P3', component: 'JR-2', hole: { col: 3, row: 3 }, rotation: 0 }] }));
    expect(placementProblems(r)).toEqual([{
      code: 'dowel-off-grid', placement: 'P3', dowel: 1, hole: { col: 7, row: 3 },
      message: 'Placement P3 (JR-2) dowel 2 lands 0.2500 in from hole (7, 3); every dowel must sit within 0.0005 in of a grid hole.',
    }]);
  });

  it.each([
    // second dowel x, refused? — grid tolerance 0.0005 in (common practice, bushed plates)
    [8.0004, false],
    [8.0006, true],
    [7.9996, false],
    [7.9994, true],
  ])('inch plate: dowel at %d refused: %s', (second, refused) => {
    const r = evaluateTemplate(content({ components: [offGridRail(second)], placements: [{ id: 'P', component: 'JR-2', hole: { col: 3, row: 3 }, rotation: 90 }] }));
    expect(codes(r)).toEqual(refused ? ['dowel-off-grid'] : []);
  });

  it.each([
    // second dowel (mm), refused? — grid tolerance 0.01 mm on mm plates
    [200.009, false],
    [200.011, true],
  ])('mm plate: dowel at %d mm refused: %s', (second, refused) => {
    const mm = { ...offGridRail(second), unit: 'mm' as const };
    const r = evaluateTemplate(content({ unit: 'mm', plate: { unit: 'mm', pitch: 50, columns: 10, rows: 8 }, components: [mm], placements: [{ id: 'P', component: 'JR-2', hole: { col: 1, row: 1 }, rotation: 0 }] }));
    expect(codes(r)).toEqual(refused ? ['dowel-off-grid'] : []);
    if (refused) expect(placementProblems(r)[0]!.message).toContain('within 0.010 mm of a grid hole');
  });

  it('refuses a dowel on a hole off the plate, and the rail reaching past the edge', () => {
    // hole (14,0); dowel 2 at col 14 + 4 = 18 > 15; outline reaches 28 + 8.5 = 36.5, edge at 30 + 1 = 31
    const r = evaluateTemplate(content({ placements: [{ id: 'P9', component: 'JR-1', hole: { col: 14, row: 0 }, rotation: 0 }] }));
    expect(placementProblems(r)).toEqual([
      {
        code: 'dowel-off-plate', placement: 'P9', dowel: 1, hole: { col: 18, row: 0 },
        message: 'Placement P9 (JR-1) dowel 2 lands on hole (18, 0), which is off the plate (holes run from (0, 0) to (15, 9)).',
      },
      {
        code: 'off-plate', placement: 'P9', hole: { col: 14, row: 0 },
        message: "Placement P9 (JR-1) on hole (14, 0) reaches 5.5000 in past the plate's +X edge, which lies 1.0000 in beyond the outer holes.",
      },
    ]);
  });

  it.each([
    // outline max x, expected — hole (11,0) = 22; plate edge at 30 + 2/2 = 31
    [9, []], // 22 + 9 = 31: flush with the edge
    [9.25, ['off-plate']], // 31.25: 0.25 over
  ])('outline to local x %d', (maxX, expected) => {
    const r = evaluateTemplate(content({ components: [jawRail('JR-1', rect(-0.5, -0.375, maxX, 0.375))], placements: [{ id: 'E', component: 'JR-1', hole: { col: 11, row: 0 }, rotation: 0 }] }));
    expect(codes(r)).toEqual(expected);
  });

  it('honours the plate edge margin', () => {
    // edge margin 0.25: plate runs −0.25..30.25; outline at hole (0,3) starts at −0.5
    const r = evaluateTemplate(content({ plate: { edgeMargin: 0.25 }, placements: [{ id: 'E', component: 'JR-1', hole: { col: 0, row: 3 }, rotation: 0 }] }));
    expect(placementProblems(r)[0]!.message).toBe("Placement E (JR-1) on hole (0, 3) reaches 0.2500 in past the plate's −X edge, which lies 0.2500 in beyond the outer holes.");
  });

  it('refuses overlapping outlines and names both placements', () => {
    // A at (2,3): x 3.5..12.5; B at (3,3): x 5.5..14.5, same y; no shared hole (2,6 vs 3,7)
    const r = evaluateTemplate(content({ placements: [
      { id: 'A', component: 'CR-8', hole: { col: 2, row: 3 }, rotation: 0 },
      { id: 'B', component: 'JR-1', hole: { col: 3, row: 3 }, rotation: 0 },
    ] }));
    expect(placementProblems(r)).toEqual([{
      code: 'overlap', placement: 'B', hole: { col: 3, row: 3 }, otherPlacement: 'A',
      message: 'Placement B (JR-1) on hole (3, 3) overlaps placement A (CR-8) on hole (2, 3).',
    }]);
  });

  it('accepts outlines that only touch', () => {
    // 2 in wide rails on rows 3 and 4: y 5..7 and 7..9 meet at y = 7
    const wide = centerRail('CR-W', rect(-0.5, -1, 8.5, 1));
    const r = evaluateTemplate(content({ components: [wide], placements: [
      { id: 'A', component: 'CR-W', hole: { col: 2, row: 3 }, rotation: 0 },
      { id: 'B', component: 'CR-W', hole: { col: 2, row: 4 }, rotation: 0 },
    ] }));
    expect(placementProblems(r)).toEqual([]);
  });

  it('finds an overlap between a turned rail and a straight one', () => {
    // A at (2,3) rot 0: x 3.5..12.5, y 5.625..6.375; B at (6,1) rot 90: x 11.625..12.375, y 1.5..18.5
    // B's dowels: (6,1) and (6,5); A's: (2,3) and (6,3) — no shared hole, but the bodies cross.
    const r = evaluateTemplate(content({ placements: [
      { id: 'A', component: 'CR-8', hole: { col: 2, row: 3 }, rotation: 0 },
      { id: 'B', component: 'JR-1', hole: { col: 6, row: 1 }, rotation: 90 },
    ] }));
    expect(codes(r)).toEqual(['overlap']);
  });

  it('refuses two dowels in one hole, even without outlines, and says which were not overlap-checked', () => {
    const stop = { code: 'ST-1', kind: 'stop' as const, unit: 'in' as const, dowels: [{ x: 0, y: 0 }], stops: [{ x: 0.25, y: 0 }] };
    const r = evaluateTemplate(content({ components: [stop], placements: [
      { id: 'S1', component: 'ST-1', hole: { col: 4, row: 4 }, rotation: 0, stopsInUse: [0] },
      { id: 'S2', component: 'ST-1', hole: { col: 4, row: 4 }, rotation: 90, stopsInUse: [0] },
    ] }));
    expect(placementProblems(r)).toEqual([{
      code: 'hole-taken', placement: 'S2', dowel: 0, hole: { col: 4, row: 4 }, otherPlacement: 'S1',
      message: 'Placement S2 (ST-1) dowel 1 needs hole (4, 4), which already holds dowel 1 of placement S1 (ST-1).',
    }]);
    expect(r.notOverlapChecked).toEqual(['S1', 'S2']);
  });

  it.each([
    [[8], 'Placement A (CR-8) uses stop 9, but CR-8 has 8 stops (1–8).'], // people count stops from 1
    [[-1], 'Placement A (CR-8) uses stop 0, but CR-8 has 8 stops (1–8).'],
  ])('refuses stop index %o', (stopsInUse, message) => {
    const r = evaluateTemplate({ ...content(), placements: [{ id: 'A', component: 'CR-8', hole: { col: 2, row: 3 }, rotation: 0, stopsInUse }] });
    expect(placementProblems(r)).toEqual([{ code: 'stop-out-of-range', placement: 'A', stop: stopsInUse[0], message }]);
    expect(r.stations).toEqual([]);
  });

  it('refuses a stop listed twice and makes one station of it', () => {
    const r = evaluateTemplate(content({ placements: [{ id: 'A', component: 'CR-8', hole: { col: 2, row: 3 }, rotation: 0, stopsInUse: [2, 2] }] }));
    expect(codes(r)).toEqual(['duplicate-stop']);
    expect(r.stations.map((s) => s.id)).toEqual(['A:2']);
  });

  it('refuses an unknown component code', () => {
    const r = evaluateTemplate(content({ placements: [{ id: 'Q', component: 'XR-9', hole: { col: 2, row: 3 }, rotation: 0, stopsInUse: [0] }] }));
    expect(placementProblems(r)).toEqual([{ code: 'unknown-component', placement: 'Q', message: "Placement Q names component XR-9, which is not in the template's component list." }]);
    expect(r.stations).toEqual([]);
  });

  it('refuses a rotation off the quarter turns', () => {
    const bad = { ...content(), placements: [{ id: 'R', component: 'CR-8', hole: { col: 2, row: 3 }, rotation: 45 as 0, stopsInUse: [] }] };
    const r = evaluateTemplate(bad);
    expect(placementProblems(r)).toEqual([{ code: 'bad-rotation', placement: 'R', message: 'Placement R (CR-8) is turned 45°; a pinned component can only be turned 0, 90, 180 or 270°.' }]);
  });

  it('refuses duplicate placement ids', () => {
    const r = evaluateTemplate(content({ placements: [
      { id: 'A', component: 'CR-8', hole: { col: 2, row: 3 }, rotation: 0, stopsInUse: [0] },
      { id: 'A', component: 'CR-8', hole: { col: 2, row: 6 }, rotation: 0, stopsInUse: [0] },
    ] }));
    expect(codes(r)).toEqual(['duplicate-placement-id']);
    expect(r.stations.map((s) => s.id)).toEqual(['A:0']);
  });

  it('refuses a shared offset off the plate', () => {
    const r = evaluateTemplate(content({ sharedOffset: { kind: 'hole', hole: { col: 16, row: 0 } } }));
    expect(codes(r)).toEqual(['shared-offset-off-plate']);
  });
});

describe('numbering', () => {
  // Upper rail U on row 6 listed first, lower rail L on row 2; stops 0..2 each.
  // L stations at plate y 4.375, x 4.5, 5.5, 6.5; U at y 12.375, same x.
  const placements = [
    { id: 'U', component: 'CR-8', hole: { col: 2, row: 6 }, rotation: 0 as const, stopsInUse: [0, 1, 2] },
    { id: 'L', component: 'CR-8', hole: { col: 2, row: 2 }, rotation: 0 as const, stopsInUse: [0, 1, 2] },
  ];
  const run = (numbering: object) => evaluateTemplate(content({ placements, numbering: numbering as never }));
  const order = (r: ReturnType<typeof evaluateTemplate>) => r.stations.map((s) => s.id);

  it.each([
    ['row-by-row', {}, ['L:0', 'L:1', 'L:2', 'U:0', 'U:1', 'U:2']], // Y then X, datum row first
    ['serpentine', {}, ['L:0', 'L:1', 'L:2', 'U:2', 'U:1', 'U:0']], // every second row right to left
    ['by-rail', {}, ['U:0', 'U:1', 'U:2', 'L:0', 'L:1', 'L:2']], // placement list order, then stop
    ['by-hand', { manual: ['U:1', 'L:2'] }, ['U:1', 'L:2', 'L:0', 'L:1', 'U:0', 'U:2']], // the list, then the rest row by row
  ])('%s', (order_, extra, expected) => {
    const r = run({ order: order_, ...extra });
    expect(order(r)).toEqual(expected);
    expect(r.stations.map((s) => s.number)).toEqual([1, 2, 3, 4, 5, 6]);
    expect(placementProblems(r)).toEqual([]);
  });

  it('by rail follows the stop index along the rail, not the order stops were listed in', () => {
    const r = evaluateTemplate(content({ numbering: { order: 'by-rail' }, placements: [{ ...placements[0]!, stopsInUse: [2, 0, 1] }] }));
    expect(order(r)).toEqual(['U:0', 'U:1', 'U:2']);
  });

  it('keeps each station identity and position across renumbering', () => {
    const rows = byId(run({ order: 'row-by-row' }).stations);
    const hand = byId(run({ order: 'by-hand', manual: ['U:2', 'L:0'] }).stations);
    expect(rows.get('U:2')!.number).toBe(6);
    expect(hand.get('U:2')!.number).toBe(1);
    for (const [id, s] of rows) expect({ ...hand.get(id)!, number: 0 }).toEqual({ ...s, number: 0 });
  });

  it('keeps station identity when a later version adds and reorders placements', () => {
    const v1 = byId(run({ order: 'row-by-row' }).stations);
    const v2 = byId(evaluateTemplate(content({
      placements: [{ id: 'N', component: 'CR-8', hole: { col: 2, row: 0 }, rotation: 0, stopsInUse: [0] }, placements[1]!, placements[0]!],
    })).stations);
    for (const [id, s] of v1) {
      expect(v2.get(id)).toMatchObject({ x: s.x, y: s.y, placement: s.placement, stop: s.stop });
      expect(v2.get(id)!.number).toBe(s.number + 1); // N:0 on row 0 now comes first
    }
  });

  it('groups rows within the row band: a quarter pitch by default', () => {
    // a stop 0.1 in higher (y 0.475) on a rail in the same grid row is the same row
    const high = { ...centerRail('CR-H'), stops: [{ x: 0.5, y: 0.475 }] };
    const r = evaluateTemplate(content({ components: [centerRail(), high], placements: [
      { id: 'H', component: 'CR-H', hole: { col: 2, row: 2 }, rotation: 0, stopsInUse: [0] }, // x 4.5, y 4.475
      { id: 'L', component: 'CR-8', hole: { col: 8, row: 2 }, rotation: 0, stopsInUse: [1, 0] }, // x 17.5, 16.5; y 4.375
      { id: 'U', component: 'CR-8', hole: { col: 2, row: 5 }, rotation: 0, stopsInUse: [0] },
    ] }));
    expect(order(r)).toEqual(['H:0', 'L:0', 'L:1', 'U:0']);
    const tight = evaluateTemplate({ ...content(), components: [centerRail(), high], placements: [
      { id: 'H', component: 'CR-H', hole: { col: 2, row: 2 }, rotation: 0, stopsInUse: [0] },
      { id: 'L', component: 'CR-8', hole: { col: 8, row: 2 }, rotation: 0, stopsInUse: [1, 0] },
    ] }, { rowTolerance: 0.05 });
    expect(order(tight)).toEqual(['L:0', 'L:1', 'H:0']); // 0.1 apart > 0.05: two rows
  });

  it('reports hand-list ids that do not exist or repeat', () => {
    const r = run({ order: 'by-hand', manual: ['U:1', 'U:1', 'Z:0'] });
    expect(codes(r)).toEqual(['numbering-duplicate-station', 'numbering-unknown-station']);
    expect(order(r)[0]).toBe('U:1');
    expect(r.stations).toHaveLength(6);
  });
});

describe('nominal width held', () => {
  // Center rail C on hole (2,3): fixed face at y = 6 + 0.375 = 6.375, normal +Y, stops x 4.5..11.5.
  const C = { id: 'C', component: 'CR-8', hole: { col: 2, row: 3 }, rotation: 0 as const, stopsInUse: ALL_STOPS };
  const widths = (r: ReturnType<typeof evaluateTemplate>) => r.stations.map((s) => s.nominalWidth);

  it.each([
    // jaw rails, expected width — clamp face at 2·row − 0.375
    ['one row up', [{ col: 2, row: 4 }], 1.25], // 7.625 − 6.375
    ['two rows up', [{ col: 2, row: 5 }], 3.25], // 9.625 − 6.375
    ['nearest of two', [{ col: 2, row: 5 }, { col: 2, row: 4 }], 1.25],
    ['behind the fixed face', [{ col: 2, row: 1 }], null], // 1.625 < 6.375
    ['not reaching sideways', [{ col: 10, row: 4 }], null], // x 19.5..28.5 vs stops 4.5..11.5
  ])('%s', (_name, holes, width) => {
    const jaws = holes.map((hole, i) => ({ id: `J${i}`, component: 'JR-1', hole, rotation: 0 as const }));
    const r = evaluateTemplate(content({ placements: [C, ...jaws] }));
    expect(placementProblems(r)).toEqual([]);
    expect(widths(r)).toEqual(Array(8).fill(width));
  });

  it('covers only the stops the clamp reaches sideways', () => {
    // jaw rail on hole (6,4): x 11.5..20.5 laterally; stops at 4.5..11.5 → only x = 11.5 (stop 7) reached, at the very end
    const r = evaluateTemplate(content({ placements: [C, { id: 'J', component: 'JR-1', hole: { col: 6, row: 4 }, rotation: 0 }] }));
    expect(widths(r)).toEqual([null, null, null, null, null, null, null, 1.25]);
  });

  it('ignores a jaw face that looks the same way as the fixed face', () => {
    const backwards = { ...jawRail('JR-B'), jawFaces: [{ x: 4, y: -0.375, normal: 90 }] };
    const r = evaluateTemplate(content({ components: [centerRail(), backwards], placements: [C, { id: 'J', component: 'JR-B', hole: { col: 2, row: 4 }, rotation: 0 }] }));
    expect(widths(r)).toEqual(Array(8).fill(null));
  });

  it('pairs turned rails: both at 90°', () => {
    // C90 on (10,1): face normal 90 + 90 = 180 (−X) through (20 − 0.375, ·) = x 19.625.
    // J90 on (9,1): face normal 270 + 90 = 0 (+X); local (4, −0.375) → (18 + 0.375, 2 + 4) → x 18.375.
    // width = (18.375 − 19.625)·cos 180° = 1.25
    const r = evaluateTemplate(content({ placements: [
      { id: 'C90', component: 'CR-8', hole: { col: 10, row: 1 }, rotation: 90, stopsInUse: [0, 7] },
      { id: 'J90', component: 'JR-1', hole: { col: 9, row: 1 }, rotation: 90 },
    ] }));
    expect(placementProblems(r)).toEqual([]);
    expect(widths(r)).toEqual([1.25, 1.25]);
  });

  it('builds the pairing table', () => {
    const r = evaluateTemplate(content({ placements: [C, { id: 'J', component: 'JR-1', hole: { col: 2, row: 4 }, rotation: 0 }] }));
    expect(r.pairings).toEqual([{
      fixedPlacement: 'C', fixedComponent: 'CR-8', fixedFace: 0,
      jawPlacement: 'J', jawComponent: 'JR-1', jawFace: 0, jawHole: { col: 2, row: 4 },
      width: 1.25, // as above
      stations: ALL_STOPS.map((k) => `C:${k}`),
    }]);
  });

  it('reports the width in the template unit', () => {
    const r = evaluateTemplate(content({ unit: 'mm', placements: [C, { id: 'J', component: 'JR-1', hole: { col: 2, row: 4 }, rotation: 0 }] }));
    expect(r.stations[0]!.nominalWidth).toBeCloseTo(31.75, 9); // 1.25 × 25.4
    expect(r.pairings[0]!.width).toBeCloseTo(31.75, 9);
  });

  it('finds no width for a stop on a part that is not a fixed jaw', () => {
    const stop = { code: 'ST-1', kind: 'stop' as const, unit: 'in' as const, dowels: [{ x: 0, y: 0 }], stops: [{ x: 0, y: 0.375 }], jawFaces: [{ x: 0, y: 0.375, normal: 90 }] };
    const r = evaluateTemplate(content({ components: [stop, jawRail()], placements: [
      { id: 'S', component: 'ST-1', hole: { col: 2, row: 3 }, rotation: 0, stopsInUse: [0] },
      { id: 'J', component: 'JR-1', hole: { col: 0, row: 4 }, rotation: 0 },
    ] }));
    expect(widths(r)).toEqual([null]);
  });
});

describe('scale', () => {
  const layout = railBands;
  // How fast this runs is measured by `npm run bench -- stations`, never asserted here.
  it('evaluates 2,000 placements into 16,000 stations with their widths', () => {
    const big = layout(100);
    const r = evaluateTemplate(big);
    expect(placementProblems(r)).toEqual([]);
    expect(r.stations).toHaveLength(16_000);
    expect(r.stations.every((s) => s.nominalWidth === 1.25)).toBe(true); // (2·band+1)·2 − 0.375 − ((2·band)·2 + 0.375)
  });
});
