import { describe, expect, it } from 'vitest';
import { compareVersions } from '../../shared/compare/compare-versions';
import { keyedDifference } from '../../shared/compare/keyed-difference';
import { signedDegrees } from '../../shared/compare/signed-degrees';
import { VersionDiffSchema, type VersionDiff } from '../../shared/schemas/diff';
import type { Rotation, TemplateContent } from '../../shared/schemas/template';
import { evaluateTemplate } from '../../shared/stations/evaluate-template';
import { jaw, rail, rotate, stopOf } from './compare-fixtures';
import { ALL_STOPS, centerRail, content, jawRail, railBands, rect } from './station-fixtures';

/** Every answer must also be what the API schema promises. */
const compare = (...args: Parameters<typeof compareVersions>): VersionDiff => VersionDiffSchema.parse(compareVersions(...args));

const ids = (list: Array<{ id: string }>) => list.map((x) => x.id);

describe('one placement moved by grid holes', () => {
  // A and B are CR-8 rails, all 8 stops. B on row 6 stays put; A starts on hole (2, 3).
  // Pitch 2.000 in (station-fixtures plate), so one hole is 2.000 in.
  const before = content({ placements: [rail('A', 2, 3), rail('B', 2, 6)] });

  it.each([
    // A moves to, expected dx, dy (hole delta × 2.000 in pitch)
    [{ col: 3, row: 3 }, 2, 0], // (3 − 2)·2
    [{ col: 2, row: 4 }, 0, 2], // (4 − 3)·2
    [{ col: 1, row: 2 }, -2, -2], // (1 − 2)·2, (2 − 3)·2
  ])('A to hole %o moves A and each of its stations by (%d, %d) in', (hole, dx, dy) => {
    const after = content({ placements: [rail('A', hole.col, hole.row), rail('B', 2, 6)] });
    const d = compare(before, after);
    expect(d.placements.moved).toEqual([{ id: 'A', componentFrom: 'CR-8', componentTo: 'CR-8', from: { hole: { col: 2, row: 3 }, rotation: 0 }, to: { hole, rotation: 0 }, dx, dy, dRotation: 0 }]);
    expect(d.stations.changed.map((s) => s.id)).toEqual(ALL_STOPS.map((k) => `A:${k}`));
    for (const s of d.stations.changed) expect(s).toMatchObject({ dx, dy, dz: 0, dc: 0, number: s.previousNumber });
    // Nothing else: B's 8 stations as they were, no renumbering, no problems, same offset.
    expect(d.stations.unchanged).toBe(8);
    expect([d.stations.added, d.stations.removed, d.stations.renumbered, d.stations.widthChanged, d.placements.added, d.placements.removed, d.placements.changed]).toEqual([[], [], [], [], [], [], []]);
    expect(d.sharedOffset.changed).toBe(false);
    expect(d.problems).toEqual({ introduced: [], resolved: [] });
    expect(d.summary).toBe('1 placement moved, 0 added, 0 removed; 8 stations changed, 0 added, 0 removed, 0 renumbered; shared offset unchanged.');
  });

  it('on a 50 mm plate one hole is 50 mm', () => {
    // A mm rail: dowels (0, 0), (200, 0) = 4 holes apart; stops (12.5 + 25k, 10), k = 0..3.
    const mmRail = {
      ...centerRail('CR-200', rect(-12.5, -10, 212.5, 10)), unit: 'mm' as const,
      dowels: [{ x: 0, y: 0 }, { x: 200, y: 0 }], stops: [0, 1, 2, 3].map((k) => ({ x: 12.5 + 25 * k, y: 10 })), jawFaces: [{ x: 0, y: 10, normal: 90 }],
    };
    const mm = (col: number) => content({
      unit: 'mm', plate: { unit: 'mm', pitch: 50, columns: 10, rows: 8 }, components: [mmRail],
      sharedOffset: { kind: 'hole', hole: { col: 0, row: 0 } },
      placements: [rail('A', col, 2, 0, [0, 1, 2, 3], 'CR-200')],
    });
    const d = compare(mm(1), mm(2));
    expect(d.unit).toBe('mm');
    expect(d.placements.moved[0]).toMatchObject({ dx: 50, dy: 0 }); // (2 − 1)·50 mm
    expect(d.stations.changed.map((s) => [s.dx, s.dy])).toEqual([[50, 0], [50, 0], [50, 0], [50, 0]]);
    expect(d.problems).toEqual({ introduced: [], resolved: [] });
  });
});

