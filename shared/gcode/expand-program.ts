import type { Unit } from '../schemas/common';
import type { Station } from '../schemas/template';
import { cosSinDeg } from '../geometry/transform';
import { commentText } from './offsets';
import type { Block, PartProgram, Segment, XY } from './read-part-program';

/**
 * The whole-table program, "expanded" family: one part's program written once per station with
 * every coordinate carried to that station, so only the shared work offset is ever active.
 * A part point p goes to R(C)·p + (X, Y) of the station, Z to Z + station Z (PRODUCT.md, "The
 * whole-table program"; rotation counter-clockwise seen from +Z, as G10 L2 R in LinuxCNC).
 * Absolute X Y (moves, arc ends, canned-cycle holes) are turned and moved; absolute Z and canned
 * R planes are raised by the station's Z; incremental words (I J, G91 moves, G91 cycle X Y) are
 * only turned. A rigid turn keeps G2/G3 directions and cutter-compensation sides as they are.
 */

export type ProgramOrder = 'station' | 'tool';

/** 48 stations × 20,000 blocks is about 1 M; a file many times that is not something to send a control. */
export const MAX_TABLE_BLOCKS = 4_000_000;

export interface TableProgramHeader {
  templateName: string;
  version: number | string;
  contentHash: string;
  jobId: number;
  jobName: string;
  partNumber: string;
  programSha256: string;
  family: string;
  skipped: number[];
}

export interface TableProgramRequest {
  program: PartProgram;
  unit: Unit;
  /** The stations to machine, in numbering order; skipped ones already left out. */
  stations: readonly Station[];
  order: ProgramOrder;
  /** Height above the shared offset's Z0 every station change and tool change retracts to. */
  safeZ: number;
  header: TableProgramHeader;
}

export type TableProgramResult = { ok: true; text: string; blocks: number } | { ok: false; message: string };

interface Placed {
  station: Station;
  cos: number;
  sin: number;
}

const DECIMALS: Record<Unit, number> = { in: 4, mm: 3 };

/** A length counted in the last written decimal (0.0001 in or 0.001 mm), so differences of written values are exact. */
function counts(v: number, d: number): number {
  const q = Math.round(v * 10 ** d);
  return q === 0 ? 0 : q;
}

function countText(q: number, d: number): string {
  const neg = q < 0;
  const s = String(Math.abs(q)).padStart(d + 1, '0');
  return `${neg ? '-' : ''}${s.slice(0, s.length - d)}.${s.slice(s.length - d)}`;
}

/** Table X and Y of a part point at a station, counted in the last written decimal. */
function qx(p: Placed, q: XY, d: number): number {
  return counts(p.station.x + p.cos * q.x - p.sin * q.y, d);
}
function qy(p: Placed, q: XY, d: number): number {
  return counts(p.station.y + p.sin * q.x + p.cos * q.y, d);
}

/** Part X Y to table X Y for one station. */
export function toTable(p: XY, s: { x: number; y: number; c: number }): XY {
  const { cos, sin } = cosSinDeg(s.c);
  return { x: s.x + cos * p.x - sin * p.y, y: s.y + sin * p.x + cos * p.y };
}

const comment = (text: string) => `(${commentText(text)})`;

function writeComments(b: Block): string {
  return b.comments.map((c) => ` ${comment(c)}`).join('');
}

