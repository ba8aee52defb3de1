// A template turned into what the plate drawing paints: path strings, positions and the words a
// screen reader hears. Pure (no React), built once per content and memoized by the component.
import type { Point, Unit } from '../../../../shared/schemas/common';
import type { Hole, Problem, ProblemCode, Station, TemplateComponent, TemplateContent } from '../../../../shared/schemas/template';
import { componentGeometryIn } from '../../../../shared/geometry/component-geometry';
import { placementTransform } from '../../../../shared/geometry/transform';
import { boxOfPoints, outlineBounds } from '../../../../shared/geometry/outline';
import { convert, formatLength, formatNumber } from '../../../../shared/units/units';
import {
  boxPathData,
  circlePathData,
  crossesPathData,
  nearestHole,
  outlineData,
  plateEdgeBox,
  polylinePathData,
  transformAttr,
  transformedBox,
  unionBox,
  type Box,
} from './plate-drawing-geometry';

/** A component's drawing in its own local frame (primary dowel at the origin), in the drawing unit. */
export interface ComponentShape {
  /** Closed paths and circles: filled, even-odd. */
  fill: string;
  /** Open paths, and the dowels of a component drawn as a box: stroked only. */
  lines: string;
  local: Box;
  /** False when the catalog gave no outline and a box around the dowels and stops stands in. */
  outlined: boolean;
}

export interface DrawnPlacement {
  /** Unique even when ids repeat (a problem the drawing must still show). */
  key: string;
  id: string;
  code: string;
  /** False when the component is not in the template's component list. */
  known: boolean;
  hole: Hole;
  rotation: number;
  transform: string;
  shape: ComponentShape;
  /** On the plate. */
  bounds: Box;
  /** The primary dowel on the plate: the point a comparison arrow starts or ends at. */
  primary: Point;
  labelAt: Point;
  labelSize: number;
  /** Runs along plate Y when the placed component is much taller than wide. */
  labelVertical: boolean;
  title: string;
}

/** Sizes of symbols, in the drawing unit: fractions of the pitch, so a drawing looks alike on any plate. */
export interface SymbolSizes {
  code: number;
  tag: number;
  cross: number;
  arm: number;
  arrowHead: number;
  pad: number;
  text: number;
}

export interface PlateScene {
  unit: Unit;
  pitch: number;
  columns: number;
  rows: number;
  edge: Box;
  holeRadius: number;
  placements: DrawnPlacement[];
  /** The first placement of each id. */
  byId: ReadonlyMap<string, DrawnPlacement>;
  /** The plate and everything drawn on it, even what hangs off it. */
  extent: Box;
  sizes: SymbolSizes;
}

export const symbolSizes = (pitch: number): SymbolSizes => ({
  code: pitch * 0.2,
  tag: pitch * 0.12,
  cross: pitch * 0.07,
  arm: pitch * 0.6,
  arrowHead: pitch * 0.25,
  pad: pitch * 0.15,
  text: pitch * 0.18,
});

const kindWords = (kind: string) => kind.replace(/-/g, ' ');

/**
 * A component's local drawing. Without an outline, a box a little larger than its dowels, stops
 * and jaw faces, with the dowels as circles, stands in so it can still be seen and clicked.
 * An unknown component gets a small box on its hole.
 */
export function componentShape(component: TemplateComponent | undefined, unit: Unit, pad: number): ComponentShape {
  if (!component) {
    const local = { minX: -2 * pad, minY: -2 * pad, maxX: 2 * pad, maxY: 2 * pad };
    return { fill: boxPathData(local), lines: '', local, outlined: false };
  }
  const g = componentGeometryIn(component, unit);
  if (g.outline && (g.outline.paths.length > 0 || g.outline.circles.length > 0)) {
    const { fill, lines } = outlineData(g.outline);
    return { fill, lines, local: outlineBounds(g.outline), outlined: true };
  }
  const b = boxOfPoints([...g.dowels, ...g.stops, ...g.jawFaces]);
  const local = { minX: b.minX - pad, minY: b.minY - pad, maxX: b.maxX + pad, maxY: b.maxY + pad };
  return { fill: boxPathData(local), lines: g.dowels.map((d) => circlePathData(d.x, d.y, pad / 2)).join(''), local, outlined: false };
}

/**
 * The plate and its placements in `unit` (the plate's own unit by default; a comparison draws the
 * older version in the newer one's unit). Component path strings are built once per component
 * code and shared by all its placements through the transform attribute.
 */