describe('a quarter turn about the primary dowel', () => {
  // Station datum d = h + R(θ)·s (the placement transform); turning the placement by 90° about its
  // primary dowel gives d' = h + R(θ + 90°)·s, so Δ = R(θ + 90°)·s − R(θ)·s and ΔC = +90°.
  // Hole h = (7, 4) = (14, 8): the 8 in rail stays on the plate at every quarter turn.
  const turns: Array<[Rotation, Rotation]> = [[0, 90], [90, 180], [180, 270], [270, 0]];

  it.each(turns)('%d° → %d°: each station moves as the rotation matrices say', (theta, next) => {
    const d = compare(content({ placements: [rail('A', 7, 4, theta)] }), content({ placements: [rail('A', 7, 4, next)] }));
    expect(d.placements.moved).toEqual([{ id: 'A', componentFrom: 'CR-8', componentTo: 'CR-8', from: { hole: { col: 7, row: 4 }, rotation: theta }, to: { hole: { col: 7, row: 4 }, rotation: next }, dx: 0, dy: 0, dRotation: 90 }]);
    expect(d.stations.changed).toHaveLength(8);
    for (const k of ALL_STOPS) {
      const a = rotate(theta, stopOf(k));
      const b = rotate(next, stopOf(k));
      const s = d.stations.changed.find((c) => c.id === `A:${k}`)!;
      expect([s.dx, s.dy, s.dz, s.dc]).toEqual([b.x - a.x, b.y - a.y, 0, 90]);
      // and the new translation is h + R(θ + 90°)·s − origin, origin = hole (6, 5) = (12, 10)
      expect(s.to).toEqual({ x: 14 + b.x - 12, y: 8 + b.y - 10, z: 0, c: next });
    }
  });

  it('0° → 90°, stop 0 worked by hand', () => {
    // s = (0.5, 0.375); R(0)·s = (0.5, 0.375); R(90)·s = (0·0.5 − 1·0.375, 1·0.5 + 0·0.375) = (−0.375, 0.5)
    // Δ = (−0.875, 0.125); new translation (14 − 0.375 − 12, 8 + 0.5 − 10) = (1.625, −1.5)
    const d = compare(content({ placements: [rail('A', 7, 4, 0, [0])] }), content({ placements: [rail('A', 7, 4, 90, [0])] }));
    expect(d.stations.changed).toEqual([{
      id: 'A:0', number: 1, previousNumber: 1, placement: 'A', stop: 0,
      from: { x: 2.5, y: -1.625, z: 0, c: 0 }, // (14 + 0.5 − 12, 8 + 0.375 − 10)
      to: { x: 1.625, y: -1.5, z: 0, c: 90 },
      dx: -0.875, dy: 0.125, dz: 0, dc: 90,
    }]);
  });

  it.each([
    // rotation from → to, dc in (−180, 180]
    [0, 270, -90], // 270 − 0 = 270 → −90: the short way round
    [90, 270, 180], // a half turn is +180 either way
    [270, 90, 180],
  ] as const)('%d° → %d° reports dc %d', (theta, next, dc) => {
    const d = compare(content({ placements: [rail('A', 7, 4, theta, [0])] }), content({ placements: [rail('A', 7, 4, next, [0])] }));
    expect(d.stations.changed[0]!.dc).toBe(dc);
    expect(d.placements.moved[0]!.dRotation).toBe(dc);
  });
});