export function expandedProgram(req: TableProgramRequest): TableProgramResult {
  const { program, unit, order, safeZ } = req;
  const d = DECIMALS[unit];
  const total = program.blocks.length * Math.max(1, req.stations.length);
  if (!req.stations.length) return { ok: false, message: 'Every station is skipped; leave at least one station to machine.' };
  if (total > MAX_TABLE_BLOCKS) return { ok: false, message: `The whole-table program would hold about ${total.toLocaleString('en-US')} blocks, more than ${MAX_TABLE_BLOCKS.toLocaleString('en-US')}; skip stations or shorten the part program.` };
  const placed: Placed[] = req.stations.map((station) => ({ station, ...cosSinDeg(station.c) }));
  const num = (v: number) => countText(counts(v, d), d);
  const out: string[] = [];
  const h = req.header;

  out.push(
    comment('GRIDSET WHOLE-TABLE PROGRAM'),
    comment(`TEMPLATE: ${h.templateName} VERSION ${h.version}`),
    comment(`CONTENT HASH: ${h.contentHash}`),
    comment(`JOB ${h.jobId}: ${h.jobName} - PART ${h.partNumber}`),
    comment(`PART PROGRAM SHA-256: ${h.programSha256}`),
    comment(`FAMILY: ${h.family}`),
    comment(order === 'tool' ? 'ORDER: TOOL - EACH TOOL ONCE, OVER EVERY STATION BEFORE THE NEXT TOOL' : 'ORDER: STATION - EACH STATION WHOLE IN TURN'),
    comment(`STATIONS: ${req.stations.map((s) => s.number).join(' ')}`),
    comment(`SKIPPED STATIONS: ${h.skipped.length ? h.skipped.join(' ') : 'NONE'}`),
    comment(`UNIT: ${unit === 'in' ? 'INCH - G20' : 'MILLIMETER - G21'}`),
    comment(`Z0: THE SHARED WORK OFFSET Z0; EACH PART Z0 IS AT ITS STATION Z`),
    comment(`SAFE Z: ${num(safeZ)} ${unit.toUpperCase()} ABOVE THE SHARED OFFSET Z0 BEFORE EVERY STATION CHANGE AND TOOL CHANGE`),
    comment('CAUTION: ADVICE FROM THE ENTERED DATA - PROVE OUT WITHOUT STOCK BEFORE THE FIRST RUN'),
    comment('CAUTION: THE OPERATOR CHECKS EVERY CLAMP BEFORE CYCLE START'),
    comment("CAUTION: FOLLOW THE MACHINE BUILDER'S INSTRUCTIONS AND CHECK EVERY BLOCK AGAINST THE CONTROL'S MANUAL"),
    `${unit === 'in' ? 'G20' : 'G21'} G17 G40 G80 G90`,
  );

  const plain = (b: Block, tool: number | null = null): string => {
    const words = b.words.map((w) => `${w.letter}${w.text}`);
    if (tool !== null && !b.words.some((w) => w.letter === 'T')) words.unshift(`T${tool}`);
    return `${words.join(' ')}${writeComments(b)}`.trim();
  };

  const move = (b: Block, p: Placed, forceMotion: boolean): string => {
    const { station: s, cos, sin } = p;
    const parts: string[] = [];
    if (forceMotion && !b.explicitMotion && b.motion !== null) parts.push(`G${b.motion}`);
    const isCycle = b.kind === 'cycle';
    let xyDone = false;
    let ijDone = false;
    for (const w of b.words) {
      let word: string;
      switch (w.letter) {
        case 'X':
        case 'Y': {
          if (xyDone) continue;
          xyDone = true;
          if (b.abs) {
            word = `X${countText(qx(p, b.end!, d), d)} Y${countText(qy(p, b.end!, d), d)}`;
          } else if (isCycle) {
            let dx = 0;
            let dy = 0;
            for (const v of b.words) {
              if (v.letter === 'X') dx = v.value;
              else if (v.letter === 'Y') dy = v.value;
            }
            word = `X${num(cos * dx - sin * dy)} Y${num(sin * dx + cos * dy)}`;
          } else {
            word = `X${countText(qx(p, b.end!, d) - qx(p, b.start!, d), d)} Y${countText(qy(p, b.end!, d) - qy(p, b.start!, d), d)}`;
          }
          break;
        }
        case 'I':
        case 'J':
          if (ijDone) continue;
          ijDone = true;
          word = `I${countText(qx(p, b.center!, d) - qx(p, b.start!, d), d)} J${countText(qy(p, b.center!, d) - qy(p, b.start!, d), d)}`;
          break;
        case 'Z':
          word = b.abs ? `Z${num(w.value + s.z)}` : `Z${w.text}`;
          break;
        case 'R':
          word = isCycle && b.abs ? `R${num(w.value + s.z)}` : `R${w.text}`;
          break;
        default:
          word = `${w.letter}${w.text}`;
      }
      parts.push(word);
    }
    const line = parts.join(' ');
    return b.comments.length ? `${line}${writeComments(b)}` : line;
  };

  const transition = (seg: Segment, p: Placed) => {
    const st = seg.before;
    const lengthH = seg.lengthH ?? st.lengthH;
    out.push('G40 G80');
    out.push(`G0 G90${lengthH !== null ? ` G43 H${lengthH}` : ''} Z${num(safeZ)}`);
    if (seg.startXY) {
      const e = toTable(seg.startXY, p.station);
      out.push(`G0 X${num(e.x)} Y${num(e.y)}`);
    }
    out.push(st.spindle === 5 ? 'M5' : `${st.speed !== null ? `S${st.speed} ` : ''}M${st.spindle}`);
    if (st.mist) out.push('M7');
    if (st.flood) out.push('M8');
    if (!st.mist && !st.flood) out.push('M9');
    const modal = [st.abs ? '' : 'G91', st.retract ? `G${st.retract}` : '', st.feed !== null ? `F${st.feed}` : ''].filter(Boolean).join(' ');
    if (modal) out.push(modal);
  };

  /** Blocks [from, to) of the program for one station; the first move gets the transition before it. */
  const body = (seg: Segment, from: number, p: Placed) => {
    for (let i = from; i < seg.end; i++) {
      const b = program.blocks[i]!;
      if (i === seg.firstMove) transition(seg, p);
      if (b.kind === 'move' || b.kind === 'cycle') out.push(move(b, p, i === seg.firstMove));
      else {
        const line = plain(b);
        if (line) out.push(line);
      }
    }
  };

  const marker = (seg: Segment, k: number, p: Placed) =>
    out.push(comment(`STATION ${p.station.number} ${p.station.id} - ${seg.tool !== null ? `TOOL ${seg.tool}` : 'TOOL IN SPINDLE'} - SEGMENT ${k + 1} OF ${program.segments.length}`));

  for (let i = 0; i < program.preamble; i++) {
    const line = plain(program.blocks[i]!);
    if (line) out.push(line);
  }
  const segs = program.segments;
  if (order === 'station') {
    for (const p of placed) {
      segs.forEach((seg, k) => {
        marker(seg, k, p);
        if (seg.toolChange) out.push(plain(program.blocks[seg.first]!, seg.tool));
        body(seg, seg.toolChange ? seg.first + 1 : seg.first, p);
      });
    }
  } else {
    segs.forEach((seg, k) => {
      if (seg.toolChange) {
        out.push(comment(`TOOL ${seg.tool} - SEGMENT ${k + 1} OF ${segs.length}`));
        out.push(plain(program.blocks[seg.first]!, seg.tool));
      }
      for (const p of placed) {
        marker(seg, k, p);
        body(seg, seg.toolChange ? seg.first + 1 : seg.first, p);
      }
    });
  }
  out.push(comment('END OF THE WHOLE-TABLE PROGRAM'), 'G40 G80', `G0 G90 Z${num(safeZ)}`, 'M5', 'M9', 'M30');
  return { ok: true, text: `${out.join('\n')}\n`, blocks: out.length };
}