export function buildPlateScene(content: TemplateContent, unit: Unit = content.plate.unit): PlateScene {
  const { plate } = content;
  const len = (v: number) => convert(v, plate.unit, unit);
  const pitch = len(plate.pitch);
  const sizes = symbolSizes(pitch);
  const grid = { pitch, columns: plate.columns, rows: plate.rows, ...(plate.edgeMargin === undefined ? {} : { edgeMargin: len(plate.edgeMargin) }) };
  const edge = plateEdgeBox(grid);
  const catalog = new Map<string, TemplateComponent>();
  for (const c of content.components) if (!catalog.has(c.code)) catalog.set(c.code, c);
  const shapes = new Map<string, ComponentShape>();
  const byId = new Map<string, DrawnPlacement>();
  let extent = edge;
  const placements = content.placements.map((p, index): DrawnPlacement => {
    const component = catalog.get(p.component);
    let shape = shapes.get(p.component);
    if (!shape) {
      shape = componentShape(component, unit, sizes.pad);
      shapes.set(p.component, shape);
    }
    const t = placementTransform(p.hole, p.rotation, pitch);
    const bounds = transformedBox(t, shape.local);
    extent = unionBox(extent, bounds);
    const w = bounds.maxX - bounds.minX;
    const h = bounds.maxY - bounds.minY;
    const labelVertical = h > w * 1.5;
    const across = labelVertical ? w : h;
    const where = `on hole (${p.hole.col}, ${p.hole.row}), turned ${p.rotation}°`;
    const title = component
      ? `${p.component}, ${kindWords(component.kind)}: placement ${p.id} ${where}${shape.outlined ? '' : '; drawn as a box around its dowels, the catalog has no outline for it'}`
      : `Placement ${p.id} ${where}: component ${p.component} is not in the template's component list`;
    const drawn: DrawnPlacement = {
      key: `${index}:${p.id}`,
      id: p.id,
      code: p.component,
      known: !!component,
      hole: p.hole,
      rotation: p.rotation,
      transform: transformAttr(t),
      shape,
      bounds,
      primary: { x: t.tx, y: t.ty },
      labelAt: { x: (bounds.minX + bounds.maxX) / 2, y: (bounds.minY + bounds.maxY) / 2 },
      labelSize: Math.max(Math.min(sizes.code, across * 0.6), sizes.code * 0.4),
      labelVertical,
      title,
    };
    if (!byId.has(p.id)) byId.set(p.id, drawn);
    return drawn;
  });
  const holeRadius = plate.holeDiameter ? len(plate.holeDiameter) / 2 : pitch * 0.125;
  return { unit, pitch, columns: plate.columns, rows: plate.rows, edge, holeRadius, placements, byId, extent, sizes };
}

// ---------- stations and the shared offset ----------

export interface DrawnStation {
  id: string;
  number: number;
  placement: string;
  /** On the plate, in the drawing unit: shared offset origin + translation. */
  datum: Point;
  title: string;
}

export interface StationScene {
  stations: DrawnStation[];
  /** The shared offset origin on the plate, in the drawing unit. */
  origin: Point;
  offsetName: string;
  /** The machining order: station datums joined in number order. */
  order: string;
  crosses: string;
}

export const offsetNameOf = (content: TemplateContent) => content.sharedOffset.name?.trim() || 'shared offset';

/**
 * Stations on the plate. Translations and the origin come from evaluateTemplate in the template's
 * unit (datum = origin + translation, as shared/stations/evaluate-template.ts computes it); they are converted to the
 * drawing unit here, and the words are in the display unit.
 */
export function buildStationScene(
  content: TemplateContent,
  stations: readonly Station[],
  origin: { x: number; y: number },
  unit: Unit,
  displayUnit: Unit,
  crossHalf: number,
): StationScene {
  const tu = content.unit;
  const offsetName = offsetNameOf(content);
  const shown = (v: number) => formatLength(convert(v, tu, displayUnit), displayUnit);
  const drawn = [...stations]
    .sort((a, b) => a.number - b.number)
    .map((s): DrawnStation => ({
      id: s.id,
      number: s.number,
      placement: s.placement,
      datum: { x: convert(origin.x + s.x, tu, unit), y: convert(origin.y + s.y, tu, unit) },
      title:
        `Station ${s.number} (${s.id}): X ${shown(s.x)}, Y ${shown(s.y)} from the ${offsetName}, C ${formatNumber(s.c, 'mm')}°` +
        (s.nominalWidth === null ? '' : `, holds ${shown(s.nominalWidth)}`),
    }));
  const datums = drawn.map((s) => s.datum);
  return {
    stations: drawn,
    origin: { x: convert(origin.x, tu, unit), y: convert(origin.y, tu, unit) },
    offsetName,
    order: polylinePathData(datums),
    crosses: crossesPathData(datums, crossHalf),
  };
}

// ---------- comparison ----------

export interface PlacementMove {
  id: string;
  code: string;
  /** Primary dowel in the older version and in the newer one. */
  from: Point;
  to: Point;
}

export interface PlacementChanges {
  moved: PlacementMove[];
  /** Same hole, other rotation. */
  turned: string[];
  added: string[];
  removed: string[];
}

/**
 * What changed between two versions, placement by placement, matched by placement id (ids are
 * stable across versions). Both scenes must be in the same drawing unit.
 */
export function comparePlacements(older: PlateScene, newer: PlateScene): PlacementChanges {
  const tolerance = newer.pitch * 1e-6;
  const out: PlacementChanges = { moved: [], turned: [], added: [], removed: [] };
  for (const [id, now] of newer.byId) {
    const was = older.byId.get(id);
    if (!was) {
      out.added.push(id);
      continue;
    }
    if (Math.hypot(now.primary.x - was.primary.x, now.primary.y - was.primary.y) > tolerance) {
      out.moved.push({ id, code: now.code, from: was.primary, to: now.primary });
    } else if (now.rotation !== was.rotation) {
      out.turned.push(id);
    }
  }
  for (const id of older.byId.keys()) if (!newer.byId.has(id)) out.removed.push(id);
  return out;
}