describe('renumbering shown as such', () => {
  // U on row 6, L on row 2, stops 0..2 each (as in the numbering tests of stations.test.ts).
  const pU = rail('U', 2, 6, 0, [0, 1, 2]);
  const pL = rail('L', 2, 2, 0, [0, 1, 2]);

  it.each([
    [
      'row by row → serpentine',
      content({ placements: [pU, pL] }), content({ placements: [pU, pL], numbering: { order: 'serpentine' } }),
      // L0 L1 L2 U0 U1 U2 → L0 L1 L2 U2 U1 U0; U:1 keeps number 5. Listed in the new order.
      [{ id: 'U:2', from: 6, to: 4 }, { id: 'U:0', from: 4, to: 6 }],
      '0 placements moved, 0 added, 0 removed; 0 stations changed, 0 added, 0 removed, 2 renumbered; shared offset unchanged; numbering changed from row-by-row to serpentine.',
    ],
    [
      'by hand, U:2 and L:0 first',
      content({ placements: [pU, pL] }), content({ placements: [pU, pL], numbering: { order: 'by-hand', manual: ['U:2', 'L:0'] } }),
      // the hand list, then the rest row by row: U2 L0 L1 L2 U0 U1
      [{ id: 'U:2', from: 6, to: 1 }, { id: 'L:0', from: 1, to: 2 }, { id: 'L:1', from: 2, to: 3 }, { id: 'L:2', from: 3, to: 4 }, { id: 'U:0', from: 4, to: 5 }, { id: 'U:1', from: 5, to: 6 }],
      '0 placements moved, 0 added, 0 removed; 0 stations changed, 0 added, 0 removed, 6 renumbered; shared offset unchanged; numbering changed from row-by-row to by-hand.',
    ],
    [
      'by rail, placement list reordered',
      content({ placements: [pU, pL], numbering: { order: 'by-rail' } }), content({ placements: [pL, pU], numbering: { order: 'by-rail' } }),
      // U0 U1 U2 L0 L1 L2 → L0 L1 L2 U0 U1 U2
      [{ id: 'L:0', from: 4, to: 1 }, { id: 'L:1', from: 5, to: 2 }, { id: 'L:2', from: 6, to: 3 }, { id: 'U:0', from: 1, to: 4 }, { id: 'U:1', from: 2, to: 5 }, { id: 'U:2', from: 3, to: 6 }],
      '0 placements moved, 0 added, 0 removed; 0 stations changed, 0 added, 0 removed, 6 renumbered; shared offset unchanged.',
    ],
  ])('%s', (_name, before, after, renumbered, summary) => {
    const d = compare(before, after);
    expect(d.stations.renumbered).toEqual(renumbered);
    expect(d.stations.changed).toEqual([]); // no geometric change
    expect(d.placements.moved).toEqual([]);
    expect(d.stations.unchanged).toBe(6 - renumbered.length);
    expect(d.summary).toBe(summary);
  });

  it('a changed hand list under the same order is a numbering change', () => {
    const hand = (manual: string[]) => content({ placements: [pU, pL], numbering: { order: 'by-hand', manual } });
    const d = compare(hand(['U:2']), hand(['U:1']));
    expect(d.template.numbering.changed).toBe(true);
    expect(d.summary).toContain('hand numbering list changed');
  });

  it('a hand list kept under another order numbers nothing, so changing it is no change', () => {
    const rows = (manual: string[]) => content({ placements: [pU, pL], numbering: { order: 'row-by-row', manual } });
    expect(compare(rows(['U:2']), rows(['U:1'])).summary).toBe('No changes.');
  });

  it('a moved station also shows its new number', () => {
    // L moves up to row 8, above U: its stations move +4 in y (2 holes × 2.000) and now number after U's.
    const d = compare(content({ placements: [pU, pL] }), content({ placements: [pU, rail('L', 2, 8, 0, [0, 1, 2])] }));
    expect(d.stations.changed.map((s) => [s.id, s.previousNumber, s.number, s.dy])).toEqual([['L:0', 1, 4, 12], ['L:1', 2, 5, 12], ['L:2', 3, 6, 12]]); // (8 − 2)·2 = 12
    expect(d.stations.renumbered).toEqual([{ id: 'U:0', from: 4, to: 1 }, { id: 'U:1', from: 5, to: 2 }, { id: 'U:2', from: 6, to: 3 }]);
  });
});

