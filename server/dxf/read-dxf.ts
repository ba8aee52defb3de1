import DxfParser from 'dxf-parser';
import type {
  IArcEntity,
  IBlock,
  ICircleEntity,
  IDxf,
  IEllipseEntity,
  IEntity,
  IInsertEntity,
  ILineEntity,
  ILwpolylineEntity,
  IMtextEntity,
  IPoint,
  IPointEntity,
  IPolylineEntity,
  ISplineEntity,
  ITextEntity,
} from 'dxf-parser';
import type { Unit } from '../../shared/schemas/common';
import type { Outline, OutlinePath, OutlineVertex } from '../../shared/schemas/geometry';
import { LIMITS } from '../../shared/schemas/limits';
import { bulgeArc, sweepToBulge } from '../../shared/geometry/bulge';
import { addArcExtents, addBulgeExtents, Extents } from '../../shared/geometry/extents';
import { conicSteps, flattenConic } from './curves/conic';
import { addCurveExtents, type BSpline, flattenSpline, isValidBSpline, SplineEvaluator, type Vec2 } from './curves/spline';
import { interpolateFitPoints } from './curves/spline-fit';
import { DxfError } from './dxf-error';
import { type ContainerScan, type DxfScan, readEntityGroups, scanDxf } from './dxf-scan';

export { DxfError } from './dxf-error';
export type { DxfErrorCode } from './dxf-error';

/** Default cap on entities per file, block definitions and block expansion included. */
export const DEFAULT_MAX_ENTITIES = 500_000;

/** Chord error allowed when curves become polylines, per unit (common shop practice). */
export const CHORD_TOLERANCE: Readonly<Record<Unit, number>> = { in: 0.001, mm: 0.02 };

const MAX_BLOCK_DEPTH = 64;
const TAU = 2 * Math.PI;

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

/** $INSUNITS codes (DXF Reference, HEADER section) other than 1 and 4, for the warning. */
const OTHER_UNITS: Record<number, string> = {
  2: 'feet',
  3: 'miles',
  5: 'centimeters',
  6: 'meters',
  7: 'kilometers',
  8: 'microinches',
  9: 'mils',
  10: 'yards',
  11: 'angstroms',
  12: 'nanometers',
  13: 'microns',
  14: 'decimeters',
  15: 'decameters',
  16: 'hectometers',
  17: 'gigameters',
  18: 'astronomical units',
  19: 'light years',
  20: 'parsecs',
  21: 'US survey feet',
};

/**
 * A 2D affine map x' = a·x + c·y + e, y' = b·x + d·y + f, with what kind of map it is: arcs stay
 * arcs (and bulges stay bulges) only under a similarity.
 */
class Xform {
  /** 0 identity, 1 similarity (uniform scale, rotation, mirror, shift), 2 anything else. */
  readonly kind: 0 | 1 | 2;
  readonly scale: number;
  readonly mirror: boolean;

  constructor(
    readonly a: number,
    readonly b: number,
    readonly c: number,
    readonly d: number,
    readonly e: number,
    readonly f: number,
  ) {
    const su = a * a + b * b;
    const sv = c * c + d * d;
    this.mirror = a * d - b * c < 0;
    if (a === 1 && b === 0 && c === 0 && d === 1 && e === 0 && f === 0) {
      this.kind = 0;
      this.scale = 1;
    } else if (Math.abs(su - sv) <= 1e-9 * su && Math.abs(a * c + b * d) <= 1e-9 * su) {
      this.kind = 1;
      this.scale = Math.sqrt(su);
    } else {
      this.kind = 2;
      this.scale = Math.sqrt(Math.abs(a * d - b * c));
    }
  }

  /** this ∘ n: apply n first. */
  then(n: Xform): Xform {
    return new Xform(
      this.a * n.a + this.c * n.b,
      this.b * n.a + this.d * n.b,
      this.a * n.c + this.c * n.d,
      this.b * n.c + this.d * n.d,
      this.a * n.e + this.c * n.f + this.e,
      this.b * n.e + this.d * n.f + this.f,
    );
  }

  static translate(x: number, y: number): Xform {
    return new Xform(1, 0, 0, 1, x, y);
  }

  static rotate(rad: number): Xform {
    const c = Math.cos(rad);
    const s = Math.sin(rad);
    return new Xform(c, s, -s, c, 0, 0);
  }

  static scaling(sx: number, sy: number): Xform {
    return new Xform(sx, 0, 0, sy, 0, 0);
  }
}

const IDENTITY = new Xform(1, 0, 0, 1, 0, 0);

/** Rotation angles of multiples of 90° to exact cosines and sines, so inserted holes land exactly. */
function rotation(deg: number): Xform {
  const q = deg / 90;
  if (Number.isInteger(q)) {
    const k = ((q % 4) + 4) % 4;
    const [c, s] = ([[1, 0], [0, 1], [-1, 0], [0, -1]] as const)[k]!;
    return new Xform(c, s, -s, c, 0, 0);
  }
  return Xform.rotate((deg * Math.PI) / 180);
}

/**
 * The map from an entity's object coordinate system to world XY, by the arbitrary axis
 * algorithm (DXF Reference, "Arbitrary Axis Algorithm"): with N the extrusion direction,
 * Ax = Wy × N when |Nx| and |Ny| are both below 1/64, else Wz × N; Ay = N × Ax. A point (x, y)
 * at elevation z lies at x·Ax + y·Ay + z·N; keeping X and Y projects it onto the XY plane.
 * Returns null for the default N = (0, 0, 1).
 */
