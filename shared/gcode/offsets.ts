import type { Unit } from '../schemas/common';
import type { Station } from '../schemas/template';
import type { MachinePosition } from '../stations/work-offsets';
import { formatNumber, roundTo } from '../units/units';
import { normalizeDegrees } from '../geometry/transform';

/**
 * standard: the words of the NIST RS274/NGC Interpreter v3 (NISTIR 6556) and LinuxCNC, where
 * G10 L2 takes P1–P9 only. extended: P10 and above are written too, for controls with more
 * work offsets; what those numbers mean is control-specific.
 */
export type OffsetDialect = 'standard' | 'extended';

/**
 * G10 L2 Pn sets the origin of coordinate system n, counted from G54 (NISTIR 6556, "Set Coordinate System Data — G10";
 * LinuxCNC G-code reference, "G10 L2 Set Coordinate System").
 */
export const WORK_OFFSET_CODES = ['G54', 'G55', 'G56', 'G57', 'G58', 'G59', 'G59.1', 'G59.2', 'G59.3'] as const;
export const STANDARD_OFFSET_LIMIT = WORK_OFFSET_CODES.length;

export interface OffsetFileSource {
  templateName: string;
  version: string | number;
  contentHash: string;
}

interface OffsetFileCommon {
  source: OffsetFileSource;
  /** The unit the stations (and the machine position) are in; written as G20 or G21. */
  unit: Unit;
  stations: readonly Station[];
  dialect?: OffsetDialect;
  /** Name of the shared offset for the header, e.g. "hole (6, 5)". */
  sharedOffsetName?: string;
}

export type OffsetFileRequest =
  | (OffsetFileCommon & { mode: 'g10'; /** Machine position of the shared offset origin. */ sharedOffsetAt: MachinePosition })
  | (OffsetFileCommon & { mode: 'g52' });

export interface OffsetFileError {
  code: 'too-many-stations' | 'bad-station-number';
  message: string;
}

export type OffsetFileResult = { ok: true; text: string } | { ok: false; error: OffsetFileError };

/** Parentheses end a comment (NISTIR 6556, "Comments and Messages"), so they and non-ASCII are kept out of comment text. */
export function commentText(text: string): string {
  return text
    .replace(/\(/g, '[')
    .replace(/\)/g, ']')
    .replace(/[^\x20-\x7E]/g, '?')
    .replace(/\s+/g, ' ')
    .trim();
}

const comment = (text: string) => `(${commentText(text)})`;

/** Work offset name for P1–P9, or null beyond them. */
export function workOffsetCode(p: number): string | null {
  return WORK_OFFSET_CODES[p - 1] ?? null;
}

/** C at three decimals; a turn that rounds to 0 or 360 is no turn. */
function angleText(c: number): string | null {
  const a = normalizeDegrees(roundTo(normalizeDegrees(c), 3));
  return a === 0 ? null : a.toFixed(3);
}

function header(req: OffsetFileRequest, title: string): string[] {
  const { source, unit } = req;
  const dialect = req.dialect ?? 'standard';
  const lines = [
    comment(`GRIDSET ${title}`),
    comment(`TEMPLATE: ${source.templateName}`),
    comment(`VERSION: ${source.version}`),
    comment(`CONTENT HASH: ${source.contentHash}`),
    comment(unit === 'in' ? 'UNIT: INCH - G20' : 'UNIT: MILLIMETER - G21'),
    comment(
      req.mode === 'g52'
        ? `DIALECT: ${dialect.toUpperCase()} - G52 LOCAL OFFSET AS IN LINUXCNC`
        : dialect === 'standard'
          ? 'DIALECT: STANDARD - NIST RS274/NGC AND LINUXCNC WORDS, G10 L2 P1-P9 = G54-G59.3'
          : 'DIALECT: EXTENDED - P10 AND ABOVE ARE CONTROL-SPECIFIC',
    ),
  ];
  if (req.sharedOffsetName) lines.push(comment(`SHARED OFFSET: ${req.sharedOffsetName}`));
  lines.push(
    comment('CAUTION: CHECK EVERY BLOCK AGAINST THE PROGRAMMING MANUAL OF YOUR CONTROL BEFORE RUNNING'),
    comment('CAUTION: ADVICE ONLY - PROVE OUT WITHOUT STOCK; THE OPERATOR CHECKS EVERY CLAMP BEFORE CYCLE START'),
    // Units first, and absolute: some controls add G10 values to the old offset under G91.
    `${unit === 'in' ? 'G20' : 'G21'} G90`,
  );
  return lines;
}

