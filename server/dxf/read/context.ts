// What the DXF reader accumulates while it walks the entities (outline, circles, points, notes,
// extents, layer counts, warnings), and the checks every entity reader shares: the point budget,
// coordinate range, finite numbers, and the object coordinate system of an entity.
import type { IBlock } from 'dxf-parser';
import { Extents } from '../../../shared/geometry/extents';
import { ocsToWorldXY } from '../../../shared/geometry/ocs';
import type { Affine } from '../../../shared/geometry/transform';
import type { OutlinePath, OutlineVertex } from '../../../shared/schemas/geometry';
import { LIMITS } from '../../../shared/schemas/limits';
import { DxfError } from '../dxf-error';
import type { DxfCircle, DxfNote, DxfPoint } from './types';
import type { DxfScan } from './containers';
import { readEntityGroups } from './tokenizer';

/** What one reading of a drawing gathers, and the checks every entity reader goes through. */
export class ReadContext {
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
  paperSpace = 0;
  misaligned = false;
  // The entity being read, for error messages.
  curType = '';
  curLayer = '';

  /** Points left for curves and polylines of the whole drawing (LIMITS.dxfPoints). */
  pointBudget: number = LIMITS.dxfPoints;

  constructor(
    readonly text: string,
    readonly scan: DxfScan,
    readonly blocks: Record<string, IBlock>,
    readonly tol: number,
    /** Largest |coordinate| and radius accepted, in the drawing's unit. */
    readonly maxCoord: number,
    readonly unitLabel: string,
  ) {}

  private get entityName(): string {
    return `${/^[AEIOU]/.test(this.curType) ? 'An' : 'A'} ${this.curType} entity`;
  }

  /** Counts n points against the drawing's budget before they are made; one curve has a limit of its own. */
  spend(n: number, curve: boolean): void {
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
  inRange(...values: number[]): void {
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

  approximated(type: string, layer: string, how: string): void {
    const key = `${type}\u0000${layer}\u0000${how}`;
    const a = this.approx.get(key);
    if (a) a.count++;
    else this.approx.set(key, { type, layer, how, count: 1 });
  }

  counted(layer: string): void {
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

  bad(): never {
    throw new DxfError(
      'malformed',
      `${this.entityName} on layer "${this.curLayer}" has a coordinate that is not a finite number.`,
    );
  }

  /** Point p through m, checked finite. */
  vertex(m: Affine, x: number, y: number): OutlineVertex {
    const v =
      m.kind === 0 ? { x, y } : { x: m.a * x + m.c * y + m.e, y: m.b * x + m.d * y + m.f };
    if (!(v.x - v.x === 0 && v.y - v.y === 0)) this.bad();
    this.inRange(v.x, v.y);
    return v;
  }


  /** Extrusion direction re-read from the text (the scan flags every non-default one dxf-parser drops). */
  extrusion(offset: number): [number, number, number] {
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

  /** m ∘ OCS map of an entity whose extrusion direction is re-read from the text at `offset`; m when there is none. */
  inRereadOcs(m: Affine, offset: number | undefined, elevation: number): Affine {
    if (offset === undefined) return m;
    const [x, y, z] = this.extrusion(offset);
    return this.inOcs(m, x, y, z, elevation);
  }

  /**
   * m ∘ OCS map of an entity with extrusion (x, y, z), noting a tilted one; m itself for the
   * default (0, 0, 1) or a missing direction.
   */
  inOcs(m: Affine, x: number | undefined, y: number | undefined, z: number | undefined, elevation: number): Affine {
    if ((x === undefined || x === 0) && (y === undefined || y === 0) && (z === undefined || z === 1)) return m;
    const o = ocsToWorldXY(Number.isFinite(x) ? x! : 0, Number.isFinite(y) ? y! : 0, Number.isFinite(z) ? z! : 1, elevation);
    if (o === null) return m;
    if (Math.abs(x ?? 0) > 1e-12 || Math.abs(y ?? 0) > 1e-12) {
      this.warn('Some entities lie in tilted planes (extrusion direction not along Z); they were projected onto the XY plane.');
    }
    return m.kind === 0 ? o : m.then(o);
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
