// Walks a list of dxf-parser entities (the ENTITIES section, or a block's contents placed by an
// INSERT) and hands each to its reader.
import type {
  IArcEntity, ICircleEntity, IEllipseEntity, IEntity, IInsertEntity, ILineEntity, ILwpolylineEntity, IMtextEntity,
  IPointEntity, IPolylineEntity, ISplineEntity, ITextEntity,
} from 'dxf-parser';
import type { Affine } from '../../../shared/geometry/transform';
import { insertPlacements } from './blocks';
import type { ContainerScan } from './containers';
import type { ReadContext } from './context';
import { readEllipse, readSpline } from './entities-curves';
import { readArc, readCircle, readLine, readLwpolyline, readPolylineEntity } from './entities-lines';
import { readMtext, readPoint, readText } from './entities-text';

type EntityReader = (ctx: ReadContext, e: IEntity, m: Affine, layer: string, offset: number | undefined, depth: number) => void;

/** The reader of each entity type Gridset reads (READ_ENTITY_TYPES); a Map, so no type name reaches Object.prototype. */
const READERS = new Map<string, EntityReader>([
  ['LINE', (ctx, e, m, layer) => readLine(ctx, e as ILineEntity, m, layer)],
  ['LWPOLYLINE', (ctx, e, m, layer, offset) => readLwpolyline(ctx, e as ILwpolylineEntity, m, layer, offset)],
  ['POLYLINE', (ctx, e, m, layer) => readPolylineEntity(ctx, e as IPolylineEntity, m, layer)],
  ['ARC', (ctx, e, m, layer) => readArc(ctx, e as IArcEntity, m, layer)],
  ['CIRCLE', (ctx, e, m, layer, offset) => readCircle(ctx, e as ICircleEntity, m, layer, offset)],
  ['ELLIPSE', (ctx, e, m, layer, offset) => readEllipse(ctx, e as IEllipseEntity, m, layer, offset)],
  ['SPLINE', (ctx, e, m, layer, offset) => readSpline(ctx, e as ISplineEntity, m, layer, offset)],
  ['POINT', (ctx, e, m, layer) => readPoint(ctx, e as IPointEntity, m, layer)],
  ['TEXT', (ctx, e, m, layer, offset) => readText(ctx, e as ITextEntity, m, layer, offset)],
  ['MTEXT', (ctx, e, m, layer) => readMtext(ctx, e as IMtextEntity, m, layer)],
  ['INSERT', (ctx, e, m, layer, _offset, depth) => insert(ctx, e as IInsertEntity, m, layer, depth)],
]);

/** Reads every entity of `list` through `m`; `inherit` is the layer of the INSERT placing a block (null at top level). */
export function readList(ctx: ReadContext, list: IEntity[] | undefined, cscan: ContainerScan | undefined, m: Affine, inherit: string | null, depth: number): void {
  if (!list) return;
  let reread: Map<number, number> | null = null;
  if (cscan && cscan.parsed === list.length) {
    if (cscan.reread.size > 0) reread = cscan.reread;
  } else if (!ctx.misaligned) {
    ctx.misaligned = true;
    ctx.warn(
      'The DXF reader and the structure check disagree on the entity count of one section; extrusion directions, spline weights and LWPOLYLINE vertex identifiers were taken as dxf-parser read them.',
    );
  }
  for (let i = 0; i < list.length; i++) {
    const e = list[i]!;
    if (depth === 0 && e.inPaperSpace) {
      ctx.paperSpace++;
      continue;
    }
    let layer = typeof e.layer === 'string' && e.layer !== '' ? e.layer : '0';
    // Entities on layer 0 inside a block take the layer of the INSERT (DXF Reference, BLOCK).
    if (inherit !== null && layer === '0') layer = inherit;
    ctx.curType = e.type;
    ctx.curLayer = layer;
    const offset = reread !== null ? reread.get(i) : undefined;
    // Types without a reader are counted as unsupported by the structure scan (it sees the types dxf-parser drops too).
    READERS.get(e.type)?.(ctx, e, m, layer, offset, depth);
    // Top-level entities are read once; letting them go eases the collector on large files.
    if (depth === 0) (list as unknown[])[i] = undefined;
  }
}

function insert(ctx: ReadContext, e: IInsertEntity, m: Affine, layer: string, depth: number): void {
  // planExpansion has checked that the block exists and that blocks do not loop.
  const block = ctx.blocks[e.name]!;
  const list = block.entities;
  if (!list || list.length === 0) return;
  const bscan = ctx.scan.blocks.get(e.name);
  const n = e.extrusionDirection;
  const outer = ctx.inOcs(m, n?.x, n?.y, n?.z, e.position?.z ?? 0);
  for (const local of insertPlacements(e, block)) {
    readList(ctx, list, bscan, outer.kind === 0 ? local : outer.then(local), layer, depth + 1);
  }
}
