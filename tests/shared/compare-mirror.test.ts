import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { compareVersions } from '../../shared/compare/compare-versions';
import { VersionDiffSchema, type VersionDiff } from '../../shared/schemas/diff';
import type { Placement, Rotation, TemplateContent } from '../../shared/schemas/template';
import { content } from './station-fixtures';

// Swapping the versions must swap the answer: what one direction calls added the other calls
// removed, and every delta changes sign. A half turn stays +180 both ways, by the (−180, 180] rule.

const neg = (v: number) => (v === 0 ? 0 : -v); // no −0, which toEqual tells from 0
const negDeg = (v: number) => (v === 180 ? 180 : neg(v));
const byId = <T extends { id: string }>(list: readonly T[]) => [...list].sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));

/** What compareVersions(b, a) must answer, worked out from compareVersions(a, b) alone. */
function mirrored(d: VersionDiff) {
  return {
    unit: d.unit,
    template: {
      name: { ...d.template.name, from: d.template.name.to, to: d.template.name.from },
      unit: { ...d.template.unit, from: d.template.unit.to, to: d.template.unit.from },
      numbering: { ...d.template.numbering, from: d.template.numbering.to, to: d.template.numbering.from },
    },
    plate: { ...d.plate, from: d.plate.to, to: d.plate.from },
    components: { added: d.components.removed, removed: d.components.added, changed: [...d.components.changed].sort() },
    placements: {
      added: d.placements.removed,
      removed: d.placements.added,
      moved: byId(d.placements.moved.map((m) => ({
        id: m.id, componentFrom: m.componentTo, componentTo: m.componentFrom, from: m.to, to: m.from, dx: neg(m.dx), dy: neg(m.dy), dRotation: negDeg(m.dRotation),
      }))),
      changed: byId(d.placements.changed.map((c) => ({ id: c.id, componentFrom: c.componentTo, componentTo: c.componentFrom, stopsAdded: c.stopsRemoved, stopsRemoved: c.stopsAdded }))),
    },
    stations: {
      added: d.stations.removed,
      removed: d.stations.added,
      changed: byId(d.stations.changed.map((s) => ({
        ...s, number: s.previousNumber, previousNumber: s.number, from: s.to, to: s.from, dx: neg(s.dx), dy: neg(s.dy), dz: neg(s.dz), dc: negDeg(s.dc),
      }))),
      renumbered: byId(d.stations.renumbered.map((r) => ({ id: r.id, from: r.to, to: r.from }))),
      widths: byId(d.stations.widthChanged.map((w) => ({ id: w.id, from: w.to, to: w.from }))),
      unchanged: d.stations.unchanged,
    },
    sharedOffset: {
      ...d.sharedOffset, from: d.sharedOffset.to, to: d.sharedOffset.from, originFrom: d.sharedOffset.originTo, originTo: d.sharedOffset.originFrom,
      dx: neg(d.sharedOffset.dx), dy: neg(d.sharedOffset.dy), dz: neg(d.sharedOffset.dz),
    },
    problems: { introduced: d.problems.resolved, resolved: d.problems.introduced },
    naming: { introduced: d.naming.resolved, resolved: d.naming.introduced },
    noChange: d.summary === 'No changes.',
  };
}

/** The same view of an answer, with the lists whose order follows the `to` version sorted by id. */
function comparable(d: VersionDiff) {
  return {
    unit: d.unit,
    template: d.template,
    plate: d.plate,
    components: { ...d.components, changed: [...d.components.changed].sort() },
    placements: { ...d.placements, moved: byId(d.placements.moved), changed: byId(d.placements.changed) },
    stations: {
      added: d.stations.added,
      removed: d.stations.removed,
      changed: byId(d.stations.changed),
      renumbered: byId(d.stations.renumbered),
      widths: byId(d.stations.widthChanged.map((w) => ({ id: w.id, from: w.from, to: w.to }))),
      unchanged: d.stations.unchanged,
    },
    sharedOffset: d.sharedOffset,
    problems: d.problems,
    naming: d.naming,
    noChange: d.summary === 'No changes.',
  };
}