describe('placements and stations added and removed', () => {
  const one = content({ placements: [rail('A', 2, 3, 0, [0, 1])] });
  const two = content({ placements: [rail('A', 2, 3, 0, [0, 1]), rail('B', 2, 6, 0, [0, 1])] });

  it('an added placement brings its stations', () => {
    const d = compare(one, two);
    expect(d.placements.added).toEqual([{ id: 'B', component: 'CR-8', hole: { col: 2, row: 6 }, rotation: 0, stopsInUse: [0, 1] }]);
    // B:k datum (4 + 0.5 + k, 12 + 0.375) − (12, 10) = (−7.5 + k, 2.375); numbered after A's row
    expect(d.stations.added).toEqual([
      { id: 'B:0', number: 3, placement: 'B', stop: 0, x: -7.5, y: 2.375, z: 0, c: 0, nominalWidth: null },
      { id: 'B:1', number: 4, placement: 'B', stop: 1, x: -6.5, y: 2.375, z: 0, c: 0, nominalWidth: null },
    ]);
    expect(d.stations.removed).toEqual([]);
    // No jaw rail faces B: each new station is a layout problem (no clamp holds it).
    expect(d.problems.introduced.map((p) => [p.code, p.station])).toEqual([['no-facing-clamp', 'B:0'], ['no-facing-clamp', 'B:1']]);
    expect(d.summary).toBe('0 placements moved, 1 added, 0 removed; 0 stations changed, 2 added, 0 removed, 0 renumbered; shared offset unchanged; 2 layout problems introduced, 0 resolved.');
  });

  it('a removed placement takes its stations', () => {
    const d = compare(two, one);
    expect(ids(d.placements.removed)).toEqual(['B']);
    expect(ids(d.stations.removed)).toEqual(['B:0', 'B:1']);
    expect(d.stations.added).toEqual([]);
    expect(d.summary).toBe('0 placements moved, 0 added, 1 removed; 0 stations changed, 0 added, 2 removed, 0 renumbered; shared offset unchanged; 0 layout problems introduced, 2 resolved.');
  });

  it('changing the stops in use adds and removes stations, by identity', () => {
    // A uses stops 0,1,2 then 1,2,3: A:0 goes, A:3 comes, A:1 and A:2 stay put but renumber 2→1, 3→2.
    const d = compare(content({ placements: [rail('A', 2, 3, 0, [0, 1, 2])] }), content({ placements: [rail('A', 2, 3, 0, [1, 2, 3])] }));
    expect(d.placements.changed).toEqual([{ id: 'A', componentFrom: 'CR-8', componentTo: 'CR-8', stopsAdded: [3], stopsRemoved: [0] }]);
    expect(d.placements.moved).toEqual([]);
    expect(ids(d.stations.added)).toEqual(['A:3']);
    expect(ids(d.stations.removed)).toEqual(['A:0']);
    expect(d.stations.changed).toEqual([]);
    expect(d.stations.renumbered).toEqual([{ id: 'A:1', from: 2, to: 1 }, { id: 'A:2', from: 3, to: 2 }]);
    // Unclamped stations are problems keyed by station, so renumbered A:1 and A:2 keep theirs: A:3's is new, A:0's gone.
    expect(d.summary).toBe('0 placements moved, 0 added, 0 removed; 0 stations changed, 1 added, 1 removed, 2 renumbered; shared offset unchanged; 1 placement with another component or other stops in use; 1 layout problem introduced, 1 resolved.');
  });

  it('another component under the same placement id is reported, and its definition as added', () => {
    const before = content({ placements: [rail('A', 2, 3, 0, [0])] });
    const after = content({ components: [centerRail(), jawRail(), centerRail('CR-8B')], placements: [rail('A', 2, 3, 0, [0], 'CR-8B')] });
    const d = compare(before, after);
    expect(d.placements.changed).toEqual([{ id: 'A', componentFrom: 'CR-8', componentTo: 'CR-8B', stopsAdded: [], stopsRemoved: [] }]);
    expect(d.components).toEqual({ added: ['CR-8B'], removed: [], changed: [] });
    expect(d.stations.changed).toEqual([]); // same geometry under a new code
  });

  it('a component definition edited in place moves stations with no placement moving', () => {
    // CR-8 stops shifted +0.25 in x along the rail: each A station moves 0.25 in x.
    const shifted = { ...centerRail(), stops: ALL_STOPS.map((k) => ({ x: 0.75 + k, y: 0.375 })) };
    const d = compare(content({ placements: [rail('A', 2, 3)] }), content({ components: [shifted, jawRail()], placements: [rail('A', 2, 3)] }));
    expect(d.components.changed).toEqual(['CR-8']);
    expect(d.placements.moved).toEqual([]);
    expect(d.stations.changed.map((s) => s.dx)).toEqual(Array(8).fill(0.25)); // 0.75 − 0.5
  });

  it('a jaw rail moved by one hole changes the width held, not the station offsets', () => {
    // C's fixed face at y 6.375; jaw face at 2·row − 0.375: row 4 → 7.625 (1.25 held), row 5 → 9.625 (3.25).
    const c = rail('C', 2, 3);
    const d = compare(content({ placements: [c, jaw('J', 2, 4)] }), content({ placements: [c, jaw('J', 2, 5)] }));
    expect(d.placements.moved).toEqual([{ id: 'J', componentFrom: 'JR-1', componentTo: 'JR-1', from: { hole: { col: 2, row: 4 }, rotation: 0 }, to: { hole: { col: 2, row: 5 }, rotation: 0 }, dx: 0, dy: 2, dRotation: 0 }]);
    expect(d.stations.changed).toEqual([]);
    expect(d.stations.widthChanged).toEqual(ALL_STOPS.map((k) => ({ id: `C:${k}`, number: k + 1, from: 1.25, to: 3.25 })));
    expect(d.summary).toBe('1 placement moved, 0 added, 0 removed; 0 stations changed, 0 added, 0 removed, 0 renumbered; shared offset unchanged; nominal width changed at 8 stations.');
  });
});

