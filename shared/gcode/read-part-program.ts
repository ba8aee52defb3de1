import type { Unit } from '../schemas/common';
import { lineWords, type Word } from './program-words';
import { ALLOWED_G, ALLOWED_LETTERS, ALLOWED_M, G_REASON, MOTION } from './program-subset';
import { emptyBounds, include, includeArc } from './program-extents';

/**
 * Reads one part's program (program zero at the part's datum on its station) and checks it
 * against the subset Gridset can carry to every station (README, "Whole-table program"). Words
 * mean what the LinuxCNC G-code reference and NISTIR 6556 say: G2/G3 centers by I J offsets from
 * the start (incremental arc distance, the LinuxCNC default) or by R; canned cycles G73 and
 * G81–G89 take X Y at the hole, R the retract plane, Z the depth (under G91: R from the start Z,
 * Z from R, X Y repeated L times); G28 and G53 here only ever lift Z.
 */

export const MAX_PROGRAM_LINES = 200_000;
/** About 40 characters a line at the line limit; a file larger than this is not one part's program. */
export const MAX_PROGRAM_BYTES = 8 * 1024 * 1024;

export interface XY { x: number; y: number }
export interface Extents { min: { x: number; y: number; z: number }; max: { x: number; y: number; z: number } }

export type BlockKind = 'plain' | 'move' | 'cycle' | 'lift';

export interface Block {
  line: number;
  words: Word[];
  comments: string[];
  kind: BlockKind;
  /** Motion mode in force for the block (after its own codes): 0–3, 73, 81–89, or null after G80. */
  motion: number | null;
  /** The block writes its own motion code. */
  explicitMotion: boolean;
  abs: boolean;
  hasXY: boolean;
  /** Part position in X Y before and after the block, when known. */
  start: XY | null;
  end: XY | null;
  /** Arc center in part coordinates (I J form). */
  center: XY | null;
  /** Tool number of a tool-change (M6) block. */
  tool: number | null;
}

export interface ModalState {
  abs: boolean;
  feed: string | null;
  retract: 98 | 99 | null;
  spindle: 3 | 4 | 5;
  speed: string | null;
  mist: boolean;
  flood: boolean;
  /** H of the active tool length offset, or null under G49. */
  lengthH: number | null;
}

export interface Segment {
  /** Index of the segment's first block: its tool change, or the first move of a program without one. */
  first: number;
  /** One past the last block. */
  end: number;
  toolChange: boolean;
  tool: number | null;
  /** Index of the first move of the segment, or -1 when it has none. */
  firstMove: number;
  /** State just before the first move: restored on every station's copy. */
  before: ModalState;
  /** Where the copy starts: the part position before the first move, or the target of its first rapid X Y. */
  startXY: XY | null;
  /** H of the segment's first G43, applied on the retract so safe Z means the same for the new tool. */
  lengthH: number | null;
}

export interface PartProgramSummary {
  unit: Unit;
  unitDeclared: boolean;
  lines: number;
  blocks: number;
  toolChanges: { tool: number; line: number }[];
  tools: number[];
  extents: Extents | null;
  workOffset: string | null;
  feedMoves: number;
  arcs: number;
  holes: number;
  segments: number;
}

export interface PartProgram {
  blocks: Block[];
  /** Blocks before the first segment (units, plane, work offset): written once at the top. */
  preamble: number;
  segments: Segment[];
  summary: PartProgramSummary;
}

export interface ProgramRefusal { line: number | null; message: string }
export type ReadResult = { ok: true; program: PartProgram } | { ok: false; error: ProgramRefusal };

const gKey = (w: Word) => String(Number(w.text));
const fail = (line: number | null, message: string): ReadResult => ({ ok: false, error: { line, message } });

/**
 * Reads the program text. `unit` is the job's: G20/G21 in the program must agree with it.
 * Every refusal names the line and says what to change; nothing is partly read.
 */
