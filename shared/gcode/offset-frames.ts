import type { Station } from '../schemas/template';
import { FAMILIES } from './control-families';
import { offsetSettingLines, planStations, restoreSharedLines, selectStationLines, type OffsetFileErrorCode, type OffsetFileRequest } from './offsets';
import type { Block } from './read-part-program';
import { plainWords, writeComments, type StationFrame } from './table-program';

/**
 * The offset families of the whole-table program: the part's own coordinates are written
 * unchanged under each station's work offset (families that set offsets: set once at the top,
 * selected per copy) or local shift (G52, with G68 rotation in shift-rotate), through the same
 * station plan and block writers as the offsets file (shared/gcode/offsets.ts). The part's own
 * G54–G59 words are left out of the copies, since each copy runs in its station's offset; turned
 * stations in a family that cannot turn are refused by planStations, never approximated.
 */

const isWorkOffsetWord = (letter: string, value: number) => letter === 'G' && value >= 54 && value <= 59;
const keep = (letter: string, value: number) => !isWorkOffsetWord(letter, value);

/** A bad query is the user's to fix (400); a layout the family cannot write is a 422. */
const statusOf = (code: OffsetFileErrorCode) => (code === 'missing-base' || code === 'bad-first-register' ? 400 : 422);

export function offsetFrame(req: Omit<OffsetFileRequest, 'source'>):
  | { ok: true; frame: StationFrame; family: string }
  | { ok: false; error: { status: number; code: string; message: string } } {
  const planned = planStations(req);
  if (!planned.ok) return { ok: false, error: { status: statusOf(planned.error.code), ...planned.error } };
  const plan = planned.plan;
  const f = FAMILIES[plan.family];
  const entryOf = new Map(plan.stations.map((e) => [e.station.number, e]));
  const frame: StationFrame = {
    // Clear what an earlier program left (shifts, rotation), set the offsets, then the shared offset.
    top: [...f.clearLines, ...offsetSettingLines(plan), plan.sharedCode],
    enter: (s: Station) => selectStationLines(plan, entryOf.get(s.number)!),
    leave: restoreSharedLines(plan),
    // Z0 of a station's offset or shift is at the station's Z.
    z: (s, z) => z - s.z,
    point: (_s, q) => q,
    plain: (b) => plainWords(b, null, keep),
    move(b: Block, _s: Station, forceMotion: boolean): string {
      const parts: string[] = [];
      if (forceMotion && !b.explicitMotion && b.motion !== null) parts.push(`G${b.motion}`);
      for (const w of b.words) if (keep(w.letter, w.value)) parts.push(`${w.letter}${w.text}`);
      return `${parts.join(' ')}${writeComments(b)}`;
    },
  };
  return { ok: true, frame, family: `${plan.family.toUpperCase()} - ${f.label}` };
}