function ocsMap(nx: number, ny: number, nz: number, elevation: number): Xform | null {
  if (!(Number.isFinite(nx) && Number.isFinite(ny) && Number.isFinite(nz))) return null;
  const len = Math.hypot(nx, ny, nz);
  if (len === 0) return null;
  nx /= len;
  ny /= len;
  nz /= len;
  if (nx === 0 && ny === 0 && nz === 1) return null;
  let ax: number;
  let ay: number;
  let az: number;
  if (Math.abs(nx) < 1 / 64 && Math.abs(ny) < 1 / 64) {
    [ax, ay, az] = [nz, 0, -nx];
  } else {
    [ax, ay, az] = [-ny, nx, 0];
  }
  const al = Math.hypot(ax, ay, az);
  ax /= al;
  ay /= al;
  az /= al;
  let bx = ny * az - nz * ay;
  let by = nz * ax - nx * az;
  const bz = nx * ay - ny * ax;
  const bl = Math.hypot(bx, by, bz);
  bx /= bl;
  by /= bl;
  const z = Number.isFinite(elevation) ? elevation : 0;
  return new Xform(ax, ay, bx, by, z * nx, z * ny);
}

const unicodeEscape = (_: string, hex: string): string => String.fromCharCode(Number.parseInt(hex, 16));

const controlCode = (_: string, c: string): string => {
  switch (c.toLowerCase()) {
    case 'c':
      return 'Ø';
    case 'd':
      return '°';
    case 'p':
      return '±';
    case '%':
      return '%';
    case 'u':
    case 'o':
    case 'k':
      return '';
    default:
      return String.fromCharCode(Number(c));
  }
};

/** TEXT control codes (DXF Reference, TEXT: %%c, %%d, %%p, %%nnn) and \U+XXXX to characters. */
function textValue(raw: string): string {
  if (raw.indexOf('%%') === -1 && raw.indexOf('\\U+') === -1) return raw;
  return raw.replace(/\\U\+([0-9A-Fa-f]{4})/g, unicodeEscape).replace(/%%(\d{3}|[cCdDpPuUoOkK%])/g, controlCode);
}

