import type { Hole, Pairing, Placement, Problem, Station, TemplateContent } from '../schemas/template';
import { GRID_TOLERANCE, convert, formatLength } from '../units/units';
import { applyTransform, isGridRotation, normalizeDegrees, placementTransform } from '../geometry/transform';
import { LIMITS } from '../schemas/limits';
import { boxOfPoints, createBoxIndex, footprintsOverlap, overlappingBoxPairs, type Box, type Polygon } from '../geometry/outline';
import { CLAMPED_KINDS, clampPath, holdingProblems, stopFacesOut, type FacedJaw } from './holding-checks';
import { orderStations } from './numbering';
import { pairingTable } from './pairing-table';
import { createClampFinder, lateralSpan, type ClampFace, type ClampMatch, type FixedFace } from './nominal-width';

export interface EvaluateOptions {
  /** How far a dowel may sit from a hole center, in the plate's unit. GRID_TOLERANCE of the plate's unit by default. */
  gridTolerance?: number;
  /** Touching is not overlapping, and flush is not off the plate, up to this much (plate unit). */
  slack?: number;
  /** Arcs are flattened to chords within this (plate unit). A tenth of the grid tolerance by default. */
  chordTolerance?: number;
  /** Height of a numbering row band, in the template's unit. A quarter pitch by default. */
  rowTolerance?: number;
}

export interface TemplateEvaluation {
  /** Every station of every placement whose component and rotation are known, in numbering order. */
  stations: Station[];
  /** Empty when the layout can be released; otherwise each names the placement, dowel, hole or stop at fault. */
  problems: Problem[];
  /** Which jaw rail holds which width against which fixed face. */
  pairings: Pairing[];
  /** The shared offset origin in plate coordinates, in the template's unit; datum = origin + translation. */
  origin: { x: number; y: number; z: number };
  /** Placements whose component has no closed outline: checked for shared holes, not for overlap. */
  notOverlapChecked: string[];
}
import { FIXED_KINDS, holeText, originOf, prepare, transformBox, who, type Placed, type PreparedComponent } from './placed-components';

interface Draft {
  id: string;
  placement: Placed;
  placementId: string;
  componentCode: string;
  stop: number;
  /** Translation, template unit. */
  x: number;
  y: number;
  /** Plate unit until the stations are written. */
  z: number;
  c: number;
  sequence: number;
  /** Index of the fixed jaw face the stop sits against, when there is one. */
  face: number;
  match: ClampMatch | null;
  /** On a rail held by clamps, with a fixed face to hold against. */
  clamped: boolean;
  /** The placement whose outline lies between the fixed face and the nearest facing clamp. */
  blockedBy?: string;
  /** False when the stop's angle does not face out of its jaw face. */
  facesOut: boolean;
  stopAngle: number;
  faceNormal: number | null;
}

/**
 * Lays a template out on its plate: checks every placement, and derives the numbered stations,
 * their translations from the shared offset, the width each holds, and the pairing table.
 *
 * Computed in the plate's unit (the grid is exact there); stations, widths and origin are
 * reported in the template's unit. Stations of a placement that has problems are still
 * reported so the layout can be shown; a template with any problem must not be released.
 */