// ---- versions drawn at random on the 16 × 10 hole, 2.000 in test plate ----
const IDS = ['A', 'B', 'C', 'D', 'E', 'F'];
const stop = { code: 'ST-1', kind: 'stop' as const, unit: 'in' as const, dowels: [{ x: 0, y: 0 }], stops: [{ x: 0.25, y: 0, angle: 45 }] };

const arbPlacement = (id: string): fc.Arbitrary<Placement> => fc.record({
  id: fc.constant(id),
  component: fc.constantFrom('CR-8', 'JR-1', 'ST-1'),
  // a few holes off the plate too, so refusals come and go between versions
  hole: fc.record({ col: fc.integer({ min: 0, max: 16 }), row: fc.integer({ min: 0, max: 10 }) }),
  rotation: fc.constantFrom<Rotation>(0, 90, 180, 270),
  stopsInUse: fc.subarray([0, 1, 2, 3, 4, 5, 6, 7]),
});

const arbOffset: fc.Arbitrary<TemplateContent['sharedOffset']> = fc.oneof(
  fc.record({ kind: fc.constant('hole' as const), hole: fc.record({ col: fc.integer({ min: 0, max: 15 }), row: fc.integer({ min: 0, max: 9 }) }) }),
  fc.constant({ kind: 'center' as const }),
  fc.record({ kind: fc.constant('point' as const), x: fc.integer({ min: 0, max: 60 }).map((v) => v / 2), y: fc.integer({ min: 0, max: 36 }).map((v) => v / 2), z: fc.constantFrom(0, 0.25) }),
);

const arbNumbering: fc.Arbitrary<TemplateContent['numbering']> = fc.oneof(
  fc.record({ order: fc.constantFrom('row-by-row' as const, 'serpentine' as const, 'by-rail' as const) }),
  fc.record({ order: fc.constant('by-hand' as const), manual: fc.subarray(['A:0', 'A:1', 'B:0', 'C:3', 'D:7', 'E:0', 'F:2']) }),
);

interface Draw { name: string; pitch: number; placements: Placement[]; sharedOffset: TemplateContent['sharedOffset']; numbering: TemplateContent['numbering'] }

const build = (unit: 'in' | 'mm', d: Draw) => content({
  name: d.name, unit, plate: { pitch: d.pitch, code: d.pitch === 2 ? 'GP-16x10' : 'GP-15' }, placements: d.placements,
  sharedOffset: d.sharedOffset, numbering: d.numbering, components: [...content().components, stop],
});

const arbDraw: fc.Arbitrary<Draw> = fc.record({
  name: fc.constantFrom('Vise row', 'Vise row, rev B'),
  pitch: fc.constantFrom(2, 2, 2, 1.5), // mostly one grid; sometimes another plate
  placements: fc.subarray(IDS).chain((ids) => (ids.length ? fc.tuple(...ids.map(arbPlacement)) : fc.constant([] as Placement[]))),
  sharedOffset: arbOffset,
  numbering: arbNumbering,
});

/** `keep` most of the time, so the second version is an edit of the first and stations can stay put. */
const mostly = <T,>(keep: T, other: fc.Arbitrary<T>) => fc.oneof({ weight: 3, arbitrary: fc.constant(keep) }, { weight: 1, arbitrary: other });

