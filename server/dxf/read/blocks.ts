// Blocks and INSERT expansion: checking every INSERT before anything is drawn (the block exists,
// does not insert itself, and the expanded drawing stays within the entity limit), and the
// placements of a block's contents for one INSERT or MINSERT.
import type { IBlock, IDxf, IInsertEntity } from 'dxf-parser';
import { Affine } from '../../../shared/geometry/transform';
import { DxfError } from '../dxf-error';
import type { DxfScan } from './containers';

const MAX_BLOCK_DEPTH = 64;

function hasOwn(o: object | undefined, key: string): boolean {
  return o !== undefined && Object.prototype.hasOwnProperty.call(o, key);
}

function count(v: number | undefined): number {
  return Number.isFinite(v) && (v as number) >= 1 ? Math.floor(v as number) : 1;
}

/** Columns and rows of a MINSERT array (INSERT groups 70 and 71), 1 × 1 for a plain INSERT. */
function arrayCount(e: IInsertEntity): [number, number] {
  return [count(e.columnCount), count(e.rowCount)];
}

function tooMany(max: number): DxfError {
  return new DxfError(
    'too-many-entities',
    `Once its blocks are inserted the drawing has more than ${max.toLocaleString('en-US')} entities, more than Gridset reads from one file.`,
  );
}

export interface Expansion {
  count: number;
  unsupported: Map<string, number>;
}

/**
 * Checks every INSERT reachable from model space before anything is drawn: the block must exist,
 * must not insert itself through other blocks, and the expanded drawing must stay within the
 * entity limit. Returns the expanded entity count and unsupported entities by type.
 */
export function planExpansion(parsed: IDxf, scan: DxfScan, max: number): Expansion {
  const blocks = parsed.blocks;
  const memo = new Map<string, Expansion>();
  const stack: string[] = [];

  const merge = (into: Map<string, number>, from: Map<string, number>, times: number): void => {
    for (const [type, n] of from) into.set(type, (into.get(type) ?? 0) + n * times);
  };

  const visit = (name: string | undefined, from: string, line: number | undefined): Expansion => {
    const at = line !== undefined ? ` at line ${line}` : '';
    if (typeof name !== 'string' || name === '') {
      throw new DxfError('missing-block', `An INSERT in ${from}${at} names no block.`, { line });
    }
    if (!hasOwn(blocks, name)) {
      throw new DxfError(
        'missing-block',
        `An INSERT in ${from}${at} refers to block "${name}", which the BLOCKS section does not define.`,
        { line, block: name },
      );
    }
    const known = memo.get(name);
    if (known) return known;
    const loopAt = stack.indexOf(name);
    if (loopAt !== -1) {
      const chain = [...stack.slice(loopAt), name].map((b) => `"${b}"`).join(' inserts ');
      throw new DxfError(
        'recursive-block',
        `Block ${chain} again: blocks that insert themselves cannot be expanded.`,
        { line, block: name },
      );
    }
    if (stack.length >= MAX_BLOCK_DEPTH) {
      throw new DxfError(
        'recursive-block',
        `Blocks are nested more than ${MAX_BLOCK_DEPTH} levels deep (at block "${name}"), more than Gridset expands.`,
        { block: name },
      );
    }
    stack.push(name);
    const block = blocks[name]!;
    const bscan = scan.blocks.get(name);
    const list = block.entities ?? [];
    const aligned = bscan !== undefined && bscan.parsed === list.length;
    let count = bscan?.total ?? list.length;
    const unsupported = new Map(bscan?.unsupported ?? []);
    for (let i = 0; i < list.length; i++) {
      const e = list[i]!;
      if (e.type !== 'INSERT') continue;
      const ins = e as IInsertEntity;
      const [cols, rows] = arrayCount(ins);
      const child = visit(ins.name, `block "${name}"`, aligned ? bscan.lines.get(i) : undefined);
      count += cols * rows * child.count - 1;
      merge(unsupported, child.unsupported, cols * rows);
      if (count > max) throw tooMany(max);
    }
    stack.pop();
    const result = { count, unsupported };
    memo.set(name, result);
    return result;
  };

  const top = scan.entities!;
  const list = parsed.entities ?? [];
  const aligned = top.parsed === list.length;
  let count = top.total - top.paperSpace;
  const unsupported = new Map(top.unsupported);
  for (let i = 0; i < list.length; i++) {
    const e = list[i]!;
    if (e.type !== 'INSERT' || e.inPaperSpace) continue;
    const ins = e as IInsertEntity;
    const [cols, rows] = arrayCount(ins);
    const child = visit(ins.name, 'the ENTITIES section', aligned ? top.lines.get(i) : undefined);
    count += cols * rows * child.count - 1;
    merge(unsupported, child.unsupported, cols * rows);
    if (count > max) throw tooMany(max);
  }
  return { count, unsupported };
}

/**
 * The maps from a block's coordinates to the INSERT's object coordinates, one per MINSERT array
 * cell: shift by −base point, scale, then step by the unscaled row and column spacing, rotate,
 * and move to the insertion point (DXF Reference, INSERT groups 10, 41–45, 50, 70, 71).
 */
export function* insertPlacements(e: IInsertEntity, block: IBlock): Generator<Affine> {
  const base = block.position ?? { x: 0, y: 0, z: 0 };
  const pos = e.position ?? { x: 0, y: 0, z: 0 };
  const sx = Number.isFinite(e.xScale) ? e.xScale : 1;
  const sy = Number.isFinite(e.yScale) ? e.yScale : 1;
  const rot = Affine.rotateDeg(Number.isFinite(e.rotation) ? e.rotation : 0);
  const [cols, rows] = arrayCount(e);
  const dx = Number.isFinite(e.columnSpacing) ? e.columnSpacing : 0;
  const dy = Number.isFinite(e.rowSpacing) ? e.rowSpacing : 0;
  const inner = Affine.scaling(sx, sy).then(Affine.translate(-base.x, -base.y));
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      yield Affine.translate(pos.x, pos.y).then(rot).then(Affine.translate(c * dx, r * dy)).then(inner);
    }
  }
}
