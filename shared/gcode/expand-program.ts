import type { Unit } from '../schemas/common';
import type { Station } from '../schemas/template';
import { cosSinDeg } from '../geometry/transform';
import type { Block, XY } from './read-part-program';
import { DECIMALS, countText, counts, plainWords, writeComments, writeTableProgram, type StationFrame, type TableProgramRequest, type TableProgramResult } from './table-program';

/**
 * The "expanded" family: every coordinate carried to the station, so only the shared work offset
 * is ever active. A part point p goes to R(C)·p + (X, Y) of the station, Z to Z + station Z
 * (rotation counter-clockwise seen from +Z, as G10 L2 R in the LinuxCNC G-code reference).
 * Absolute X Y (moves, arc ends, canned-cycle holes) are turned and moved; absolute Z and canned
 * R planes are raised by the station's Z; incremental words (I J, G91 moves, G91 cycle X Y) are
 * only turned. A rigid turn keeps G2/G3 directions and cutter-compensation sides as they are.
 */

/** Part X Y to table X Y for one station. */
export function toTable(p: XY, s: { x: number; y: number; c: number }): XY {
  const { cos, sin } = cosSinDeg(s.c);
  return { x: s.x + cos * p.x - sin * p.y, y: s.y + sin * p.x + cos * p.y };
}

export function expandedFrame(unit: Unit): StationFrame {
  const d = DECIMALS[unit];
  const num = (v: number) => countText(counts(v, d), d);
  // cos and sin per station, looked up once (quarter turns exact: shared/geometry/transform.ts).
  const turns = new Map<Station, { cos: number; sin: number }>();
  const turn = (s: Station) => {
    let t = turns.get(s);
    if (!t) { t = cosSinDeg(s.c); turns.set(s, t); }
    return t;
  };
  return {
    top: [],
    enter: () => [],
    leave: [],
    z: (_s, shared) => shared,
    point: (s, q) => toTable(q, s),
    plain: (b) => plainWords(b),
    move(b: Block, s: Station, forceMotion: boolean): string {
      const { cos, sin } = turn(s);
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
              word = `X${countText(qx(s, cos, sin, b.end!, d), d)} Y${countText(qy(s, cos, sin, b.end!, d), d)}`;
            } else if (isCycle) {
              let dx = 0;
              let dy = 0;
              for (const v of b.words) {
                if (v.letter === 'X') dx = v.value;
                else if (v.letter === 'Y') dy = v.value;
              }
              word = `X${num(cos * dx - sin * dy)} Y${num(sin * dx + cos * dy)}`;
            } else {
              word = `X${countText(qx(s, cos, sin, b.end!, d) - qx(s, cos, sin, b.start!, d), d)} Y${countText(qy(s, cos, sin, b.end!, d) - qy(s, cos, sin, b.start!, d), d)}`;
            }
            break;
          }
          case 'I':
          case 'J':
            if (ijDone) continue;
            ijDone = true;
            word = `I${countText(qx(s, cos, sin, b.center!, d) - qx(s, cos, sin, b.start!, d), d)} J${countText(qy(s, cos, sin, b.center!, d) - qy(s, cos, sin, b.start!, d), d)}`;
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
    },
  };
}

/** Table X and Y of a part point at a station, counted in the last written decimal. */
function qx(s: Station, cos: number, sin: number, q: XY, d: number): number {
  return counts(s.x + cos * q.x - sin * q.y, d);
}
function qy(s: Station, cos: number, sin: number, q: XY, d: number): number {
  return counts(s.y + sin * q.x + cos * q.y, d);
}

export function expandedProgram(req: TableProgramRequest): TableProgramResult {
  return writeTableProgram(req, expandedFrame(req.unit));
}