export function evaluateTemplate(content: TemplateContent, options: EvaluateOptions = {}): TemplateEvaluation {
  const { plate } = content;
  const pu = plate.unit;
  const tu = content.unit;
  const pitch = plate.pitch;
  const tolerance = options.gridTolerance ?? GRID_TOLERANCE[pu];
  const slack = options.slack ?? 1e-6;
  const chordTolerance = options.chordTolerance ?? GRID_TOLERANCE[pu] / 10;
  const rowTolerance = options.rowTolerance ?? convert(pitch / 4, pu, tu);
  const margin = plate.edgeMargin ?? pitch / 2;
  const lastCol = plate.columns - 1;
  const lastRow = plate.rows - 1;
  const plateBox: Box = { minX: -margin, minY: -margin, maxX: lastCol * pitch + margin, maxY: lastRow * pitch + margin };
  const onPlate = (h: Hole) => h.col >= 0 && h.row >= 0 && h.col <= lastCol && h.row <= lastRow;
  const problems: Problem[] = [];
  const len = (v: number) => formatLength(v, pu);

  // ---- the catalog carried in the template ----
  const components = new Map<string, PreparedComponent>();
  for (const c of content.components) {
    if (components.has(c.code)) {
      problems.push({ code: 'duplicate-component-code', message: `Component code ${c.code} appears more than once in the template's component list; the first is used.` });
      continue;
    }
    components.set(c.code, prepare(c, pu, chordTolerance));
  }

  // ---- the shared offset ----
  const origin = originOf(content);
  const so = content.sharedOffset;
  if (so.kind === 'hole' && !onPlate(so.hole)) {
    problems.push({ code: 'shared-offset-off-plate', hole: so.hole, message: `The shared offset sits on ${holeText(so.hole)}, which is off the plate (holes run from (0, 0) to (${lastCol}, ${lastRow})).` });
  } else if (so.kind === 'point' && (origin.x < plateBox.minX - slack || origin.x > plateBox.maxX + slack || origin.y < plateBox.minY - slack || origin.y > plateBox.maxY + slack)) {
    problems.push({ code: 'shared-offset-off-plate', message: `The shared offset point (${formatLength(so.x, tu)}, ${formatLength(so.y, tu)}) lies off the plate.` });
  }

  // ---- each placement on its own ----
  const seenIds = new Set<string>();
  const holeOwner = new Map<number, { placement: Placement; dowel: number }>();
  const holeKey = (h: Hole) => h.col * 1_000_003 + h.row;
  const placed: Placed[] = [];
  content.placements.forEach((placement, index) => {
    if (seenIds.has(placement.id)) {
      problems.push({ code: 'duplicate-placement-id', placement: placement.id, message: `Placement id ${placement.id} is used more than once; ids must be unique because stations are named after them.` });
      return;
    }
    seenIds.add(placement.id);
    const component = components.get(placement.component);
    if (!component) {
      problems.push({ code: 'unknown-component', placement: placement.id, message: `Placement ${placement.id} names component ${placement.component}, which is not in the template's component list.` });
      return;
    }
    if (!isGridRotation(placement.rotation)) {
      problems.push({ code: 'bad-rotation', placement: placement.id, message: `${who(placement)} is turned ${placement.rotation}°; a pinned component can only be turned 0, 90, 180 or 270°.` });
      return;
    }
    const transform = placementTransform(placement.hole, placement.rotation, pitch);

    component.geometry.dowels.forEach((local, dowel) => {
      const p = applyTransform(transform, local);
      const hole = { col: Math.round(p.x / pitch), row: Math.round(p.y / pitch) };
      const off = Math.hypot(p.x - hole.col * pitch, p.y - hole.row * pitch);
      if (off > tolerance) {
        problems.push({
          code: 'dowel-off-grid', placement: placement.id, dowel, hole,
          message: `${who(placement)} dowel ${dowel + 1} lands ${len(off)} from ${holeText(hole)}; every dowel must sit within ${len(tolerance)} of a grid hole.`,
        });
        return;
      }
      if (!onPlate(hole)) {
        problems.push({
          code: 'dowel-off-plate', placement: placement.id, dowel, hole,
          message: `${who(placement)} dowel ${dowel + 1} lands on ${holeText(hole)}, which is off the plate (holes run from (0, 0) to (${lastCol}, ${lastRow})).`,
        });
        return;
      }
      // Two pins cannot share a bushing, outline or not.
      const owner = holeOwner.get(holeKey(hole));
      if (owner) {
        problems.push({
          code: 'hole-taken', placement: placement.id, dowel, hole, otherPlacement: owner.placement.id,
          message: `${who(placement)} dowel ${dowel + 1} needs ${holeText(hole)}, which already holds dowel ${owner.dowel + 1} of placement ${owner.placement.id} (${owner.placement.component}).`,
        });
      } else {
        holeOwner.set(holeKey(hole), { placement, dowel });
      }
    });

    const extent = transformBox(transform, component.extent);
    const overhang: Array<[string, number]> = [
      ['−X', plateBox.minX - extent.minX],
      ['+X', extent.maxX - plateBox.maxX],
      ['−Y', plateBox.minY - extent.minY],
      ['+Y', extent.maxY - plateBox.maxY],
    ];
    const [side, worst] = overhang.reduce((a, b) => (b[1] > a[1] ? b : a));
    if (worst > slack) {
      problems.push({
        code: 'off-plate', placement: placement.id, hole: placement.hole,
        message: `${who(placement)} on ${holeText(placement.hole)} reaches ${len(worst)} past the plate's ${side} edge, which lies ${len(margin)} beyond the outer holes.`,
      });
    }

    placed.push({ index, placement, component, transform, extent });
  });

  // ---- overlaps: a grid of cells finds the neighbours; outlines are moved onto the plate only for them ----
  const onPlateFootprint = new Map<Placed, Polygon[]>();
  const footprintOf = (p: Placed) => {
    let fp = onPlateFootprint.get(p);
    if (!fp) {
      fp = p.component.footprint!.map((poly) => poly.map((v) => applyTransform(p.transform, v)));
      onPlateFootprint.set(p, fp);
    }
    return fp;
  };
  const solid = placed.filter((p) => p.component.footprint);
  // The edge tests of each pair are counted before it is checked; once LIMITS.overlapEdgeTests is
  // spent, the remaining pairs count as overlapping when their boxes do (the safe side).
  const edges = (p: Placed) => p.component.footprint!.reduce((n, poly) => n + poly.length, 0);
  let edgeBudget = LIMITS.overlapEdgeTests;
  const overlapping = overlappingBoxPairs(solid.map((p) => p.extent), slack, LIMITS.overlapPairs)
    .map(([i, j]) => ({ a: solid[i]!, b: solid[j]! }))
    .filter(({ a, b }) => {
      edgeBudget -= edges(a) * edges(b);
      return edgeBudget < 0 || footprintsOverlap(footprintOf(a), footprintOf(b), slack);
    })
    .map(({ a, b }) => (a.index > b.index ? { later: a, earlier: b } : { later: b, earlier: a }))
    .sort((x, y) => x.later.index - y.later.index || x.earlier.index - y.earlier.index);
  for (const { later, earlier } of overlapping) {
    problems.push({
      code: 'overlap', placement: later.placement.id, hole: later.placement.hole, otherPlacement: earlier.placement.id,
      message: `${who(later.placement)} on ${holeText(later.placement.hole)} overlaps placement ${earlier.placement.id} (${earlier.placement.component}) on ${holeText(earlier.placement.hole)}.`,
    });
  }
  const notOverlapChecked = placed.filter((p) => !p.component.footprint).map((p) => p.placement.id);

  // ---- clamp faces of the jaw rails ----
  // A rail clamps along its whole length: its reach along a face is its extent's.
  const clamps: ClampFace[] = [];
  for (const p of placed) {
    if (p.component.kind !== 'jaw-rail') continue;
    const e = p.extent;
    const reach = [{ x: e.minX, y: e.minY }, { x: e.maxX, y: e.minY }, { x: e.minX, y: e.maxY }, { x: e.maxX, y: e.maxY }];
    p.component.geometry.jawFaces.forEach((face, index) => {
      const at = applyTransform(p.transform, face);
      const normal = normalizeDegrees(face.normal + p.transform.degrees);
      const lateral = lateralSpan(reach, normal);
      clamps.push({ placement: p.placement.id, component: p.component.code, hole: p.placement.hole, face: index, x: at.x, y: at.y, normal, lateralMin: lateral.min, lateralMax: lateral.max });
    });
  }
  const findClamp = createClampFinder(clamps, pitch, slack);
  const clampsOf = new Map<string, ClampFace[]>();
  for (const c of clamps) (clampsOf.get(c.placement) ?? clampsOf.set(c.placement, []).get(c.placement)!).push(c);

  // ---- stations ----
  const drafts: Draft[] = [];
  const facedJaws: FacedJaw[] = [];
  for (const p of placed) {
    const { placement, component, transform: t } = p;
    const stops = component.geometry.stops;
    const used = new Set<number>();
    const fixedFaces: Array<FixedFace | undefined> = FIXED_KINDS.has(component.kind)
      ? component.geometry.jawFaces.map((f) => ({ ...applyTransform(t, f), normal: normalizeDegrees(f.normal + t.degrees) }))
      : [];
    for (const f of fixedFaces) if (f) facedJaws.push({ ...f, extent: p.extent });
    // Stop index order, i.e. along the rail, whatever order the stops were ticked in.
    for (const stopIndex of [...placement.stopsInUse].sort((a, b) => a - b)) {
      const stop = Number.isInteger(stopIndex) ? stops[stopIndex] : undefined;
      if (!stop) {
        problems.push({
          code: 'stop-out-of-range', placement: placement.id, stop: stopIndex,
          message: stops.length
            ? `${who(placement)} uses stop ${stopIndex + 1}, but ${component.code} has ${stops.length} stop${stops.length === 1 ? '' : 's'} (1–${stops.length}).`
            : `${who(placement)} uses stop ${stopIndex + 1}, but ${component.code} has no stops.`,
        });
        continue;
      }
      if (used.has(stopIndex)) {
        problems.push({ code: 'duplicate-stop', placement: placement.id, stop: stopIndex, message: `${who(placement)} lists stop ${stopIndex + 1} more than once; it makes one station.` });
        continue;
      }
      used.add(stopIndex);
      // datum = hole + R(θ)·stop, written out: this loop runs once per station
      const dx = t.tx + t.cos * stop.x - t.sin * stop.y;
      const dy = t.ty + t.sin * stop.x + t.cos * stop.y;
      const face = stop.face ?? 0;
      const fixed = fixedFaces[face];
      const localFace = FIXED_KINDS.has(component.kind) ? component.geometry.jawFaces[face] : undefined;
      drafts.push({
        id: `${placement.id}:${stopIndex}`,
        placement: p,
        placementId: placement.id,
        componentCode: component.code,
        stop: stopIndex,
        x: convert(dx - origin.x, pu, tu),
        y: convert(dy - origin.y, pu, tu),
        // Z is the part's seat (a stop's own z where it has one) above the shared offset's Z0.
        z: (stop.z ?? component.seatHeight) - origin.z,
        c: normalizeDegrees(t.degrees + (stop.angle ?? 0)),
        sequence: drafts.length,
        face,
        match: fixed ? findClamp(fixed, dx, dy) : null,
        clamped: CLAMPED_KINDS.has(component.kind) && !!fixed,
        facesOut: localFace ? stopFacesOut(stop.angle ?? 0, localFace.normal) : true,
        stopAngle: stop.angle ?? 0,
        faceNormal: localFace?.normal ?? null,
      });
    }
  }

  // ---- nothing between a fixed jaw and its clamp: the search stops at any outline in between ----
  // Checked once per fixed face and clamp face over all their stops, then station by station only where that strip is blocked.
  const byId = new Map(placed.map((p) => [p.placement.id, p]));
  const solidIndex = createBoxIndex(solid.map((p) => p.extent));
  let pathBudget = LIMITS.overlapEdgeTests;
  const blocker = (group: readonly Draft[]): string | null => {
    const d = group[0]!;
    const fixedFace = d.placement.component.geometry.jawFaces[d.face]!;
    const normal = normalizeDegrees(fixedFace.normal + d.placement.transform.degrees);
    const stops = group.map((g) => ({ x: convert(g.x, tu, pu) + origin.x, y: convert(g.y, tu, pu) + origin.y }));
    const path = clampPath(stops, normal, d.match!.width, pitch);
    for (const i of solidIndex(boxOfPoints(path), slack)) {
      const other = solid[i]!;
      if (other === d.placement || other === byId.get(d.match!.clamp.placement)) continue;
      pathBudget -= 4 * other.component.footprint!.reduce((n, poly) => n + poly.length, 0);
      // Past the budget an unchecked path counts as blocked: the safe side.
      if (pathBudget < 0 || footprintsOverlap([path], footprintOf(other), slack)) return other.placement.id;
    }
    return null;
  };
  // Grouped by clamp face (one object per face), then by the fixed placement and face it holds against.
  const byClamp = new Map<ClampFace, Draft[][]>();
  for (const d of drafts) {
    if (!d.match) continue;
    const groups = byClamp.get(d.match.clamp) ?? byClamp.set(d.match.clamp, []).get(d.match.clamp)!;
    const group = groups.find((g) => g[0]!.placement === d.placement && g[0]!.face === d.face);
    if (group) group.push(d);
    else groups.push([d]);
  }
  for (const group of [...byClamp.values()].flat()) {
    if (!blocker(group)) continue;
    for (const d of group) {
      const b = blocker([d]);
      if (b) {
        d.blockedBy = b;
        d.match = null;
      }
    }
  }

  const { ordered, problems: numberingProblems } = orderStations(drafts, content.numbering ?? { order: 'row-by-row' }, rowTolerance);
  problems.push(...numberingProblems);
  problems.push(...holdingProblems(
    ordered,
    placed.filter((p) => p.component.kind === 'jaw-rail').map((p) => ({
      placement: p.placement, component: p.component.code, clampCloses: p.component.clampCloses,
      faces: clampsOf.get(p.placement.id) ?? [],
    })),
    facedJaws, slack, pu,
  ));

  const stations: Station[] = ordered.map((d, i) => ({
    id: d.id,
    number: i + 1,
    placement: d.placement.placement.id,
    stop: d.stop,
    x: d.x,
    y: d.y,
    z: convert(d.z, pu, tu),
    c: d.c,
    nominalWidth: d.match ? convert(d.match.width, pu, tu) : null,
  }));

  return {
    stations,
    problems,
    pairings: pairingTable(ordered, tu, pu),
    origin: { x: convert(origin.x, pu, tu), y: convert(origin.y, pu, tu), z: convert(origin.z, pu, tu) },
    notOverlapChecked,
  };
}
