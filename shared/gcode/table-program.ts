import type { Unit } from '../schemas/common';
import type { Station } from '../schemas/template';
import { commentText, draftMarkLines } from './offsets';
import type { Block, PartProgram, Segment, XY } from './read-part-program';

/**
 * The whole-table program: one part's program written once per station (PRODUCT.md, "The
 * whole-table program"), in station order or tool order, skipped stations left out, the tool
 * raised to safe Z with cutter compensation and canned cycles cancelled before it crosses to the
 * next station or after a tool change. How a station's copy is carried there — every coordinate
 * rewritten, or a per-station offset with the part's own coordinates — is a StationFrame.
 */

export type ProgramOrder = 'station' | 'tool';

/** 48 stations × 20,000 blocks is about 1 M; a file many times that is not something to send a control. */
export const MAX_TABLE_BLOCKS = 4_000_000;

export interface TableProgramHeader {
  templateName: string;
  version: number | string;
  /** The pinned version's state: a version retired since the job was made is marked at the top. */
  state: string;
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

export type TableProgramResult = { ok: true; text: string } | { ok: false; message: string };

/** How one station's copy is made active and written. */
export interface StationFrame {
  /** Lines after the header and before the part's preamble (offset-setting blocks). */
  top: string[];
  /** Lines that make a station's coordinates active; written with the tool at rest, before the retract. */
  enter(s: Station): string[];
  /** Lines after the last copy that make the shared offset active again. */
  leave: string[];
  /** Z in the station's active coordinates of a height above the shared offset's Z0. */
  z(s: Station, shared: number): number;
  /** X Y in the station's active coordinates of a part point. */
  point(s: Station, q: XY): XY;
  /** A move or canned-cycle block of the part for one station (the first move of a copy gets its motion code). */
  move(b: Block, s: Station, forceMotion: boolean): string;
  /** A block without coordinates. */
  plain(b: Block): string;
}

export const DECIMALS: Record<Unit, number> = { in: 4, mm: 3 };

/** A length counted in the last written decimal (0.0001 in or 0.001 mm), so differences of written values are exact. */
export function counts(v: number, d: number): number {
  const q = Math.round(v * 10 ** d);
  return q === 0 ? 0 : q;
}

export function countText(q: number, d: number): string {
  const neg = q < 0;
  const s = String(Math.abs(q)).padStart(d + 1, '0');
  return `${neg ? '-' : ''}${s.slice(0, s.length - d)}.${s.slice(s.length - d)}`;
}

export const comment = (text: string) => `(${commentText(text)})`;

export function writeComments(b: Block): string {
  return b.comments.map((c) => ` ${comment(c)}`).join('');
}

/** A block's words as written (N, O and the program end left out), with a T word added to a tool change that lacks one. */
export function plainWords(b: Block, tool: number | null = null, keep: (letter: string, value: number) => boolean = () => true): string {
  const words: string[] = [];
  for (const w of b.words) if (keep(w.letter, w.value)) words.push(`${w.letter}${w.text}`);
  if (tool !== null && !b.words.some((w) => w.letter === 'T')) words.unshift(`T${tool}`);
  return `${words.join(' ')}${words.length || b.comments.length ? writeComments(b) : ''}`.trim();
}

/** Why a request cannot be written, before any of it is: a sentence, or null. */
export function refuseTableRequest(req: TableProgramRequest): string | null {
  const total = req.program.blocks.length * Math.max(1, req.stations.length);
  if (!req.stations.length) return 'Every station is skipped; leave at least one station to machine.';
  if (total > MAX_TABLE_BLOCKS) return `The whole-table program would hold about ${total.toLocaleString('en-US')} blocks, more than ${MAX_TABLE_BLOCKS.toLocaleString('en-US')}; skip stations or shorten the part program.`;
  return null;
}

/** The whole file at once (tests, the job package). */
export function writeTableProgram(req: TableProgramRequest, frame: StationFrame): TableProgramResult {
  const refused = refuseTableRequest(req);
  if (refused) return { ok: false, message: refused };
  return { ok: true, text: [...tableProgramChunks(req, frame)].join('') };
}

/**
 * The file in pieces of about one station's copy each, so a server can send it as it is written
 * and let other requests run between pieces. Call refuseTableRequest first.
 */
export function* tableProgramChunks(req: TableProgramRequest, frame: StationFrame): Generator<string> {
  const { program, unit, order, safeZ } = req;
  const d = DECIMALS[unit];
  const out: string[] = [];
  const flush = () => {
    const chunk = `${out.join('\n')}\n`;
    out.length = 0;
    return chunk;
  };
  const num = (v: number) => countText(counts(v, d), d);
  const h = req.header;

  out.push(
    ...draftMarkLines(h),
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
    ...frame.top,
  );

  const push = (line: string) => { if (line) out.push(line); };

  const transition = (seg: Segment, s: Station) => {
    const st = seg.before;
    const lengthH = seg.lengthH ?? st.lengthH;
    out.push('G40 G80', ...frame.enter(s));
    out.push(`G0 G90${lengthH !== null ? ` G43 H${lengthH}` : ''} Z${num(frame.z(s, safeZ))}`);
    if (seg.startXY) {
      const e = frame.point(s, seg.startXY);
      out.push(`G0 X${num(e.x)} Y${num(e.y)}`);
    }
    out.push(st.spindle === 5 ? 'M5' : `${st.speed !== null ? `S${st.speed} ` : ''}M${st.spindle}`);
    if (st.mist) out.push('M7');
    if (st.flood) out.push('M8');
    if (!st.mist && !st.flood) out.push('M9');
    const modal = [st.abs ? '' : 'G91', st.retract ? `G${st.retract}` : '', st.feed !== null ? `F${st.feed}` : ''].filter(Boolean).join(' ');
    if (modal) out.push(modal);
  };

  /** The segment's blocks from `from` on, for one station; the first move gets the transition before it. */
  const body = (seg: Segment, from: number, s: Station) => {
    for (let i = from; i < seg.end; i++) {
      const b = program.blocks[i]!;
      if (i === seg.firstMove) transition(seg, s);
      push(b.kind === 'move' || b.kind === 'cycle' ? frame.move(b, s, i === seg.firstMove) : frame.plain(b));
    }
  };

  const marker = (seg: Segment, k: number, s: Station) =>
    out.push(comment(`STATION ${s.number} ${s.id} - ${seg.tool !== null ? `TOOL ${seg.tool}` : 'TOOL IN SPINDLE'} - SEGMENT ${k + 1} OF ${program.segments.length}`));

  for (let i = 0; i < program.preamble; i++) push(plainWords(program.blocks[i]!));
  const segs = program.segments;
  const CHUNK_LINES = 4096;
  if (order === 'station') {
    for (const s of req.stations) {
      for (let k = 0; k < segs.length; k++) {
        const seg = segs[k]!;
        marker(seg, k, s);
        // A control refuses a tool change with cutter compensation on (LinuxCNC); the part's last segment may leave it on for M30 to clear.
        if (seg.toolChange) out.push('G40 G80', plainWords(program.blocks[seg.first]!, seg.tool));
        body(seg, seg.toolChange ? seg.first + 1 : seg.first, s);
        if (out.length >= CHUNK_LINES) yield flush();
      }
    }
  } else {
    for (let k = 0; k < segs.length; k++) {
      const seg = segs[k]!;
      if (seg.toolChange) {
        out.push(comment(`TOOL ${seg.tool} - SEGMENT ${k + 1} OF ${segs.length}`), 'G40 G80', plainWords(program.blocks[seg.first]!, seg.tool));
      }
      for (const s of req.stations) {
        marker(seg, k, s);
        body(seg, seg.toolChange ? seg.first + 1 : seg.first, s);
        if (out.length >= CHUNK_LINES) yield flush();
      }
    }
  }
  out.push(comment('END OF THE WHOLE-TABLE PROGRAM'), 'G40 G80', ...frame.leave, `G0 G90 Z${num(safeZ)}`, 'M5', 'M9', 'M30');
  yield flush();
}