// ---------- problems ----------

/** Short words for a problem on the drawing; the full message goes in the title. */
const PROBLEM_WORDS: Record<ProblemCode, string> = {
  'duplicate-placement-id': 'id used twice',
  'duplicate-component-code': 'component code used twice',
  'unknown-component': 'unknown component',
  'bad-rotation': 'bad rotation',
  'dowel-off-grid': 'dowel off the grid',
  'dowel-off-plate': 'dowel off the plate',
  'hole-taken': 'hole taken',
  'off-plate': 'off the plate',
  overlap: 'overlaps',
  'stop-out-of-range': 'no such stop',
  'duplicate-stop': 'stop listed twice',
  'shared-offset-off-plate': 'shared offset off the plate',
  'numbering-unknown-station': 'numbering names an unknown station',
  'numbering-duplicate-station': 'numbering lists a station twice',
  'no-stations': 'no stations',
  'no-facing-clamp': 'no clamp holds a station',
  'jaw-rail-faces-nothing': 'faces no jaw',
  'stop-faces-away': 'stop faces into the jaw',
};

/** The short words for a problem code, as the drawing labels it. */
export const problemWords = (code: ProblemCode): string => PROBLEM_WORDS[code] ?? code;

export interface PlacementFault {
  id: string;
  /** E.g. "P3: overlaps P2, hole taken". */
  label: string;
  messages: string[];
}

export type FaultInput = Pick<Problem, 'code' | 'message' | 'placement' | 'otherPlacement'>;

/**
 * Problems grouped by the placement at fault. Either evaluateTemplate's problems (words and
 * messages are taken from them) or bare placement ids. Problems that name no placement (the
 * shared offset, numbering) are not drawn here; the editor lists them.
 */
export function faultsByPlacement(problems: readonly (FaultInput | string)[]): Map<string, PlacementFault> {
  const words = new Map<string, string[]>();
  const out = new Map<string, PlacementFault>();
  for (const p of problems) {
    const id = typeof p === 'string' ? p : p.placement;
    if (!id) continue;
    let list = words.get(id);
    let fault = out.get(id);
    if (!list || !fault) {
      list = [];
      fault = { id, label: id, messages: [] };
      words.set(id, list);
      out.set(id, fault);
    }
    if (typeof p === 'string') continue;
    const base = PROBLEM_WORDS[p.code] ?? p.code;
    const word = !p.otherPlacement ? base
      : p.code === 'overlap' ? `overlaps ${p.otherPlacement}`
      : p.code === 'hole-taken' ? `hole taken by ${p.otherPlacement}`
      : base;
    if (!list.includes(word)) list.push(word);
    fault.messages.push(p.message);
    fault.label = `${id}: ${list.join(', ')}`;
  }
  return out;
}

// ---------- words ----------

/** The pointer readout: the plate point relative to the shared offset, in the display unit, and the nearest hole. */
export function pointerReadout(
  plate: Point,
  scene: Pick<PlateScene, 'unit' | 'pitch' | 'columns' | 'rows'>,
  origin: Point,
  displayUnit: Unit,
): { x: string; y: string; hole: Hole | null } {
  const near = nearestHole(plate, scene);
  return {
    x: formatLength(convert(plate.x - origin.x, scene.unit, displayUnit), displayUnit),
    y: formatLength(convert(plate.y - origin.y, scene.unit, displayUnit), displayUnit),
    hole: near.onPlate ? near.hole : null,
  };
}

/** The drawing's accessible name: the story a screen reader hears first. */
export function describeDrawing(args: {
  content: TemplateContent;
  plate: PlateScene;
  stations: StationScene;
  displayUnit: Unit;
  faults: number;
  overlayLabel?: string;
}): string {
  const { content, plate, stations, displayUnit, faults, overlayLabel } = args;
  const p = content.plate;
  const shown = (v: number) => formatLength(convert(v, plate.unit, displayUnit), displayUnit);
  const parts = [
    `Plate drawing of ${content.name} on plate ${p.code}: ${p.columns} × ${p.rows} holes at ${shown(plate.pitch)} pitch`,
    `${plate.placements.length} placement${plate.placements.length === 1 ? '' : 's'} and ${stations.stations.length} station${stations.stations.length === 1 ? '' : 's'}`,
    `${stations.offsetName} at X ${shown(stations.origin.x)}, Y ${shown(stations.origin.y)} from the datum hole (0, 0)`,
  ];
  if (faults) parts.push(`${faults} placement${faults === 1 ? ' has' : 's have'} problems, outlined with a dashed line and labelled`);
  if (overlayLabel !== undefined) parts.push(`compared with ${overlayLabel}, drawn dashed beneath`);
  return `${parts.join('; ')}.`;
}