function byNumber(stations: readonly Station[]): Station[] {
  return [...stations].sort((a, b) => a.number - b.number);
}

/**
 * One G10 L2 block per station: Pn is the station number, and each value is the machine
 * position of the shared offset plus the station's translation, in absolute machine
 * coordinates (LinuxCNC "G10 L2"; NISTIR 6556 example "G10 L2 P1 X3.5 Y17.2" puts the G54
 * origin at X3.5 Y17.2). R (rotation of XY about Z, LinuxCNC) is written where C is not 0.
 */
export function writeG10Offsets(req: Extract<OffsetFileRequest, { mode: 'g10' }>): OffsetFileResult {
  const dialect = req.dialect ?? 'standard';
  const stations = byNumber(req.stations);
  const seen = new Set<number>();
  for (const s of stations) {
    if (!Number.isInteger(s.number) || s.number < 1 || seen.has(s.number)) {
      return { ok: false, error: { code: 'bad-station-number', message: `Station ${s.id} has number ${s.number}; G10 L2 needs each station numbered once, from 1.` } };
    }
    seen.add(s.number);
  }
  const last = stations[stations.length - 1];
  if (dialect === 'standard' && last && last.number > STANDARD_OFFSET_LIMIT) {
    return {
      ok: false,
      error: {
        code: 'too-many-stations',
        message: `Station ${last.number} has no standard work offset: G10 L2 reaches P1-P9 (G54 to G59.3) only. Use the G52 sequence, or the extended dialect if your control has more work offsets.`,
      },
    };
  }
  const n = (v: number) => formatNumber(v, req.unit);
  const base = req.sharedOffsetAt;
  const lines = header(req, 'WORK OFFSETS - G10 L2, ONE PER STATION');
  lines.push(comment(`SHARED OFFSET AT MACHINE X${n(base.x)} Y${n(base.y)} Z${n(base.z)}`));
  let markedExtended = false;
  for (const s of stations) {
    const code = workOffsetCode(s.number);
    if (!code && !markedExtended) {
      lines.push(comment(`P${STANDARD_OFFSET_LIMIT + 1} AND ABOVE ARE CONTROL-SPECIFIC - NOT IN NIST RS274/NGC OR LINUXCNC`));
      markedExtended = true;
    }
    const r = angleText(s.c);
    lines.push(comment(`STATION ${s.number} ${s.id}${code ? ` = ${code}` : ''}`));
    lines.push(`G10 L2 P${s.number} X${n(base.x + s.x)} Y${n(base.y + s.y)} Z${n(base.z + s.z)}${r ? ` R${r}` : ''}`);
  }
  return { ok: true, text: `${lines.join('\n')}\n` };
}

/**
 * The same part program run at each station under a local shift from the active (shared)
 * work offset: G52 X Y Z per station, cancelled at the end with G52 X0 Y0 Z0 (LinuxCNC
 * "G52 Local Coordinate System Offset"). G52 does not rotate, so turned stations are flagged.
 */
export function writeG52Sequence(req: OffsetFileRequest): string {
  const n = (v: number) => formatNumber(v, req.unit);
  const lines = header(req, 'STATION SEQUENCE - G52 LOCAL SHIFT FROM THE SHARED WORK OFFSET');
  lines.push(comment('THE SHARED WORK OFFSET MUST BE ACTIVE BEFORE THIS SEQUENCE'));
  for (const s of byNumber(req.stations)) {
    const r = angleText(s.c);
    lines.push(comment(`STATION ${s.number} ${s.id}`));
    if (r) lines.push(comment(`STATION ${s.number} IS TURNED C${r} - G52 ONLY SHIFTS; USE A PART PROGRAM TURNED TO MATCH`));
    lines.push(`G52 X${n(s.x)} Y${n(s.y)} Z${n(s.z)}`);
    lines.push(comment(`PART PROGRAM FOR STATION ${s.number} GOES HERE`));
  }
  lines.push(comment('CLEAR THE LOCAL SHIFT'));
  lines.push('G52 X0 Y0 Z0');
  return `${lines.join('\n')}\n`;
}

export function writeOffsetFile(req: OffsetFileRequest): OffsetFileResult {
  return req.mode === 'g10' ? writeG10Offsets(req) : { ok: true, text: writeG52Sequence(req) };
}
