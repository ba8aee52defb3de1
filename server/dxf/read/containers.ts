// What the structure scan learns about each container of entities (the ENTITIES section and
// every block definition), for the reader that walks dxf-parser's output.

/** Entity types dxf-parser 1.1.2 keeps (its registerDefaultEntityHandlers); others it skips. */
export const PARSER_ENTITY_TYPES: ReadonlySet<string> = new Set([
  '3DFACE',
  'ARC',
  'ATTDEF',
  'CIRCLE',
  'DIMENSION',
  'ELLIPSE',
  'INSERT',
  'LINE',
  'LWPOLYLINE',
  'MTEXT',
  'POINT',
  'POLYLINE',
  'SOLID',
  'SPLINE',
  'TEXT',
]);

/** Entity types Gridset turns into geometry, points or notes. */
export const READ_ENTITY_TYPES: ReadonlySet<string> = new Set([
  'LINE',
  'ARC',
  'CIRCLE',
  'LWPOLYLINE',
  'POLYLINE',
  'ELLIPSE',
  'SPLINE',
  'POINT',
  'TEXT',
  'MTEXT',
  'INSERT',
]);

/** The entities of the ENTITIES section or of one block definition. */
export interface ContainerScan {
  /** Block name, or null for the ENTITIES section. */
  block: string | null;
  /** Line of the "0 / BLOCK" or "2 / ENTITIES" pair. */
  line: number;
  /** Entities by type, as written; VERTEX, SEQEND and ATTRIB belong to their owner. */
  types: Map<string, number>;
  /** Entities of types Gridset does not read (ATTRIB included), paper space left out. */
  unsupported: Map<string, number>;
  /** All entities, parts not counted. */
  total: number;
  /** How many of them dxf-parser keeps: the length of its entities array for this container. */
  parsed: number;
  /** Entities in paper space (group 67 = 1). */
  paperSpace: number;
  /** Index in dxf-parser's array → line of the entity's "0" group, for INSERTs and re-reads. */
  lines: Map<number, number>;
  /** Index in dxf-parser's array → offset in the text where the entity starts, to re-read. */
  reread: Map<number, number>;
}

export interface DxfScan {
  /** The ENTITIES section, or null when the file has none. */
  entities: ContainerScan | null;
  blocks: Map<string, ContainerScan>;
  /** Section names in file order. */
  sections: string[];
  /** Lines up to and including the EOF value. */
  lines: number;
  /** Whether the text holds any carriage return (then lines may end in \r\n or \r). */
  hasCR: boolean;
}

export function newContainer(block: string | null, line: number): ContainerScan {
  return {
    block,
    line,
    types: new Map(),
    unsupported: new Map(),
    total: 0,
    parsed: 0,
    paperSpace: 0,
    lines: new Map(),
    reread: new Map(),
  };
}

export function bump(map: Map<string, number>, key: string, by = 1): void {
  map.set(key, (map.get(key) ?? 0) + by);
}

export function where(c: ContainerScan): string {
  return c.block === null ? 'the ENTITIES section' : `block "${c.block}"`;
}