describe('the comparison epsilon', () => {
  it.each([
    // stop 0 nudged along the rail by, reported as changed (epsilon 1e-9 in)
    [0, false],
    [5e-10, false], // below 1e-9: float noise, not a move
    [2e-9, true],
    [0.0001, true], // one tenth of a thou, the display resolution in inches
  ])('stop moved by %d in: changed %s', (nudge, changed) => {
    const nudged = { ...centerRail(), stops: [{ x: 0.5 + nudge, y: 0.375 }] };
    const d = compare(content({ placements: [rail('A', 2, 3, 0, [0])] }), content({ components: [nudged, jawRail()], placements: [rail('A', 2, 3, 0, [0])] }));
    expect(ids(d.stations.changed)).toEqual(changed ? ['A:0'] : []);
    expect(d.stations.unchanged).toBe(changed ? 0 : 1);
  });
});

describe('nominal width held', () => {
  it.each([
    // C's fixed face at y 6.375; a jaw rail on row 4 has its clamp face at 7.625: 1.25 held
    ['a jaw rail added', [rail('C', 2, 3)], [rail('C', 2, 3), jaw('J', 2, 4)], null, 1.25],
    ['a jaw rail removed', [rail('C', 2, 3), jaw('J', 2, 4)], [rail('C', 2, 3)], 1.25, null],
  ])('%s', (_name, before, after, from, to) => {
    const d = compare(content({ placements: before }), content({ placements: after }));
    expect(d.stations.widthChanged).toEqual(ALL_STOPS.map((k) => ({ id: `C:${k}`, number: k + 1, from, to })));
    expect(d.stations.changed).toEqual([]);
  });
});

