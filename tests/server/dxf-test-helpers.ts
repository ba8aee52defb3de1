/**
 * Hand-built ASCII DXF text for tests: group code / value pairs, one per two lines, codes
 * right-aligned in three columns as AutoCAD and ezdxf write them (DXF Reference, "DXF Files").
 */
export type Pair = readonly [number, string | number];

export function pairsText(pairs: readonly Pair[], eol = '\n'): string {
  return pairs.map(([code, value]) => `${String(code).padStart(3)}${eol}${value}${eol}`).join('');
}

/** One entity: its type, layer 8, then the given groups. */
export function entity(type: string, layer: string, ...groups: Pair[]): Pair[] {
  return [[0, type], [8, layer], ...groups];
}

export const circle = (layer: string, x: number, y: number, r: number, ...more: Pair[]): Pair[] =>
  entity('CIRCLE', layer, [10, x], [20, y], [30, 0], [40, r], ...more);

export const line = (layer: string, x1: number, y1: number, x2: number, y2: number): Pair[] =>
  entity('LINE', layer, [10, x1], [20, y1], [30, 0], [11, x2], [21, y2], [31, 0]);

export const insert = (layer: string, block: string, x: number, y: number, ...more: Pair[]): Pair[] =>
  entity('INSERT', layer, [2, block], [10, x], [20, y], [30, 0], ...more);

/** LWPOLYLINE; each vertex [x, y] or [x, y, bulge]. */
export function lwpolyline(layer: string, closed: boolean, vertices: readonly (readonly number[])[]): Pair[] {
  const groups: Pair[] = [[90, vertices.length], [70, closed ? 1 : 0]];
  for (const [x, y, b] of vertices) {
    groups.push([10, x!], [20, y!]);
    if (b !== undefined) groups.push([42, b]);
  }
  return entity('LWPOLYLINE', layer, ...groups);
}

export interface BlockDef {
  name: string;
  base?: [number, number];
  entities: Pair[][];
}

export interface DocOptions {
  /** $INSUNITS; left out of the header when undefined. */
  insunits?: number;
  acadver?: string;
  blocks?: BlockDef[];
  entities: Pair[][];
  eol?: string;
}

/** A whole drawing: HEADER, BLOCKS, ENTITIES, EOF. */
export function dxfDocument(o: DocOptions): string {
  const p: Pair[] = [[0, 'SECTION'], [2, 'HEADER'], [9, '$ACADVER'], [1, o.acadver ?? 'AC1015']];
  if (o.insunits !== undefined) p.push([9, '$INSUNITS'], [70, o.insunits]);
  p.push([0, 'ENDSEC']);
  if (o.blocks?.length) {
    p.push([0, 'SECTION'], [2, 'BLOCKS']);
    for (const b of o.blocks) {
      const [bx, by] = b.base ?? [0, 0];
      p.push([0, 'BLOCK'], [8, '0'], [2, b.name], [70, 0], [10, bx], [20, by], [30, 0], [3, b.name]);
      for (const e of b.entities) p.push(...e);
      p.push([0, 'ENDBLK'], [8, '0']);
    }
    p.push([0, 'ENDSEC']);
  }
  p.push([0, 'SECTION'], [2, 'ENTITIES']);
  for (const e of o.entities) p.push(...e);
  p.push([0, 'ENDSEC'], [0, 'EOF']);
  return pairsText(p, o.eol);
}

/** The group code / value pairs of DXF text, values trimmed. */
export function readPairs(text: string): { code: number; value: string }[] {
  const lines = text.split(/\r\n|\r|\n/);
  const out: { code: number; value: string }[] = [];
  for (let i = 0; i + 1 < lines.length; i += 2) out.push({ code: Number.parseInt(lines[i]!, 10), value: lines[i + 1]!.trim() });
  return out;
}

/** The entities of the ENTITIES section as lists of pairs, "0 / TYPE" first. */
export function entityGroups(text: string): { code: number; value: string }[][] {
  const pairs = readPairs(text);
  const start = pairs.findIndex((p, i) => p.code === 2 && p.value === 'ENTITIES' && pairs[i - 1]?.value === 'SECTION');
  const out: { code: number; value: string }[][] = [];
  for (let i = start + 1; i < pairs.length; i++) {
    const p = pairs[i]!;
    if (p.code === 0 && p.value === 'ENDSEC') break;
    if (p.code === 0) out.push([p]);
    else out[out.length - 1]?.push(p);
  }
  return out;
}
