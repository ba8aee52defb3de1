// What inspectDxf answers: the drawing's unit and version, layers, entity counts, extents,
// outline, circles, points and notes, with warnings for the user.
import type { Unit } from '../../../shared/schemas/common';
import type { Outline } from '../../../shared/schemas/geometry';

export interface InspectDxfOptions {
  /** Refuse files with more entities than this, counting block definitions and expansion. */
  maxEntities?: number;
}

export interface DxfBBox {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

export interface DxfCircle {
  x: number;
  y: number;
  r: number;
  layer: string;
}

export interface DxfPoint {
  x: number;
  y: number;
  layer: string;
}

/** A TEXT or MTEXT entity: plain text at its insertion point. */
export interface DxfNote {
  text: string;
  x: number;
  y: number;
  height: number;
  layer: string;
}

export interface DxfInspection {
  /** From $INSUNITS: 1 → in, 4 → mm; anything else (0, missing, other units) → null: ask the user. */
  unit: Unit | null;
  /** $INSUNITS as written, or null when the header has none. */
  insunits: number | null;
  /** $ACADVER, e.g. AC1009 for R12, AC1015 for R2000. */
  version: string | null;
  /** Layers that carry entities Gridset read, after block expansion; sorted by name. */
  layers: { name: string; entities: number }[];
  /** Entities in the ENTITIES section as written (VERTEX, SEQEND and ATTRIB belong to their owner). */
  entities: number;
  /** Those entities by type, sorted by type. */
  entityTypes: { type: string; count: number }[];
  /** Entities once blocks are expanded (INSERTs replaced by their contents). */
  expandedEntities: number;
  /** Extents of all geometry and points (text left out), arcs and curves to their true extents; null when nothing was drawn. */
  bbox: DxfBBox | null;
  /** Circles after block expansion; the same array as outline.circles. */
  circles: DxfCircle[];
  /** Entities Gridset does not read, by type, counted after block expansion; most frequent first. */
  unsupported: { type: string; count: number }[];
  outline: Outline;
  notes: DxfNote[];
  points: DxfPoint[];
  /** Which entities became polylines, and within what chord error. */
  approximations: string[];
  /** Other things the user should know: skipped paper space, unusual units, incomplete entities. */
  warnings: string[];
}