describe('shared offset', () => {
  // A at (2, 3) rot 0 and B at (10, 1) rot 90, all stops: the hand-worked layout of stations.test.ts.
  const placements = [rail('A', 2, 3), rail('B', 10, 1, 90)];
  const at = (sharedOffset: TemplateContent['sharedOffset'], over: Parameters<typeof content>[0] = {}) => content({ placements, sharedOffset, ...over });

  it('moved by (1 hole, 0): every translation changes by −pitch in x', () => {
    // origin (6, 5) → (7, 5): (12, 10) → (14, 10); translation = datum − origin drops by 2.000 in x
    const d = compare(at({ kind: 'hole', hole: { col: 6, row: 5 } }), at({ kind: 'hole', hole: { col: 7, row: 5 } }));
    expect(d.sharedOffset).toEqual({
      changed: true, moved: true,
      from: { kind: 'hole', hole: { col: 6, row: 5 } }, to: { kind: 'hole', hole: { col: 7, row: 5 } },
      originFrom: { x: 12, y: 10, z: 0 }, originTo: { x: 14, y: 10, z: 0 },
      dx: 2, dy: 0, dz: 0,
    });
    expect(d.stations.changed).toHaveLength(16);
    expect(d.stations.changed.every((s) => s.dx === -2 && s.dy === 0 && s.dz === 0 && s.dc === 0)).toBe(true);
    expect(d.placements.moved).toEqual([]);
    expect(d.summary).toBe('0 placements moved, 0 added, 0 removed; 16 stations changed, 0 added, 0 removed, 0 renumbered; shared offset moved by (2.0000, 0.0000, 0.0000) in.');
  });

  it('a point raised 0.5 in z lowers every translation by 0.5', () => {
    const d = compare(at({ kind: 'point', x: 12, y: 10, z: 0 }), at({ kind: 'point', x: 12, y: 10, z: 0.5 }));
    expect([d.sharedOffset.moved, d.sharedOffset.dz]).toEqual([true, 0.5]);
    expect(d.stations.changed.every((s) => s.dz === -0.5)).toBe(true);
  });

  it.each([
    // two definitions of one origin: redefined, nothing moved
    ['a hole and the point on it', { kind: 'hole', hole: { col: 7, row: 4 } }, { kind: 'point', x: 14, y: 8, z: 0 }], // (7·2, 4·2)
    ['the plate center and its point', { kind: 'center' }, { kind: 'point', x: 15, y: 9, z: 0 }], // ((16 − 1)·2/2, (10 − 1)·2/2)
    ['a new name', { kind: 'hole', hole: { col: 6, row: 5 } }, { kind: 'hole', hole: { col: 6, row: 5 }, name: 'G54' }],
  ] as const)('%s', (_name, a, b) => {
    const d = compare(at(a), at(b));
    expect([d.sharedOffset.changed, d.sharedOffset.moved]).toEqual([true, false]);
    expect(d.stations.changed).toEqual([]);
    expect(d.summary).toBe('0 placements moved, 0 added, 0 removed; 0 stations changed, 0 added, 0 removed, 0 renumbered; shared offset redefined on the same origin.');
  });

  it('the same point written in mm is the same definition', () => {
    // (1, 2, 0) in = (25.4, 50.8, 0) mm (1 in = 25.4 mm, NIST SP 811)
    const d = compare(at({ kind: 'point', x: 1, y: 2, z: 0 }), at({ kind: 'point', x: 25.4, y: 50.8, z: 0 }, { unit: 'mm' }));
    expect([d.sharedOffset.changed, d.sharedOffset.moved]).toEqual([false, false]);
    expect(d.stations.changed).toEqual([]);
  });
});

