import type { Station } from '../schemas/template';
import { FAMILY_LABELS, G10_FAMILIES, checkOffsetRequest, endingLines, sharedRegister, stationLines, stationRegister, workOffsetCode, type OffsetFileError, type OffsetFileRequest } from './offsets';
import type { Block } from './read-part-program';
import { plainWords, writeComments, type StationFrame } from './table-program';

/**
 * The offset families of the whole-table program: the part's own coordinates are written
 * unchanged under each station's work offset (G10 families: set once at the top, selected per
 * copy) or local shift (G52, with G68 rotation in shift-rotate), using the offset-file block
 * writers of shared/gcode/offsets.ts. The part's own G54–G59 words are left out of the copies,
 * since each copy runs in its station's offset; turned stations in a family that cannot turn are
 * refused by checkOffsetRequest, never approximated.
 */

const isWorkOffsetWord = (letter: string, value: number) => letter === 'G' && value >= 54 && value <= 59;
const keep = (letter: string, value: number) => !isWorkOffsetWord(letter, value);

export function offsetFrame(req: OffsetFileRequest): { ok: true; frame: StationFrame; family: string } | { ok: false; error: OffsetFileError } {
  const error = checkOffsetRequest(req);
  if (error) return { ok: false, error };
  const isG10 = G10_FAMILIES.includes(req.family);
  const shared = workOffsetCode(sharedRegister(req.sharedOffsetName))!;
  // The "part program goes here" reminders of the offset file are for hand merging; here the program follows.
  const lines = (s: Station) => stationLines(req, s).filter((l) => !l.includes('GOES HERE'));
  const select = (s: Station) => {
    const p = stationRegister(req, s);
    return req.family === 'ext-l20' ? `G54.1 P${p}` : workOffsetCode(p)!;
  };
  const frame: StationFrame = {
    top: isG10 ? [...[...req.stations].sort((a, b) => a.number - b.number).flatMap(lines), shared] : ['G52 X0 Y0 Z0', ...(req.family === 'shift-rotate' ? ['G69'] : [])],
    enter: (s) => (isG10 ? [select(s)] : lines(s)),
    leave: isG10 ? [shared] : endingLines(req).filter((l) => l !== 'M30' && l !== '%'),
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
  return { ok: true, frame, family: `${req.family.toUpperCase()} - ${FAMILY_LABELS[req.family].toUpperCase()}` };
}
