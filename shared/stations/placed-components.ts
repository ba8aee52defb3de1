/**
 * The pieces a template's evaluation is built from: each catalog component prepared once in the
 * plate's unit (geometry, footprint, extent, clamp reach, seat height), a placement as laid on the
 * plate, and the shared offset's origin. Pure; used by evaluate-template.ts.
 */
import type { Unit } from '../schemas/common';
import type { Hole, Placement, TemplateComponent, TemplateContent } from '../schemas/template';
import { convert } from '../units/units';
import { applyTransform, type RigidTransform } from '../geometry/transform';
import { componentGeometryIn, type ComponentGeometry } from '../geometry/component-geometry';
import { boxOfPoints, outlineBounds, outlineFootprint, type Box, type Polygon } from '../geometry/outline';

/** Kinds whose jaw face is the fixed jaw a part is pushed against. */
export const FIXED_KINDS = new Set(['center-rail', 'short-rail', 'vise']);

export interface PreparedComponent {
  code: string;
  kind: TemplateComponent['kind'];
  geometry: ComponentGeometry;
  /** Local footprint polygons, or null when the component has no closed outline. */
  footprint: Polygon[] | null;
  /** Local extent: the outline's exact bounds, or the box of dowels, stops and jaw faces. */
  extent: Box;
  /** How far below its opening the clamp closes (plate unit); null for a jaw rail with no clamp model. */
  clampCloses: number | null;
  /** Height of the part seat above the plate deck (plate unit): a station's Z. */
  seatHeight: number;
}

export interface Placed {
  index: number;
  placement: Placement;
  component: PreparedComponent;
  transform: RigidTransform;
  extent: Box;
}

export const holeText = (h: Hole) => `hole (${h.col}, ${h.row})`;
export const who = (p: Placement) => `Placement ${p.id} (${p.component})`;

export function prepare(component: TemplateComponent, unit: Unit, chordTolerance: number): PreparedComponent {
  const geometry = componentGeometryIn(component, unit);
  const footprint = geometry.outline ? outlineFootprint(geometry.outline, chordTolerance) : [];
  const features = [...geometry.dowels, ...geometry.stops, ...geometry.jawFaces];
  return {
    code: component.code,
    kind: component.kind,
    geometry,
    footprint: footprint.length ? footprint : null,
    extent: geometry.outline && (geometry.outline.paths.length || geometry.outline.circles.length) ? outlineBounds(geometry.outline) : boxOfPoints(features),
    clampCloses: component.clamp ? convert(component.clamp.acceptBelow, component.unit, unit) : null,
    seatHeight: convert(component.seatHeight ?? 0, component.unit, unit),
  };
}

/** A local box under a quarter-turn transform is still a box: its corners map onto the new corners. */
export function transformBox(t: RigidTransform, b: Box): Box {
  return boxOfPoints([
    applyTransform(t, { x: b.minX, y: b.minY }),
    applyTransform(t, { x: b.maxX, y: b.minY }),
    applyTransform(t, { x: b.minX, y: b.maxY }),
    applyTransform(t, { x: b.maxX, y: b.maxY }),
  ]);
}

/** The shared offset origin in plate coordinates and the plate's unit. */
export function originOf(content: TemplateContent): { x: number; y: number; z: number } {
  const { plate, sharedOffset: so } = content;
  switch (so.kind) {
    case 'hole':
      return { x: so.hole.col * plate.pitch, y: so.hole.row * plate.pitch, z: 0 };
    case 'center':
      return { x: ((plate.columns - 1) * plate.pitch) / 2, y: ((plate.rows - 1) * plate.pitch) / 2, z: 0 };
    case 'point':
      // A point is entered in the template's unit, like every other number the template shows.
      return { x: convert(so.x, content.unit, plate.unit), y: convert(so.y, content.unit, plate.unit), z: convert(so.z ?? 0, content.unit, plate.unit) };
  }
}