describe('units and plates', () => {
  const placements = [rail('A', 2, 3), rail('B', 10, 1, 90)];

  it('converts the earlier version into the later unit before comparing', () => {
    const d = compare(content({ placements }), content({ placements, unit: 'mm' }));
    expect(d.unit).toBe('mm');
    expect(d.template.unit).toEqual({ changed: true, from: 'in', to: 'mm' });
    expect(d.stations.changed).toEqual([]); // unconverted, each would seem to move by 25.4·x − x
    expect(d.stations.unchanged).toBe(16);
    expect(d.summary).toBe('0 placements moved, 0 added, 0 removed; 0 stations changed, 0 added, 0 removed, 0 renumbered; shared offset unchanged; unit changed from in to mm.');
  });

  it('reports a move across a unit change in the later unit', () => {
    const d = compare(content({ placements }), content({ placements: [rail('A', 3, 3), placements[1]!], unit: 'mm' }));
    expect(d.placements.moved[0]!.dx).toBe(50.8); // one 2.000 in hole × 25.4
    expect(d.stations.changed).toHaveLength(8);
    for (const s of d.stations.changed) expect(s.dx).toBeCloseTo(50.8, 9);
  });

  it('the same layout re-drilled at 1 in pitch, holes renumbered, has not moved', () => {
    // hole (2, 3) at 2 in is (4, 6) at 1 in; (10, 1) is (20, 2); offset (6, 5) is (12, 10); 31 × 19 holes span the same 30 × 18 in
    const fine = content({
      plate: { code: 'GP-31x19', pitch: 1, columns: 31, rows: 19 },
      placements: [rail('A', 4, 6), rail('B', 20, 2, 90)],
      sharedOffset: { kind: 'hole', hole: { col: 12, row: 10 } },
    });
    const d = compare(content({ placements }), fine);
    expect(d.plate).toMatchObject({ changed: true, fields: ['code', 'pitch', 'columns', 'rows'] });
    expect(d.placements.moved).toEqual([]);
    expect(d.stations.changed).toEqual([]);
    expect(d.sharedOffset.moved).toBe(false);
    expect(d.summary).toBe('0 placements moved, 0 added, 0 removed; 0 stations changed, 0 added, 0 removed, 0 renumbered; shared offset redefined on the same origin; plate changed (code, pitch, columns, rows).');
  });

  it('the same hole number on a coarser plate is another place', () => {
    // hole (2, 3): (4, 6) at 2 in, (6, 9) at 3 in → dowel shift (2, 3) in
    const coarse = content({ plate: { code: 'GP-3', pitch: 3 }, placements: [rail('A', 2, 3, 0, [0])], sharedOffset: { kind: 'hole', hole: { col: 0, row: 0 } } });
    const d = compare(content({ placements: [rail('A', 2, 3, 0, [0])], sharedOffset: { kind: 'hole', hole: { col: 0, row: 0 } } }), coarse);
    expect(d.placements.moved).toMatchObject([{ id: 'A', dx: 2, dy: 3 }]);
    expect(d.stations.changed).toMatchObject([{ id: 'A:0', dx: 2, dy: 3 }]);
  });
});

describe('layout and naming problems', () => {
  it('an overlap resolved by moving a rail', () => {
    // A at (2,3): x 3.5..12.5; B at (3,3): x 5.5..14.5, same row → overlap; B moved to row 5 clears it
    const d = compare(content({ placements: [rail('A', 2, 3, 0, []), jaw('B', 3, 3)] }), content({ placements: [rail('A', 2, 3, 0, []), jaw('B', 3, 5)] }));
    expect(d.problems.introduced).toEqual([]);
    // On (3, 3) B's clamp face (y 5.625, facing −Y) also lies behind A's jaw (y 6.375, facing +Y): it faced nothing.
    // On (3, 5) its face at y 9.625 looks back at A's jaw from in front.
    expect(d.problems.resolved).toEqual([{
      code: 'overlap', placement: 'B', hole: { col: 3, row: 3 }, otherPlacement: 'A',
      message: 'Placement B (JR-1) on hole (3, 3) overlaps placement A (CR-8) on hole (2, 3).',
    }, {
      code: 'jaw-rail-faces-nothing', placement: 'B', hole: { col: 3, row: 3 },
      message: "Placement B (JR-1) on hole (3, 3) is a jaw rail that faces no fixed jaw, so its clamps would push on nothing; turn it to face a rail's jaw, or remove it.",
    }]);
    expect(d.summary).toContain('; 0 layout problems introduced, 2 resolved.');
  });

  it('an unknown stop introduced', () => {
    const d = compare(content({ placements: [rail('A', 2, 3, 0, [7])] }), content({ placements: [rail('A', 2, 3, 0, [8])] }));
    expect(d.problems.introduced.map((p) => [p.code, p.placement])).toEqual([['stop-out-of-range', 'A'], ['no-stations', undefined]]);
    expect(ids(d.stations.removed)).toEqual(['A:7']);
  });

  it('naming findings come from the callback, matched by key', () => {
    const findings: Record<string, Array<{ key: string; message: string }>> = {
      v1: [{ key: 'layer:A', message: 'Layer "rail a" has a space.' }, { key: 'component:CR-8', message: 'Code CR-8 lacks a size token.' }],
      v2: [{ key: 'component:CR-8', message: 'Code CR-8 lacks a size token.' }, { key: 'layer:B', message: 'Layer "b" is too short.' }],
    };
    const d = compare(content({ name: 'v1' }), content({ name: 'v2' }), { namingProblems: (c) => findings[c.name]! });
    expect(d.naming).toEqual({ introduced: [findings.v2![1]], resolved: [findings.v1![0]] });
    expect(d.summary).toBe('0 placements moved, 0 added, 0 removed; 0 stations changed, 0 added, 0 removed, 0 renumbered; shared offset unchanged; template renamed; 1 naming problem introduced, 1 resolved.');
  });

  it('without a naming check there are no naming problems', () => {
    expect(compare(content({ name: 'v1' }), content({ name: 'v2' })).naming).toEqual({ introduced: [], resolved: [] });
  });
});