export function readPartProgram(text: string, unit: Unit): ReadResult {
  if (text.length > MAX_PROGRAM_BYTES) return fail(null, `The part program is ${(text.length / 1048576).toFixed(1)} MB; one part's program may be at most ${MAX_PROGRAM_BYTES / 1048576} MB.`);
  let lineCount = 1;
  for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) if (++lineCount > MAX_PROGRAM_LINES + 1) break;
  if (text.endsWith('\n')) lineCount--;
  if (lineCount > MAX_PROGRAM_LINES) return fail(null, `The part program has more than ${MAX_PROGRAM_LINES.toLocaleString('en-US')} lines; split it or post it with fewer points.`);
  const lines = text.split(/\r?\n/);
  if (lines.length && lines[lines.length - 1] === '') lines.pop();

  const blocks: Block[] = [];
  const st: ModalState = { abs: true, feed: null, retract: null, spindle: 5, speed: null, mist: false, flood: false, lengthH: null };
  let motion: number | null = null;
  let comp = 40;
  let selected: number | null = null;
  let workOffset: string | null = null;
  let workOffsetLine = 0;
  let unitDeclared = false;
  let x: number | null = null;
  let y: number | null = null;
  let z: number | null = null;
  const bounds = emptyBounds();
  const segments: Segment[] = [];
  const toolChanges: { tool: number; line: number }[] = [];
  let feedMoves = 0;
  let arcs = 0;
  let holes = 0;
  let ended = false;
  let sawM6Line = 0;
  // R and Z of canned cycles are kept from one cycle block to the next (LinuxCNC "Canned Cycles", sticky words).
  let cycleR: number | null = null;
  let cycleZ: number | null = null;

  for (let li = 0; li < lines.length && !ended; li++) {
    const lineNo = li + 1;
    const raw = lines[li]!;
    if (!/^[\x20-\x7E\t\r]*$/.test(raw)) return fail(lineNo, `Line ${lineNo} holds a character that is not plain ASCII; G-code is written in ASCII.`);
    const read = lineWords(raw);
    if (!read.ok) return fail(lineNo, `Line ${lineNo}: ${read.message}`);
    const { words, comments, percent } = read.line;
    if (percent) continue;
    if (!words.length && !comments.length) continue;
    const seen = new Set<string>();
    const gs: Word[] = [];
    const ms: Word[] = [];
    const get: Record<string, Word | undefined> = {};
    for (const w of words) {
      if (!ALLOWED_LETTERS.has(w.letter)) {
        const what = 'ABC'.includes(w.letter) ? 'rotary axes' : 'UVW'.includes(w.letter) ? 'secondary linear axes' : w.letter === 'K' ? 'K words (arcs outside G17, G87 back boring)' : `${w.letter} words`;
        return fail(lineNo, `Line ${lineNo}: ${what} are not in the supported subset (${w.letter}${w.text}).`);
      }
      if (w.letter === 'G') { gs.push(w); continue; }
      if (w.letter === 'M') { ms.push(w); continue; }
      if (w.letter === 'O') {
        if (words[0] !== w || words.length > 1) return fail(lineNo, `Line ${lineNo}: an O word may only name the program on a line of its own.`);
        continue;
      }
      if (seen.has(w.letter)) return fail(lineNo, `Line ${lineNo} has two ${w.letter} words; a block takes each letter once.`);
      seen.add(w.letter);
      get[w.letter] = w;
    }
    if (words.length === 1 && words[0]!.letter === 'O') continue;
    for (const g of gs) {
      const key = gKey(g);
      if (!ALLOWED_G.has(g.value) || !Number.isInteger(g.value)) {
        const reason = G_REASON[key];
        if (key === '10' || key === '92' || key === '68') return fail(lineNo, `Line ${lineNo}: G${key} is not allowed inside the part program: ${reason}.`);
        return fail(lineNo, `Line ${lineNo}: G${key} is not in the supported subset${reason ? `: ${reason}` : ' (README, "Whole-table program")'}.`);
      }
    }
    for (const m of ms) {
      if (m.value === 98 || m.value === 99) return fail(lineNo, `Line ${lineNo}: subprogram calls (M${m.value}) are not supported: post the part program with every move written out.`);
      if (!ALLOWED_M.has(m.value) || !Number.isInteger(m.value)) return fail(lineNo, `Line ${lineNo}: M${m.text} is not in the supported subset (README, "Whole-table program").`);
    }
    const gv = new Set(gs.map((g) => g.value));
    const mv = new Set(ms.map((m) => m.value));
    const motionCodes = gs.filter((g) => MOTION.has(g.value));
    if (motionCodes.length > 1) return fail(lineNo, `Line ${lineNo} has two motion codes (${motionCodes.map((g) => `G${g.text}`).join(', ')}); write one per block.`);
    const nonModal = gs.filter((g) => g.value === 4 || g.value === 28 || g.value === 53);
    if (nonModal.length > 1) return fail(lineNo, `Line ${lineNo} combines ${nonModal.map((g) => `G${g.text}`).join(' and ')}; write them in separate blocks.`);

    // Modal settings, in the order the interpreter applies them (LinuxCNC "G-code order of execution").
    if (get.F) st.feed = get.F.text;
    if (get.S) st.speed = get.S.text;
    if (get.T) selected = get.T.value;
    let tool: number | null = null;
    if (mv.has(6)) {
      tool = get.T ? get.T.value : selected;
      if (tool === null) return fail(lineNo, `Line ${lineNo}: M6 with no tool selected; write T and the tool number on the tool change.`);
      if (comp !== 40) return fail(lineNo, `Line ${lineNo}: cutter compensation is still on at the tool change; cancel it with G40 before M6.`);
      if (motion !== null && motion > 3) return fail(lineNo, `Line ${lineNo}: a canned cycle is still active at the tool change; cancel it with G80 before M6.`);
      if (get.X || get.Y || get.Z || gv.has(28) || gv.has(53)) return fail(lineNo, `Line ${lineNo}: a tool change block holds a move; put the tool change in a block of its own.`);
      toolChanges.push({ tool, line: lineNo });
      sawM6Line = lineNo;
    }
    if (mv.has(3)) st.spindle = 3;
    if (mv.has(4)) st.spindle = 4;
    if (mv.has(5)) st.spindle = 5;
    if (mv.has(7)) st.mist = true;
    if (mv.has(8)) st.flood = true;
    if (mv.has(9)) { st.mist = false; st.flood = false; }
    if (gv.has(20) || gv.has(21)) {
      const u: Unit = gv.has(20) ? 'in' : 'mm';
      if (gv.has(20) && gv.has(21)) return fail(lineNo, `Line ${lineNo} asks for both G20 and G21; choose one.`);
      if (u !== unit) return fail(lineNo, `Line ${lineNo}: the program is in ${u === 'in' ? 'inches (G20)' : 'millimetres (G21)'} but the job's template is in ${unit}; post the part program in ${unit}.`);
      unitDeclared = true;
    }
    if (gv.has(40)) comp = 40;
    if (gv.has(41)) comp = 41;
    if (gv.has(42)) comp = 42;
    if (gv.has(43)) {
      if (!get.H) return fail(lineNo, `Line ${lineNo}: G43 needs its H word (the tool length offset number).`);
      st.lengthH = get.H.value;
    }
    if (gv.has(49)) st.lengthH = null;
    for (const g of gs) {
      if (g.value >= 54 && g.value <= 59) {
        const code = `G${g.value}`;
        if (workOffset && workOffset !== code) return fail(lineNo, `Line ${lineNo}: the program selects ${code} after ${workOffset} on line ${workOffsetLine}; a part program runs in one work offset, taken as the shared offset.`);
        workOffset = code;
        workOffsetLine = lineNo;
      }
    }
    if (gv.has(90)) st.abs = true;
    if (gv.has(91)) st.abs = false;
    if (gv.has(98)) st.retract = 98;
    if (gv.has(99)) st.retract = 99;
    const wasCycle = motion !== null && motion > 3;
    if (motionCodes.length) motion = motionCodes[0]!.value === 80 ? null : motionCodes[0]!.value;
    // R and Z carry over from one canned cycle to the next (LinuxCNC "Canned Cycles"); a copy for another station must not inherit them.
    if (motion !== null && motion > 3 && !wasCycle && (!get.R || !get.Z)) return fail(lineNo, `Line ${lineNo}: the first block of a canned cycle must give both R and Z.`);
    if (mv.has(2) || mv.has(30)) ended = true;

    const hasX = !!get.X;
    const hasY = !!get.Y;
    const hasZ = !!get.Z;
    const start: XY | null = x !== null && y !== null ? { x, y } : null;
    let kind: BlockKind = 'plain';
    let center: XY | null = null;

    if (gv.has(28) || gv.has(53)) {
      const code = gv.has(28) ? 'G28' : 'G53';
      if (hasX || hasY || get.I || get.J || get.R) return fail(lineNo, `Line ${lineNo}: ${code} may only lift Z here (write "${code === 'G28' ? 'G91 G28 Z0' : 'G53 G0 Z0'}"); ${code} moves in X or Y are not supported.`);
      if (!hasZ) return fail(lineNo, `Line ${lineNo}: ${code} without a Z word moves every axis; write "${code === 'G28' ? 'G91 G28 Z0' : 'G53 G0 Z0'}" to lift Z only.`);
      if (code === 'G28' && st.abs) return fail(lineNo, `Line ${lineNo}: G28 under G90 passes through an absolute Z of the part; write "G91 G28 Z0".`);
      if (code === 'G53' && !st.abs) return fail(lineNo, `Line ${lineNo}: G53 is not allowed under G91; write "G90 G53 G0 Z0".`);
      if (code === 'G53' && !(motionCodes.length && (motionCodes[0]!.value === 0 || motionCodes[0]!.value === 1))) return fail(lineNo, `Line ${lineNo}: G53 needs G0 or G1 in the same block, as in "G53 G0 Z0".`);
      kind = 'lift';
      z = null;
    } else if (hasX || hasY || hasZ) {
      if (motion === null) return fail(lineNo, `Line ${lineNo} has axis words but no motion mode is active (after G80 or at the start); give G0, G1, G2, G3 or a canned cycle.`);
      const isArc = motion === 2 || motion === 3;
      const isCycle = motion > 3;
      if (!isArc && !isCycle && (get.I || get.J || get.R)) return fail(lineNo, `Line ${lineNo}: I, J and R words belong to arcs (G2, G3) and canned cycles, not to G${motion}.`);
      if (isCycle && (get.I || get.J)) return fail(lineNo, `Line ${lineNo}: I and J words are not used with canned cycles here.`);
      if ((hasX || hasY) && (x === null || y === null)) {
        if (!st.abs) return fail(lineNo, `Line ${lineNo}: an incremental (G91) move before any absolute X and Y; start the program with an absolute move to X and Y.`);
        if (!(hasX && hasY) && (x === null && !hasX || y === null && !hasY)) return fail(lineNo, `Line ${lineNo}: the first move in X or Y must give both X and Y so it can be carried to every station.`);
      }
      const L = isCycle && get.L ? get.L.value : 1;
      if (isCycle && (!Number.isInteger(L) || L < 1 || L > 1000)) return fail(lineNo, `Line ${lineNo}: L must be a whole number from 1 to 1000.`);
      let nx: number | null = x;
      let ny: number | null = y;
      if (st.abs) {
        if (hasX) nx = get.X!.value;
        if (hasY) ny = get.Y!.value;
      } else {
        if (hasX) nx = x! + get.X!.value * L;
        if (hasY) ny = y! + get.Y!.value * L;
      }
      let nz: number | null = z;
      if (isCycle) {
        holes += L;
        if (get.R) cycleR = get.R.value;
        if (get.Z) cycleZ = get.Z.value;
        const rW: number | undefined = get.R?.value ?? cycleR ?? undefined;
        const zW: number | undefined = get.Z?.value ?? cycleZ ?? undefined;
        if (st.abs) {
          const rAbs: number | null = rW ?? null;
          if (nx !== null && ny !== null) {
            if (zW !== undefined) include(bounds, nx, ny, zW);
            if (rAbs !== null) include(bounds, nx, ny, rAbs);
          }
          if (rAbs !== null) nz = st.retract === 98 && z !== null ? Math.max(z, rAbs) : rAbs;
        } else if (z !== null && rW !== undefined) {
          const rAbs: number = z + rW;
          if (nx !== null && ny !== null) include(bounds, nx, ny, zW !== undefined ? rAbs + zW : rAbs);
          nz = st.retract === 98 ? Math.max(z, rAbs) : rAbs;
        } else {
          nz = null;
        }
        kind = 'cycle';
      } else {
        if (hasZ) nz = st.abs ? get.Z!.value : z === null ? null : z + get.Z!.value;
        if (isArc) {
          arcs++;
          if (!start) return fail(lineNo, `Line ${lineNo}: an arc needs a known start point; move to an absolute X and Y first.`);
          if (get.R) {
            if (get.I || get.J) return fail(lineNo, `Line ${lineNo}: an arc takes either R or I and J, not both.`);
            if (!hasX && !hasY) return fail(lineNo, `Line ${lineNo}: an R-form arc needs an end point in X or Y (a full circle needs I and J).`);
          } else {
            if (!get.I && !get.J) return fail(lineNo, `Line ${lineNo}: an arc needs its center as I and J, or a radius R.`);
            center = { x: start.x + (get.I?.value ?? 0), y: start.y + (get.J?.value ?? 0) };
            includeArc(bounds, start, { x: nx!, y: ny! }, center, motion === 3, nz);
          }
        }
        if (motion !== 0) feedMoves++;
        kind = 'move';
      }
      x = nx;
      y = ny;
      z = nz;
      if (x !== null && y !== null && kind === 'move') include(bounds, x, y, z);
    }

    blocks.push({
      line: lineNo, words: words.filter((w) => w.letter !== 'N' && w.letter !== 'O' && !(w.letter === 'M' && (w.value === 2 || w.value === 30))), comments,
      kind, motion, explicitMotion: motionCodes.length > 0, abs: st.abs, hasXY: hasX || hasY,
      start, end: x !== null && y !== null ? { x, y } : null, center, tool,
    });
    const index = blocks.length - 1;
    const current = segments[segments.length - 1];
    if (tool !== null) {
      if (current && current.firstMove >= 0 && !current.toolChange && segments.length === 1) {
        return fail(blocks[current.firstMove]!.line, `Line ${blocks[current.firstMove]!.line} moves before the first tool change (line ${lineNo}); start the program with T and M6 so every station gets the right tool.`);
      }
      segments.push({ first: index, end: index + 1, toolChange: true, tool, firstMove: -1, before: { ...st }, startXY: null, lengthH: null });
    } else if (kind !== 'plain' && !current) {
      segments.push({ first: index, end: index + 1, toolChange: false, tool: null, firstMove: -1, before: { ...st }, startXY: null, lengthH: null });
    }
    const seg = segments[segments.length - 1];
    if (seg) {
      seg.end = index + 1;
      if (gv.has(43) && seg.lengthH === null) seg.lengthH = st.lengthH;
      if (kind !== 'plain' && seg.firstMove < 0) {
        seg.firstMove = index;
        // The state before this block: undo nothing but the block's own words, which it writes again itself.
        seg.before = { ...st };
        seg.startXY = start;
      }
      if (seg.firstMove >= 0 && !seg.startXY && blocks[index]!.hasXY && kind !== 'lift') {
        const b = blocks[index]!;
        if (!(b.motion === 0 && b.abs && get.X && get.Y)) return fail(lineNo, `Line ${lineNo}: the first X Y move must be a rapid (G0) to an absolute X and Y, so every station's copy can start from above it.`);
        seg.startXY = { x: get.X!.value, y: get.Y!.value };
      }
    }
  }
  if (!segments.length) return fail(null, 'The part program has no moves; upload the program the CAM system posted for one part.');
  if (sawM6Line === 0 && toolChanges.length === 0 && segments.length !== 1) return fail(null, 'The part program could not be split by tool.');
  for (const s of segments) {
    if (s.firstMove >= 0 && !s.startXY) {
      const anyXY = blocks.slice(s.firstMove, s.end).some((b) => b.hasXY && b.kind !== 'lift');
      if (anyXY) return fail(blocks[s.firstMove]!.line, `Line ${blocks[s.firstMove]!.line}: the tool's first X Y position is unknown; move to an absolute X and Y with G0 first.`);
    }
  }
  const extents: Extents | null = bounds.any
    ? { min: { x: bounds.minX, y: bounds.minY, z: Number.isFinite(bounds.minZ) ? bounds.minZ : 0 }, max: { x: bounds.maxX, y: bounds.maxY, z: Number.isFinite(bounds.maxZ) ? bounds.maxZ : 0 } }
    : null;
  return {
    ok: true,
    program: {
      blocks,
      preamble: segments[0]!.first,
      segments,
      summary: {
        unit, unitDeclared, lines: lines.length, blocks: blocks.length, toolChanges, tools: [...new Set(toolChanges.map((t) => t.tool))],
        extents, workOffset, feedMoves, arcs, holes, segments: segments.length,
      },
    },
  };
}