/** A later version: some placements moved, turned, re-stopped, swapped or dropped, some added; maybe a new offset, numbering or plate. */
const arbEdit = (a: Draw): fc.Arbitrary<Draw> => fc.record({
  name: mostly(a.name, fc.constant(`${a.name} (edited)`)),
  pitch: mostly(a.pitch, fc.constantFrom(2, 1.5)),
  kept: fc.tuple(...a.placements.map((p) => fc.oneof(
    { weight: 4, arbitrary: fc.constant<Placement | null>(p) },
    { weight: 1, arbitrary: fc.record({ col: fc.integer({ min: -1, max: 1 }), row: fc.integer({ min: -1, max: 1 }) }).map((d) => ({ ...p, hole: { col: p.hole.col + d.col, row: p.hole.row + d.row } })) },
    { weight: 1, arbitrary: fc.constantFrom<Rotation>(0, 90, 180, 270).map((rotation) => ({ ...p, rotation })) },
    { weight: 1, arbitrary: fc.subarray([0, 1, 2, 3, 4, 5, 6, 7]).map((stopsInUse) => ({ ...p, stopsInUse })) },
    { weight: 1, arbitrary: fc.constantFrom('CR-8', 'JR-1', 'ST-1').map((component) => ({ ...p, component })) },
    { weight: 1, arbitrary: fc.constant(null) },
  ))),
  added: fc.constant(IDS.filter((id) => !a.placements.some((p) => p.id === id))).chain((free) => fc.subarray(free, { maxLength: Math.min(2, free.length) })).chain((ids) => (ids.length ? fc.tuple(...ids.map(arbPlacement)) : fc.constant([] as Placement[]))),
  sharedOffset: mostly(a.sharedOffset, arbOffset),
  numbering: mostly(a.numbering, arbNumbering),
}).map(({ kept, added, ...rest }) => ({ ...rest, placements: [...(kept as Array<Placement | null>).filter((p): p is Placement => p !== null), ...added] }));

// A stand-in naming check: a finding for every jaw rail placement, keyed by placement id.
const namingProblems = (c: TemplateContent) =>
  c.placements.filter((p) => p.component === 'JR-1').map((p) => ({ key: `layer:${p.id}`, message: `Layer of jaw rail ${p.id} is not named.` }));

// Half the pairs are an edit and its original, half two unrelated versions; both in one unit,
// because deltas are reported in the later version's unit and a unit change is not symmetric.
const arbPair = fc.record({
  unit: fc.constantFrom<'in' | 'mm'>('in', 'mm'),
  pair: arbDraw.chain((a) => fc.tuple(fc.constant(a), fc.oneof(arbEdit(a), arbDraw))),
}).map(({ unit, pair: [a, b] }) => [build(unit, a), build(unit, b)] as const);

describe('comparing b with a mirrors comparing a with b', () => {
  it('swaps added and removed, from and to, and negates every delta', () => {
    fc.assert(
      fc.property(arbPair, ([a, b]) => {
        const ab = VersionDiffSchema.parse(compareVersions(a, b, { namingProblems }));
        const ba = VersionDiffSchema.parse(compareVersions(b, a, { namingProblems }));
        expect(comparable(ba)).toEqual(mirrored(ab));
      }),
      { numRuns: 300 },
    );
  });

  it('the generator does reach every kind of change', () => {
    // Guards the property above against a generator that only ever draws identical pairs.
    const seen = new Set<string>();
    fc.assert(
      fc.property(arbPair, ([a, b]) => {
        const d = compareVersions(a, b, { namingProblems });
        if (d.placements.moved.length) seen.add('moved');
        if (d.placements.added.length) seen.add('added');
        if (d.stations.changed.some((s) => s.dc !== 0)) seen.add('turned');
        if (d.stations.changed.some((s) => s.dc === 180)) seen.add('half turn');
        if (d.stations.renumbered.length) seen.add('renumbered');
        if (d.stations.widthChanged.length) seen.add('width');
        if (d.sharedOffset.moved) seen.add('offset');
        if (d.problems.introduced.length) seen.add('problem');
        if (d.naming.introduced.length) seen.add('naming');
        if (d.plate.changed) seen.add('plate');
      }),
      { numRuns: 300, seed: 20240611 },
    );
    expect([...seen].sort()).toEqual(['added', 'half turn', 'moved', 'naming', 'offset', 'plate', 'problem', 'renumbered', 'turned', 'width']);
  });
});