describe('a version compared with itself', () => {
  it.each([
    ['the hand-worked layout', content({ placements: [rail('A', 2, 3), rail('B', 10, 1, 90), jaw('J', 2, 4)] })],
    ['a layout with problems', content({ placements: [rail('A', 2, 3), jaw('B', 3, 3), rail('C', 2, 6, 0, [9])] })],
    ['a hand-numbered mm layout', content({ unit: 'mm', placements: [rail('A', 2, 3)], numbering: { order: 'by-hand', manual: ['A:5', 'A:1'] } })],
    ['two bands of rails', railBands(2)],
  ])('%s: nothing changed', (_name, layout) => {
    const stations = evaluateTemplate(layout).stations.length;
    expect(stations).toBeGreaterThan(0);
    // A deep copy, so equality cannot come from comparing an object with itself.
    const d = compare(layout, structuredClone(layout), { namingProblems: (c) => c.placements.map((p) => ({ key: p.id, message: `${p.id} checked` })) });
    expect(d.placements).toEqual({ added: [], removed: [], moved: [], changed: [] });
    expect(d.stations).toEqual({ added: [], removed: [], changed: [], renumbered: [], widthChanged: [], unchanged: stations });
    expect(d.components).toEqual({ added: [], removed: [], changed: [] });
    expect([d.sharedOffset.changed, d.plate.changed, d.template.name.changed, d.template.unit.changed, d.template.numbering.changed]).toEqual([false, false, false, false, false]);
    expect([d.problems, d.naming]).toEqual([{ introduced: [], resolved: [] }, { introduced: [], resolved: [] }]);
    expect(d.summary).toBe('No changes.');
  });
});

describe('evaluations handed in', () => {
  it('are used instead of evaluating again', () => {
    // The "to" evaluation handed in is of a layout with A one hole over; the content says otherwise.
    const before = content({ placements: [rail('A', 2, 3, 0, [0])] });
    const moved = content({ placements: [rail('A', 3, 3, 0, [0])] });
    const d = compare(before, before, { evaluations: { to: evaluateTemplate(moved) } });
    expect(d.stations.changed.map((s) => s.dx)).toEqual([2]); // (3 − 2)·2.000
    expect(d.placements.moved).toEqual([]); // placements come from the content itself
  });
});

describe('helpers', () => {
  it.each([
    // angle change, folded into (−180, 180]
    [0, 0], [90, 90], [180, 180], [-180, 180], [270, -90], [-270, 90], [360, 0], [-90, -90], [450, 90], [179.5, 179.5], [-0, 0],
  ])('signedDegrees(%d) = %d', (deg, expected) => {
    expect(Object.is(signedDegrees(deg), expected)).toBe(true); // Object.is: no −0
  });

  it('keyedDifference counts repeated keys', () => {
    // "a" twice before, once after: one resolved; "c" new; "b" in both
    const r = keyedDifference(['a', 'b', 'a'], ['b', 'c', 'a'], (s) => s);
    expect(r).toEqual({ introduced: ['c'], resolved: ['a'] });
  });

  it('keyedDifference reports the last occurrences of a key as the surplus, so swapping sides swaps the lists', () => {
    const from = [{ k: 'a', n: 1 }, { k: 'b', n: 2 }, { k: 'a', n: 3 }];
    const to = [{ k: 'a', n: 4 }];
    const key = (x: { k: string }) => x.k;
    expect(keyedDifference(from, to, key)).toEqual({ introduced: [], resolved: [{ k: 'b', n: 2 }, { k: 'a', n: 3 }] });
    expect(keyedDifference(to, from, key)).toEqual({ introduced: [{ k: 'b', n: 2 }, { k: 'a', n: 3 }], resolved: [] });
  });
});
