import { LIMITS } from '../../../shared/schemas/limits';
import { DxfError } from '../dxf-error';
import { bump, type ContainerScan, PARSER_ENTITY_TYPES, READ_ENTITY_TYPES, where } from './containers';
import type { GroupTokenizer } from './tokenizer';

/** Group codes dxf-parser 1.1.2 reads inside an LWPOLYLINE vertex (x, y, z, widths, bulge). */
const LW_VERTEX_CODES: ReadonlySet<number> = new Set([10, 20, 30, 40, 41, 42]);

/**
 * The structure scan's view of one entity at a time: counts it, checks the group codes that
 * would make dxf-parser 1.1.2 loop or allocate without bound (LWPOLYLINE vertex counts and
 * vertices, POLYLINE without SEQEND), and flags entities whose groups dxf-parser drops
 * (non-default extrusion of CIRCLE, ELLIPSE and TEXT; rational SPLINE weights; LWPOLYLINE vertex
 * identifiers) so the reader re-reads them.
 */
export class EntityScan {
  /** Type of the entity being read, null between entities. */
  type: string | null = null;
  private line = 0;
  private offset = 0;
  private parsed = -1;
  private paper = false;
  private reread = false;
  private lwCount = 0;
  private lwListed = 0;
  private lwPrev = -1;
  private total = 0;
  private polylineOpen = 0; // line of a POLYLINE waiting for its SEQEND
  private attribsOpen = false; // an INSERT may be followed by ATTRIBs and a SEQEND
  private attribsPaper = false;

  constructor(private readonly maxEntities: number) {}

  /** Closes the entity being read, if any, into container `c`. */
  finish(c: ContainerScan | null): void {
    const type = this.type;
    if (type === null || c === null) return;
    if (type === 'LWPOLYLINE' && this.lwCount > this.lwListed) {
      throw new DxfError(
        'malformed',
        `The LWPOLYLINE at line ${this.line} in ${where(c)} declares ${this.lwCount.toLocaleString('en-US')} vertices (group 90) but lists ${this.lwListed}; the file is damaged.`,
        { line: this.line, block: c.block ?? undefined },
      );
    }
    if (this.paper) c.paperSpace++;
    else if (!READ_ENTITY_TYPES.has(type)) bump(c.unsupported, type);
    if (this.reread && this.parsed >= 0) {
      c.reread.set(this.parsed, this.offset);
      c.lines.set(this.parsed, this.line);
    }
    if (type === 'POLYLINE') this.polylineOpen = this.line;
    else if (type === 'INSERT') {
      this.attribsOpen = true;
      this.attribsPaper = this.paper;
    }
    this.type = null;
  }

  /**
   * Whether a "0" group `value` at `line` is a part of the entity before it (a POLYLINE's VERTEX
   * or SEQEND, an INSERT's ATTRIB or SEQEND) rather than the start of something new.
   */
  isPart(value: string, line: number, c: ContainerScan | null): boolean {
    if (this.polylineOpen !== 0) {
      if (value === 'VERTEX') return true;
      if (value === 'SEQEND') {
        this.polylineOpen = 0;
        return true;
      }
      throw new DxfError(
        'malformed',
        `The POLYLINE at line ${this.polylineOpen} is not closed by SEQEND: line ${line} starts ${value || 'an unnamed group'} instead.`,
        { line: this.polylineOpen },
      );
    }
    if (this.attribsOpen) {
      if (value === 'ATTRIB') {
        if (!this.attribsPaper) bump(c!.unsupported, 'ATTRIB');
        return true;
      }
      this.attribsOpen = false;
      if (value === 'SEQEND') return true;
    }
    return false;
  }

  /** An entity of `type` starts at `line` (its keyword) and text offset `offset` (its "0" group). */
  start(c: ContainerScan, type: string, line: number, offset: number): void {
    if (type === 'VERTEX' || type === 'SEQEND') return; // stray parts; dxf-parser skips them too
    if (type === 'ATTRIB') {
      bump(c.unsupported, type);
      return;
    }
    c.total++;
    this.total++;
    if (this.total > this.maxEntities) {
      throw new DxfError(
        'too-many-entities',
        `The drawing has more than ${this.maxEntities.toLocaleString('en-US')} entities (counting block definitions), more than Gridset reads from one file; the limit was passed at line ${line}.`,
        { line },
      );
    }
    bump(c.types, type);
    this.type = type;
    this.line = line;
    this.offset = offset;
    this.parsed = PARSER_ENTITY_TYPES.has(type) ? c.parsed++ : -1;
    this.paper = false;
    this.reread = false;
    this.lwCount = 0;
    this.lwListed = 0;
    this.lwPrev = -1;
    if (type === 'INSERT') c.lines.set(this.parsed, line);
  }

  /** A group inside the entity; `topLevel` for the ENTITIES section (paper space counts there). */
  group(c: ContainerScan, topLevel: boolean, tok: GroupTokenizer): void {
    const type = this.type;
    const code = tok.code;
    // dxf-parser 1.1.2 reads an LWPOLYLINE vertex until a code it does not know, then steps back
    // two groups: right after a group 10 that lands on the 10 again, and it loops for ever.
    if (type === 'LWPOLYLINE') {
      if (this.lwPrev === 10 && !LW_VERTEX_CODES.has(code)) {
        throw new DxfError(
          'malformed',
          `The LWPOLYLINE at line ${this.line} in ${where(c)} has a vertex x (group 10) at line ${tok.codeLine - 2} followed by group ${code} instead of its y (group 20); the file is damaged.`,
          { line: this.line, block: c.block ?? undefined },
        );
      }
      this.lwPrev = code;
    }

    // Group codes inside an entity that dxf-parser 1.1.2 does not keep or mishandles.
    if (code === 67) {
      if (topLevel) this.paper = tok.value() === '1';
    } else if (code === 210 || code === 220 || code === 230) {
      // Extrusion direction (DXF Reference, "Object Coordinate Systems"); default (0, 0, 1).
      if (type === 'CIRCLE' || type === 'ELLIPSE' || type === 'TEXT') {
        const v = tok.number();
        if (code === 230 ? v !== 1 : v !== 0) this.reread = true;
      }
    } else if (type === 'SPLINE') {
      if (code === 41) this.reread = true; // weights of a rational spline
    } else if (type === 'LWPOLYLINE') {
      if (code === 90) {
        this.lwCount = tok.number();
        // dxf-parser makes as many vertices as group 90 declares, listed or not: bound it first.
        if (this.lwCount > LIMITS.dxfPolylineVertices) {
          throw new DxfError(
            'too-large',
            `The LWPOLYLINE at line ${this.line} in ${where(c)} declares ${this.lwCount.toLocaleString('en-US')} vertices (group 90); Gridset reads polylines of up to ${LIMITS.dxfPolylineVertices.toLocaleString('en-US')}. Simplify it or split it.`,
            { line: this.line, block: c.block ?? undefined },
          );
        }
      } else if (code === 10) this.lwListed++;
      else if (code === 91) this.reread = true; // vertex identifier, R2010+
      if (code === 10 && !(this.lwCount > 0)) {
        throw new DxfError(
          'malformed',
          `The LWPOLYLINE at line ${this.line} in ${where(c)} lists vertices, but its vertex count (group 90) is missing or zero.`,
          { line: this.line, block: c.block ?? undefined },
        );
      }
    }
  }
}