/** MTEXT with its inline formatting (DXF Reference, MTEXT "Inline codes") removed. */
function mtextValue(raw: string): string {
  // Escaped backslashes and braces first, so the codes below leave them alone.
  let s = textValue(raw).replace(/\\([\\{}])/g, (_, c: string) => (c === '\\' ? '\u0001' : c === '{' ? '\u0002' : '\u0003'));
  s = s.replace(/\\P/g, '\n').replace(/\\~/g, ' ');
  s = s.replace(/\\S([^;]*?)[\^/#]([^;]*?);/g, '$1/$2');
  s = s.replace(/\\[ACFfHQTWcp][^;\\{}]*;/g, '');
  s = s.replace(/\\[LlOoKkNX]/g, '');
  s = s.replace(/[{}]/g, '');
  return s.replace(/\u0001/g, '\\').replace(/\u0002/g, '{').replace(/\u0003/g, '}');
}

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

interface Expansion {
  count: number;
  unsupported: Map<string, number>;
}

/**
 * Checks every INSERT reachable from model space before anything is drawn: the block must exist,
 * must not insert itself through other blocks, and the expanded drawing must stay within the
 * entity limit. Returns the expanded entity count and unsupported entities by type.
 */
function planExpansion(parsed: IDxf, scan: DxfScan, max: number): Expansion {
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

/** Turns dxf-parser entities into Gridset's outline, circles, points and notes. */
class Reader {
  readonly paths: OutlinePath[] = [];
  readonly circles: DxfCircle[] = [];
  readonly notes: DxfNote[] = [];
  readonly points: DxfPoint[] = [];
  readonly ext = new Extents();
  readonly layers = new Map<string, { n: number }>();
  private lastLayer = '';
  private lastCounter = { n: 0 };
  readonly unsupported = new Map<string, number>();
  private readonly approx = new Map<string, { type: string; layer: string; how: string; count: number }>();
  private readonly warned = new Map<string, number>();
  private paperSpace = 0;
  private misaligned = false;
  // The entity being read, for error messages.
  private curType = '';
  private curLayer = '';

  /** Points left for curves and polylines of the whole drawing (LIMITS.dxfPoints). */
  private pointBudget: number = LIMITS.dxfPoints;

  constructor(
    private readonly text: string,
    private readonly scan: DxfScan,
    private readonly blocks: Record<string, IBlock>,
    private readonly tol: number,
    /** Largest |coordinate| and radius accepted, in the drawing's unit. */
    private readonly maxCoord: number,
    private readonly unitLabel: string,
  ) {}

  private get entityName(): string {
    return `${/^[AEIOU]/.test(this.curType) ? 'An' : 'A'} ${this.curType} entity`;
  }

  /** Counts n points against the drawing's budget before they are made; one curve has a limit of its own. */
  private spend(n: number, curve: boolean): void {
    if (curve && n > LIMITS.dxfCurvePoints) {
      throw new DxfError(
        'too-large',
        `${this.entityName} on layer "${this.curLayer}" would become at least ${Math.round(n).toLocaleString('en-US')} points, more than the ${LIMITS.dxfCurvePoints.toLocaleString('en-US')} Gridset makes of one curve; check its size and scale.`,
      );
    }
    this.pointBudget -= n;
    if (!(this.pointBudget >= 0)) {
      throw new DxfError(
        'too-large',
        `The drawing's lines and curves make more than ${LIMITS.dxfPoints.toLocaleString('en-US')} points, more than Gridset reads from one file; the limit was passed at a ${this.curType} on layer "${this.curLayer}". Simplify the drawing or send only the outline.`,
      );
    }
  }

  /** Refuses a coordinate or length beyond maxCoord (LIMITS.coordinateMm). */
  private inRange(...values: number[]): void {
    for (const v of values) {
      if (!(Math.abs(v) <= this.maxCoord)) {
        if (!Number.isFinite(v)) this.bad();
        throw new DxfError(
          'too-large',
          `${this.entityName} on layer "${this.curLayer}" reaches ${v.toExponential(3)} ${this.unitLabel}; Gridset reads coordinates and radii up to ${this.maxCoord.toLocaleString('en-US', { maximumFractionDigits: 3 })} ${this.unitLabel} (100 m). Check the drawing's unit and scale.`,
        );
      }
    }
  }

  warn(message: string): void {
    this.warned.set(message, (this.warned.get(message) ?? 0) + 1);
  }

  private approximated(type: string, layer: string, how: string): void {
    const key = `${type}\u0000${layer}\u0000${how}`;
    const a = this.approx.get(key);
    if (a) a.count++;
    else this.approx.set(key, { type, layer, how, count: 1 });
  }

  private counted(layer: string): void {
    // Entities come in runs on one layer: skip the map lookup for a run.
    if (layer !== this.lastLayer || this.layers.size === 0) {
      let c = this.layers.get(layer);
      if (!c) {
        c = { n: 0 };
        this.layers.set(layer, c);
      }
      this.lastLayer = layer;
      this.lastCounter = c;
    }
    this.lastCounter.n++;
  }

  private bad(): never {
    throw new DxfError(
      'malformed',
      `${this.entityName} on layer "${this.curLayer}" has a coordinate that is not a finite number.`,
    );
  }

  /** Point p through m, checked finite. */
  private vertex(m: Xform, x: number, y: number): OutlineVertex {
    const v =
      m.kind === 0 ? { x, y } : { x: m.a * x + m.c * y + m.e, y: m.b * x + m.d * y + m.f };
    if (!(v.x - v.x === 0 && v.y - v.y === 0)) this.bad();
    this.inRange(v.x, v.y);
    return v;
  }

  readList(list: IEntity[] | undefined, cscan: ContainerScan | undefined, m: Xform, inherit: string | null, depth: number): void {
    if (!list) return;
    let reread: Map<number, number> | null = null;
    if (cscan && cscan.parsed === list.length) {
      if (cscan.reread.size > 0) reread = cscan.reread;
    } else if (!this.misaligned) {
      this.misaligned = true;
      this.warn(
        'The DXF reader and the structure check disagree on the entity count of one section; extrusion directions, spline weights and LWPOLYLINE vertex identifiers were taken as dxf-parser read them.',
      );
    }
    for (let i = 0; i < list.length; i++) {
      const e = list[i]!;
      if (depth === 0 && e.inPaperSpace) {
        this.paperSpace++;
        continue;
      }
      let layer = typeof e.layer === 'string' && e.layer !== '' ? e.layer : '0';
      // Entities on layer 0 inside a block take the layer of the INSERT (DXF Reference, BLOCK).
      if (inherit !== null && layer === '0') layer = inherit;
      this.curType = e.type;
      this.curLayer = layer;
      const offset = reread !== null ? reread.get(i) : undefined;
      switch (e.type) {
        case 'LINE':
          this.line(e as ILineEntity, m, layer);
          break;
        case 'LWPOLYLINE':
          this.lwpolyline(e as ILwpolylineEntity, m, layer, offset);
          break;
        case 'POLYLINE':
          this.polylineEntity(e as IPolylineEntity, m, layer);
          break;
        case 'ARC':
          this.arc(e as IArcEntity, m, layer);
          break;
        case 'CIRCLE':
          this.circle(e as ICircleEntity, m, layer, offset);
          break;
        case 'ELLIPSE':
          this.ellipse(e as IEllipseEntity, m, layer, offset);
          break;
        case 'SPLINE':
          this.spline(e as ISplineEntity, m, layer, offset);
          break;
        case 'POINT':
          this.point(e as IPointEntity, m, layer);
          break;
        case 'TEXT':
          this.textEntity(e as ITextEntity, m, layer, offset);
          break;
        case 'MTEXT':
          this.mtext(e as IMtextEntity, m, layer);
          break;
        case 'INSERT':
          this.insert(e as IInsertEntity, m, layer, depth);
          break;
        default:
          // Counted as unsupported by the structure scan (it sees the types dxf-parser drops too).
          break;
      }
      // Top-level entities are read once; letting them go eases the collector on large files.
      if (depth === 0) (list as unknown[])[i] = undefined;
    }
  }

  /** Extrusion direction re-read from the text (the scan flags every non-default one dxf-parser drops). */
  private extrusion(offset: number): [number, number, number] {
    let x = 0;
    let y = 0;
    let z = 1;
    for (const g of readEntityGroups(this.text, offset, this.scan.hasCR)) {
      if (g.code === 210) x = Number(g.value);
      else if (g.code === 220) y = Number(g.value);
      else if (g.code === 230) z = Number(g.value);
    }
    return [x, y, z];
  }

  /**
   * m ∘ OCS map of an entity with extrusion (x, y, z), noting a tilted one; m itself for the
   * default (0, 0, 1) or a missing direction.
   */
  private inOcs(m: Xform, x: number | undefined, y: number | undefined, z: number | undefined, elevation: number): Xform {
    if ((x === undefined || x === 0) && (y === undefined || y === 0) && (z === undefined || z === 1)) return m;
    const o = ocsMap(Number.isFinite(x) ? x! : 0, Number.isFinite(y) ? y! : 0, Number.isFinite(z) ? z! : 1, elevation);
    if (o === null) return m;
    if (Math.abs(x ?? 0) > 1e-12 || Math.abs(y ?? 0) > 1e-12) {
      this.warn('Some entities lie in tilted planes (extrusion direction not along Z); they were projected onto the XY plane.');
    }
    return m.kind === 0 ? o : m.then(o);
  }

  private line(e: ILineEntity, m: Xform, layer: string): void {
    const v = e.vertices;
    if (!v || v.length < 2 || !v[0] || !v[1]) {
      this.warn('LINE entities without both end points were skipped.');
      return;
    }
    const p0 = this.vertex(m, v[0].x, v[0].y);
    const p1 = this.vertex(m, v[1].x, v[1].y);
    this.ext.add(p0.x, p0.y);
    this.ext.add(p1.x, p1.y);
    this.paths.push({ layer, closed: false, points: [p0, p1] });
    this.counted(layer);
  }

  private lwpolyline(e: ILwpolylineEntity, m: Xform, layer: string, offset: number | undefined): void {
    if (offset === undefined) {
      const mm = this.inOcs(m, e.extrusionDirectionX, e.extrusionDirectionY, e.extrusionDirectionZ, e.elevation ?? 0);
      this.polyline(e.vertices, !!e.shape, mm, layer, 'LWPOLYLINE');
      return;
    }
    // dxf-parser stops reading vertices at a vertex identifier (group 91); read them here.
    const verts: { x: number; y: number; bulge?: number }[] = [];
    let closed = false;
    let elevation = 0;
    const n: [number, number, number] = [0, 0, 1];
    for (const g of readEntityGroups(this.text, offset, this.scan.hasCR)) {
      const v = Number(g.value);
      switch (g.code) {
        case 10:
          verts.push({ x: v, y: Number.NaN });
          break;
        case 20:
          if (verts.length) verts[verts.length - 1]!.y = v;
          break;
        case 42:
          if (verts.length && v !== 0) verts[verts.length - 1]!.bulge = v;
          break;
        case 70:
          closed = (v & 1) === 1;
          break;
        case 38:
          elevation = v;
          break;
        case 210:
          n[0] = v;
          break;
        case 220:
          n[1] = v;
          break;
        case 230:
          n[2] = v;
          break;
      }
    }
    this.polyline(verts, closed, this.inOcs(m, n[0], n[1], n[2], elevation), layer, 'LWPOLYLINE');
  }

  private polylineEntity(e: IPolylineEntity, m: Xform, layer: string): void {
    if (e.isPolyfaceMesh || e.is3dPolygonMesh) {
      this.unsupported.set('POLYLINE (mesh)', (this.unsupported.get('POLYLINE (mesh)') ?? 0) + 1);
      return;
    }
    // A spline-fit POLYLINE lists its frame (control) vertices too; only the fitted ones are drawn.
    const verts = (e.vertices ?? []).filter((v) => !v.splineControlPoint);
    if (e.is3dPolyline) {
      this.polyline(verts.map((v) => ({ x: v.x, y: v.y })), !!e.shape, m, layer, 'POLYLINE');
      return;
    }
    const n = e.extrusionDirection;
    this.polyline(verts, !!e.shape, this.inOcs(m, n?.x, n?.y, n?.z, 0), layer, 'POLYLINE');
  }

  private polyline(
    verts: ReadonlyArray<{ x: number; y: number; bulge?: number }> | undefined,
    closed: boolean,
    m: Xform,
    layer: string,
    type: string,
  ): void {
    const n = verts?.length ?? 0;
    if (n < 2) {
      this.warn(`${type} entities with fewer than two vertices were skipped.`);
      return;
    }
    const vs = verts!;
    this.spend(n, false);
    const segments = closed ? n : n - 1;
    if (m.kind !== 2) {
      const flip = m.mirror ? -1 : 1;
      const pts: OutlineVertex[] = new Array(n);
      for (let i = 0; i < n; i++) {
        const v = vs[i]!;
        const p = this.vertex(m, v.x, v.y);
        const b = v.bulge;
        if (b !== undefined && b !== 0 && i < segments) {
          if (!Number.isFinite(b)) this.bad();
          p.bulge = b * flip;
        }
        pts[i] = p;
      }
      const ext = this.ext;
      for (let i = 0; i < n; i++) {
        const p = pts[i]!;
        if (p.bulge !== undefined) {
          const q = pts[i + 1 === n ? 0 : i + 1]!;
          addBulgeExtents(ext, p.x, p.y, q.x, q.y, p.bulge);
        } else {
          ext.add(p.x, p.y);
        }
      }
      this.paths.push({ layer, closed, points: pts });
      this.counted(layer);
      return;
    }
    // A stretched polyline: its arcs become elliptical, so they are drawn as polylines.
    const pts: OutlineVertex[] = [];
    let curved = false;
    for (let i = 0; i < n; i++) {
      const v = vs[i]!;
      const p = this.vertex(m, v.x, v.y);
      pts.push(p);
      this.ext.add(p.x, p.y);
      const b = v.bulge;
      if (b === undefined || b === 0 || i >= segments) continue;
      const w = vs[i + 1 === n ? 0 : i + 1]!;
      if (w.x === v.x && w.y === v.y) continue;
      if (!Number.isFinite(b)) this.bad();
      const a = bulgeArc(v.x, v.y, w.x, w.y, b);
      if (a === null) continue;
      const r = a.r;
      const cx = m.a * a.cx + m.c * a.cy + m.e;
      const cy = m.b * a.cx + m.d * a.cy + m.f;
      this.inRange(cx, cy, m.a * r, m.b * r, m.c * r, m.d * r);
      this.spend(conicSteps(m.a * r, m.b * r, m.c * r, m.d * r, a.sweep, this.tol), true);
      const arc = flattenConic(cx, cy, m.a * r, m.b * r, m.c * r, m.d * r, a.start, a.sweep, this.tol);
      for (let k = 1; k < arc.length - 1; k++) pts.push(arc[k]!);
      addArcExtents(this.ext, cx, cy, m.a * r, m.b * r, m.c * r, m.d * r, a.start, a.sweep);
      curved = true;
    }
    if (curved) this.approximated(type, layer, ' (its arcs are stretched by a block insert)');
    this.paths.push({ layer, closed, points: pts });
    this.counted(layer);
  }

  /** A circular arc (sweep radians counter-clockwise from a0, 2π for a whole circle) in OCS coordinates. */
  private circularArc(m: Xform, cx: number, cy: number, r: number, a0: number, sweep: number, layer: string, type: string): void {
    const full = sweep >= TAU - 1e-12;
    if (m.kind !== 2) {
      const flip = m.mirror ? -1 : 1;
      this.inRange(r * m.scale);
      if (full) {
        const p0 = this.vertex(m, cx + r * Math.cos(a0), cy + r * Math.sin(a0));
        const p1 = this.vertex(m, cx - r * Math.cos(a0), cy - r * Math.sin(a0));
        p0.bulge = flip;
        p1.bulge = flip;
        addBulgeExtents(this.ext, p0.x, p0.y, p1.x, p1.y, flip);
        addBulgeExtents(this.ext, p1.x, p1.y, p0.x, p0.y, flip);
        this.paths.push({ layer, closed: true, points: [p0, p1] });
      } else {
        const a1 = a0 + sweep;
        const p0 = this.vertex(m, cx + r * Math.cos(a0), cy + r * Math.sin(a0));
        const p1 = this.vertex(m, cx + r * Math.cos(a1), cy + r * Math.sin(a1));
        // Bulge = tan(θ/4) (DXF Reference, LWPOLYLINE group 42).
        p0.bulge = sweepToBulge(sweep) * flip;
        // Extents from the known centre rather than one rebuilt from the bulge.
        const ccx = m.a * cx + m.c * cy + m.e;
        const ccy = m.b * cx + m.d * cy + m.f;
        const rr = r * m.scale;
        const t0 = m.kind === 0 ? a0 : Math.atan2(m.b * Math.cos(a0) + m.d * Math.sin(a0), m.a * Math.cos(a0) + m.c * Math.sin(a0));
        this.ext.add(p0.x, p0.y);
        this.ext.add(p1.x, p1.y);
        addArcExtents(this.ext, ccx, ccy, rr, 0, 0, rr, t0, sweep * flip, false);
        this.paths.push({ layer, closed: false, points: [p0, p1] });
      }
      this.counted(layer);
      return;
    }
    const ccx = m.a * cx + m.c * cy + m.e;
    const ccy = m.b * cx + m.d * cy + m.f;
    this.conic(ccx, ccy, m.a * r, m.b * r, m.c * r, m.d * r, a0, full ? TAU : sweep, layer, type, ' (stretched by a block insert)');
  }

  /** p(t) = C + U cos t + V sin t as a polyline, whole when sweep is 2π. */
  private conic(cx: number, cy: number, ux: number, uy: number, vx: number, vy: number, t0: number, sweep: number, layer: string, type: string, how: string): void {
    for (const v of [cx, cy, ux, uy, vx, vy, t0, sweep]) if (!Number.isFinite(v)) this.bad();
    this.inRange(cx, cy, ux, uy, vx, vy);
    const full = sweep >= TAU - 1e-12;
    this.spend(conicSteps(ux, uy, vx, vy, full ? TAU : sweep, this.tol), true);
    const pts = flattenConic(cx, cy, ux, uy, vx, vy, t0, full ? TAU : sweep, this.tol);
    if (full) pts.pop();
    addArcExtents(this.ext, cx, cy, ux, uy, vx, vy, t0, full ? TAU : sweep);
    this.paths.push({ layer, closed: full, points: pts });
    this.approximated(type, layer, how);
    this.counted(layer);
  }

  private arc(e: IArcEntity, m: Xform, layer: string): void {
    const c = e.center;
    const r = e.radius;
    if (!c || !(r > 0) || !Number.isFinite(e.startAngle) || !Number.isFinite(e.endAngle)) {
      this.warn('ARC entities without a centre, a positive radius or both angles were skipped.');
      return;
    }
    let sweep = (((e.endAngle - e.startAngle) % TAU) + TAU) % TAU;
    if (sweep < 1e-12) sweep = TAU;
    const mm = this.inOcs(m, e.extrusionDirectionX, e.extrusionDirectionY, e.extrusionDirectionZ, c.z ?? 0);
    this.circularArc(mm, c.x, c.y, r, e.startAngle, sweep, layer, 'ARC');
  }

  private circle(e: ICircleEntity, m: Xform, layer: string, offset: number | undefined): void {
    const c = e.center;
    const r = e.radius;
    if (!c || !(r > 0)) {
      this.warn('CIRCLE entities without a centre or a positive radius were skipped.');
      return;
    }
    let mm = m;
    if (offset !== undefined) {
      const [nx, ny, nz] = this.extrusion(offset);
      mm = this.inOcs(m, nx, ny, nz, c.z ?? 0);
    }
    if (mm.kind === 2) {
      this.circularArc(mm, c.x, c.y, r, 0, TAU, layer, 'CIRCLE');
      return;
    }
    const x = mm.kind === 0 ? c.x : mm.a * c.x + mm.c * c.y + mm.e;
    const y = mm.kind === 0 ? c.y : mm.b * c.x + mm.d * c.y + mm.f;
    if (!(x - x === 0 && y - y === 0 && Number.isFinite(r))) this.bad();
    const rr = r * mm.scale;
    this.inRange(x, y, rr);
    this.ext.add(x - rr, y - rr);
    this.ext.add(x + rr, y + rr);
    this.circles.push({ x, y, r: rr, layer });
    this.counted(layer);
  }

  private ellipse(e: IEllipseEntity, m: Xform, layer: string, offset: number | undefined): void {
    const c = e.center;
    const mj = e.majorAxisEndPoint;
    const ratio = e.axisRatio;
    if (!c || !mj || !(ratio > 0) || (mj.x === 0 && mj.y === 0 && !mj.z)) {
      this.warn('ELLIPSE entities without a centre, a major axis or a positive axis ratio were skipped.');
      return;
    }
    const t0 = Number.isFinite(e.startAngle) ? e.startAngle : 0;
    const t1 = Number.isFinite(e.endAngle) ? e.endAngle : TAU;
    let sweep = (((t1 - t0) % TAU) + TAU) % TAU;
    if (sweep < 1e-12) sweep = TAU;
    // Minor axis = ratio · (N × major) (DXF Reference, ELLIPSE: centre and axis in WCS).
    let [nx, ny, nz] = offset === undefined ? [0, 0, 1] : this.extrusion(offset);
    const nl = Math.hypot(nx, ny, nz) || 1;
    nx /= nl;
    ny /= nl;
    nz /= nl;
    if (Math.abs(nx) > 1e-12 || Math.abs(ny) > 1e-12) {
      this.warn('Some entities lie in tilted planes (extrusion direction not along Z); they were projected onto the XY plane.');
    }
    const mz = mj.z ?? 0;
    const minX = ratio * (ny * mz - nz * mj.y);
    const minY = ratio * (nz * mj.x - nx * mz);
    const C = this.vertex(m, c.x, c.y);
    const ux = m.a * mj.x + m.c * mj.y;
    const uy = m.b * mj.x + m.d * mj.y;
    const vx = m.a * minX + m.c * minY;
    const vy = m.b * minX + m.d * minY;
    const uu = ux * ux + uy * uy;
    if (sweep >= TAU - 1e-9 && Math.abs(uu - (vx * vx + vy * vy)) <= 1e-12 * uu && Math.abs(ux * vx + uy * vy) <= 1e-12 * uu) {
      // A whole ellipse with equal axes is a circle: keep it as one, holes are circles.
      const r = Math.sqrt(uu);
      this.inRange(r);
      this.ext.add(C.x - r, C.y - r);
      this.ext.add(C.x + r, C.y + r);
      this.circles.push({ x: C.x, y: C.y, r, layer });
      this.counted(layer);
      return;
    }
    this.conic(C.x, C.y, ux, uy, vx, vy, t0, sweep, layer, 'ELLIPSE', '');
  }

  private spline(e: ISplineEntity, m: Xform, layer: string, offset: number | undefined): void {
    let spline: BSpline | null = null;
    let how = '';
    const degree = e.degreeOfSplineCurve ?? 3;
    const cps = e.controlPoints ?? [];
    const fitCount = e.fitPoints?.length ?? 0;
    if (cps.length > LIMITS.splineControlPoints || fitCount > LIMITS.splineControlPoints || (e.knotValues?.length ?? 0) > LIMITS.splineControlPoints + LIMITS.splineDegree + 1) {
      throw new DxfError(
        'too-large',
        `A SPLINE on layer "${layer}" has ${Math.max(cps.length, fitCount).toLocaleString('en-US')} control or fit points; Gridset reads splines of up to ${LIMITS.splineControlPoints.toLocaleString('en-US')}. Split it, or save it as a polyline.`,
      );
    }
    if (!(degree >= 1 && degree <= LIMITS.splineDegree)) {
      this.warn(`SPLINE entities of a degree other than 1 to ${LIMITS.splineDegree} were skipped.`);
      return;
    }
    if (cps.length > 0) {
      let weights: number[] | null = null;
      if (offset !== undefined) {
        weights = readEntityGroups(this.text, offset, this.scan.hasCR)
          .filter((g) => g.code === 41)
          .map((g) => Number(g.value));
        if (weights.length === 0 || weights.every((w) => w === 1)) weights = null;
      }
      const points = new Float64Array(cps.length * 2);
      cps.forEach((p, i) => {
        points[2 * i] = p.x;
        points[2 * i + 1] = p.y;
      });
      const candidate: BSpline = { degree, knots: e.knotValues ?? [], points, weights };
      if (isValidBSpline(candidate)) spline = candidate;
    }
    const fit = e.fitPoints ?? [];
    if (spline === null && fit.length >= 2) {
      const st = e.startTangent;
      const et = e.endTangent;
      spline = interpolateFitPoints(
        fit.map((p) => ({ x: p.x, y: p.y })),
        st ? { x: st.x, y: st.y } : undefined,
        et ? { x: et.x, y: et.y } : undefined,
      );
      how = ' (rebuilt from its fit points as a cubic through them: chord-length parameters, end tangents from the file or estimated from the points)';
    }
    if (spline === null) {
      this.warn('SPLINE entities whose control points, knots and fit points do not make a curve were skipped.');
      return;
    }
    if (m.kind !== 0) {
      // B-splines are affine invariant: mapping the control points maps the curve (P&T §4.2).
      const P = spline.points;
      for (let i = 0; i < P.length; i += 2) {
        const x = P[i]!;
        const y = P[i + 1]!;
        P[i] = m.a * x + m.c * y + m.e;
        P[i + 1] = m.b * x + m.d * y + m.f;
      }
    }
    for (const v of spline.points) if (!Number.isFinite(v)) this.bad();
    // A B-spline lies in the convex hull of its control points (strong convex hull property,
    // P&T §3.2; §4.2 for positive weights), so bounding them bounds the curve.
    this.inRange(...spline.points);
    const ev = new SplineEvaluator(spline);
    const cap = Math.min(LIMITS.dxfCurvePoints, Math.max(0, this.pointBudget));
    const flat = flattenSpline(ev, this.tol, cap + 1);
    // null: past the cap; spend() then refuses it with the limit's sentence.
    this.spend(flat === null ? cap + 1 : flat.points.length, true);
    if (flat === null) return;
    addCurveExtents(this.ext, ev, flat);
    const pts: Vec2[] = flat.points;
    let closed = !!e.closed;
    const first = pts[0]!;
    const last = pts[pts.length - 1]!;
    if (pts.length > 2 && Math.hypot(last.x - first.x, last.y - first.y) <= this.tol * 1e-3) {
      pts.pop();
      closed = true;
    }
    this.paths.push({ layer, closed, points: pts });
    this.approximated('SPLINE', layer, how);
    this.counted(layer);
  }

  private point(e: IPointEntity, m: Xform, layer: string): void {
    const p = e.position;
    if (!p) {
      this.warn('POINT entities without a position were skipped.');
      return;
    }
    const v = this.vertex(m, p.x, p.y) as DxfPoint;
    v.layer = layer;
    this.ext.add(v.x, v.y);
    this.points.push(v);
    this.counted(layer);
  }

  private note(m: Xform, p: IPoint, height: number | undefined, text: string, layer: string): void {
    const v = this.vertex(m, p.x, p.y);
    const h = Number.isFinite(height) ? (height as number) : 0;
    // Height measured along the text's y direction after the insert's scaling.
    const scale = m.kind === 0 ? 1 : Math.hypot(m.c, m.d);
    this.notes.push({ text, x: v.x, y: v.y, height: h * scale, layer });
    this.counted(layer);
  }

  private textEntity(e: ITextEntity, m: Xform, layer: string, offset: number | undefined): void {
    const p = e.startPoint;
    if (!p) {
      this.warn('TEXT entities without an insertion point were skipped.');
      return;
    }
    let mm = m;
    if (offset !== undefined) {
      const [nx, ny, nz] = this.extrusion(offset);
      mm = this.inOcs(m, nx, ny, nz, p.z ?? 0);
    }
    this.note(mm, p, e.textHeight, textValue(e.text ?? ''), layer);
  }

  private mtext(e: IMtextEntity, m: Xform, layer: string): void {
    const p = e.position;
    if (!p) {
      this.warn('MTEXT entities without an insertion point were skipped.');
      return;
    }
    this.note(m, p, e.height, mtextValue(e.text ?? ''), layer);
  }

  private insert(e: IInsertEntity, m: Xform, layer: string, depth: number): void {
    // planExpansion has checked that the block exists and that blocks do not loop.
    const name = e.name;
    const block = this.blocks[name]!;
    const list = block.entities;
    if (!list || list.length === 0) return;
    const bscan = this.scan.blocks.get(name);
    const base = block.position ?? { x: 0, y: 0, z: 0 };
    const pos = e.position ?? { x: 0, y: 0, z: 0 };
    const sx = Number.isFinite(e.xScale) ? e.xScale : 1;
    const sy = Number.isFinite(e.yScale) ? e.yScale : 1;
    const rot = rotation(Number.isFinite(e.rotation) ? e.rotation : 0);
    const [cols, rows] = arrayCount(e);
    const dx = Number.isFinite(e.columnSpacing) ? e.columnSpacing : 0;
    const dy = Number.isFinite(e.rowSpacing) ? e.rowSpacing : 0;
    const n = e.extrusionDirection;
    const outer = this.inOcs(m, n?.x, n?.y, n?.z, pos.z ?? 0);
    // Block geometry: shift by −base point, scale, then (for MINSERT arrays) step by the
    // unscaled row and column spacing, rotate, and move to the insertion point
    // (DXF Reference, INSERT groups 10, 41–45, 50, 70, 71).
    const inner = Xform.scaling(sx, sy).then(Xform.translate(-base.x, -base.y));
    for (let r = 0; r < rows; r++) {
      for (let c = 0; c < cols; c++) {
        const local = Xform.translate(pos.x, pos.y)
          .then(rot)
          .then(Xform.translate(c * dx, r * dy))
          .then(inner);
        this.readList(list, bscan, outer.kind === 0 ? local : outer.then(local), layer, depth + 1);
      }
    }
  }

  approximations(unitLabel: string): string[] {
    const out: string[] = [];
    for (const a of this.approx.values()) {
      const what = a.count === 1 ? `1 ${a.type} entity` : `${a.count} ${a.type} entities`;
      out.push(
        `${what} on layer "${a.layer}" became ${a.count === 1 ? 'a polyline' : 'polylines'} within ${this.tol} ${unitLabel} chord error${a.how}.`,
      );
    }
    return out;
  }

  warnings(): string[] {
    const out: string[] = [];
    if (this.paperSpace > 0) {
      out.push(
        `${this.paperSpace} paper-space ${this.paperSpace === 1 ? 'entity was' : 'entities were'} left out; Gridset reads model space only.`,
      );
    }
    for (const [message, count] of this.warned) out.push(count > 1 && /were skipped\.$/.test(message) ? `${message} (${count})` : message);
    return out;
  }
}

function sortedCounts(map: Map<string, number>, byCount: boolean): { type: string; count: number }[] {
  const list = [...map].filter(([, n]) => n > 0).map(([type, count]) => ({ type, count }));
  return list.sort((a, b) => (byCount && b.count !== a.count ? b.count - a.count : a.type < b.type ? -1 : a.type > b.type ? 1 : 0));
}

/**
 * Reads an ASCII DXF drawing (R12 through current) into Gridset's outline, circles, points and
 * notes, in the drawing's own unit. Blocks are expanded; curves other than arcs become polylines
 * within CHORD_TOLERANCE; entity types Gridset does not read are counted in `unsupported`.
 * Throws DxfError when the file cannot be read, with a message for the user.
 */
export function inspectDxf(text: string, options: InspectDxfOptions = {}): DxfInspection {
  const maxEntities = options.maxEntities ?? DEFAULT_MAX_ENTITIES;
  if (typeof text !== 'string') throw new TypeError('inspectDxf expects the DXF file as a string.');
  // A byte-order mark would hide the first group code from dxf-parser (and with it the HEADER).
  const source = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (source.startsWith('AutoCAD Binary DXF')) {
    throw new DxfError('binary', 'This is a binary DXF file; Gridset reads ASCII DXF only. Save the drawing again as ASCII DXF.', { line: 1 });
  }
  if (/^AC10[0-9]{2}/.test(source)) {
    throw new DxfError('not-dxf', 'This looks like a DWG drawing, not a DXF file. Save or export it as ASCII DXF.', { line: 1 });
  }
  if (!/\S/.test(source)) throw new DxfError('empty', 'The file is empty: it holds no DXF data.');

  const scan = scanDxf(source, maxEntities);
  if (scan.entities === null) {
    throw new DxfError('no-entities', 'The drawing has no entities: the file has no ENTITIES section.');
  }
  if (scan.entities.total === 0) {
    throw new DxfError('no-entities', `The drawing has no entities: its ENTITIES section (line ${scan.entities.line}) is empty.`, {
      line: scan.entities.line,
    });
  }

  let parsed: IDxf;
  try {
    parsed = new DxfParser().parse(source) as IDxf;
  } catch (err) {
    const why = err instanceof Error ? err.message : String(err);
    throw new DxfError('malformed', `The DXF file could not be read: ${why.replace(/\.?$/, '.')}`);
  }
  const plan = planExpansion(parsed, scan, maxEntities);

  const header = parsed.header ?? {};
  const rawUnits = header['$INSUNITS'];
  const insunits = typeof rawUnits === 'number' && Number.isFinite(rawUnits) ? rawUnits : null;
  const unit: Unit | null = insunits === 1 ? 'in' : insunits === 4 ? 'mm' : null;
  const version = header['$ACADVER'];
  // Without a unit, keep to the finer of the two tolerances.
  const tol = CHORD_TOLERANCE[unit ?? 'in'];
  const unitLabel = unit ?? 'drawing units';

  const maxCoord = unit === 'in' ? LIMITS.coordinateMm / 25.4 : LIMITS.coordinateMm;
  const reader = new Reader(source, scan, parsed.blocks ?? {}, tol, maxCoord, unitLabel);
  reader.readList(parsed.entities, scan.entities, IDENTITY, null, 0);

  const unsupported = new Map(plan.unsupported);
  for (const [type, n] of reader.unsupported) unsupported.set(type, (unsupported.get(type) ?? 0) + n);

  const warnings: string[] = [];
  if (insunits !== null && unit === null && insunits !== 0) {
    const name = OTHER_UNITS[insunits];
    warnings.push(
      `$INSUNITS is ${insunits}${name ? ` (${name})` : ''}, a unit Gridset does not work in; the numbers are kept as written and the unit is left for you to choose.`,
    );
  }
  warnings.push(...reader.warnings());

  const ext = reader.ext;
  return {
    unit,
    insunits,
    version: typeof version === 'string' ? version : null,
    layers: [...reader.layers]
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
      .map(([name, c]) => ({ name, entities: c.n })),
    entities: scan.entities.total,
    entityTypes: sortedCounts(scan.entities.types, false),
    expandedEntities: plan.count,
    bbox: ext.empty ? null : { minX: ext.minX, minY: ext.minY, maxX: ext.maxX, maxY: ext.maxY },
    circles: reader.circles,
    unsupported: sortedCounts(unsupported, true),
    outline: { paths: reader.paths, circles: reader.circles },
    notes: reader.notes,
    points: reader.points,
    approximations: reader.approximations(unitLabel),
    warnings,
  };
}
