import type { Unit } from '../schemas/common';
import type { Station } from '../schemas/template';
import type { MachinePosition } from '../stations/work-offsets';
import { formatNumber, roundTo } from '../units/units';
import { normalizeDegrees } from '../geometry/transform';

/**
 * Offset-file families, named by the control words they use:
 * - ngc-g10: G10 L2 P1–P9 X Y Z R (LinuxCNC G-code reference "G10 L2 Set Coordinate System";
 *   NISTIR 6556 §3.5.5 has G10 L2 P1–P9 without R — R, rotation about Z, is LinuxCNC's own word).
 * - ngc-g52: a G52 local shift per station from the shared work offset (LinuxCNC "G52").
 * - ext-l20: extended work offsets set with G10 L20 P<n> and selected with G54.1 P<n>
 *   (trade syntax from memory; no NGC interpreter reads it), percent-delimited, no rotation word.
 * - shift-rotate: per station G69, G52 X Y Z, G68 X0 Y0 R<c> (trade syntax from memory;
 *   LinuxCNC has no G68).
 */
export const OFFSET_FAMILIES = ['ngc-g10', 'ngc-g52', 'ext-l20', 'shift-rotate'] as const;
export type OffsetFamily = (typeof OFFSET_FAMILIES)[number];
export const FAMILY_LABELS: Record<OffsetFamily, string> = {
  'ngc-g10': 'NGC G10 L2 (G54–G59.3, with R)',
  'ngc-g52': 'NGC G52 shift per station',
  'ext-l20': 'Extended G10 L20 / G54.1 P',
  'shift-rotate': 'G52 shift + G68 rotation',
};
/** Families that write machine positions (and so need the shared offset's machine position). */
export const G10_FAMILIES: readonly OffsetFamily[] = ['ngc-g10', 'ext-l20'];
/** Families that can turn a station (C ≠ 0). */
export const TURNING_FAMILIES: readonly OffsetFamily[] = ['ngc-g10', 'shift-rotate'];
/** Default and bounds of the extended-offset register count (a shop setting). */
export const EXT_REGISTERS_DEFAULT = 48;
export const EXT_REGISTERS_MAX = 300;

/**
 * G10 L2 Pn sets the origin of coordinate system n, counted from G54 (NISTIR 6556, "Set Coordinate System Data — G10";
 * LinuxCNC G-code reference, "G10 L2 Set Coordinate System").
 */
export const WORK_OFFSET_CODES = ['G54', 'G55', 'G56', 'G57', 'G58', 'G59', 'G59.1', 'G59.2', 'G59.3'] as const;
export const STANDARD_OFFSET_LIMIT = WORK_OFFSET_CODES.length;

export interface OffsetFileSource {
  templateName: string;
  version: string | number;
  state: string;
  contentHash: string;
}

export interface OffsetFileRequest {
  family: OffsetFamily;
  source: OffsetFileSource;
  /** The unit the stations (and the machine position) are in; written as G20 or G21. */
  unit: Unit;
  /** The stations to write (a subset is fine); registers stay tied to station numbers. */
  stations: readonly Station[];
  /** Name of the shared offset, e.g. "G54"; its register comes from it (else 1 = G54). */
  sharedOffsetName?: string;
  /** Machine position of the shared offset origin; needed by the G10 families. */
  sharedOffsetAt?: MachinePosition;
  /** Register of station 1; defaults to the register after the shared offset's. */
  first?: number;
  /** Register count of the ext-l20 family (shop setting). */
  extRegisters?: number;
}

export interface OffsetFileError {
  /** 400: the query; 422: a layout this family cannot write. */
  status: 400 | 422;
  code: 'missing-base' | 'register-collision' | 'too-many-stations' | 'bad-station-number' | 'turned-station' | 'bad-first';
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

/** Register of the shared offset: its name when that is G54…G59.3 (→ 1…9), otherwise 1 (G54). */
export function sharedRegister(name: string | undefined): number {
  const i = WORK_OFFSET_CODES.indexOf((name ?? '').trim().toUpperCase() as (typeof WORK_OFFSET_CODES)[number]);
  return i >= 0 ? i + 1 : 1;
}

/** C at three decimals; a turn that rounds to 0 or 360 is 0. */
export function angleText(c: number): string {
  return normalizeDegrees(roundTo(normalizeDegrees(c), 3)).toFixed(3);
}
const isTurned = (s: Station) => angleText(s.c) !== '0.000';

function registerLimit(req: OffsetFileRequest): number {
  if (req.family === 'ngc-g10') return STANDARD_OFFSET_LIMIT;
  if (req.family === 'ext-l20') return req.extRegisters ?? EXT_REGISTERS_DEFAULT;
  return Infinity;
}

const byNumber = (stations: readonly Station[]) => [...stations].sort((a, b) => a.number - b.number);

/** Header comments and the modal-state preamble of a family's file. */
export function preambleLines(req: OffsetFileRequest): string[] {
  const { source, unit } = req;
  const shared = sharedRegister(req.sharedOffsetName);
  const sharedCode = workOffsetCode(shared)!;
  const draft = source.state === 'draft';
  const lines: string[] = [];
  if (req.family === 'ext-l20') lines.push('%');
  lines.push(
    comment(`GRIDSET WORK OFFSETS - FAMILY ${req.family.toUpperCase()}`),
    ...(draft ? [comment('DRAFT - NOT RELEASED - DO NOT RUN ON A PRODUCTION SETUP')] : []),
    comment(`TEMPLATE: ${source.templateName}`),
    comment(`VERSION: ${source.version} STATE: ${source.state.toUpperCase()}`),
    comment(`CONTENT HASH: ${source.contentHash}`),
    comment(unit === 'in' ? 'UNIT: INCH - G20' : 'UNIT: MILLIMETER - G21'),
    comment(`SHARED OFFSET: ${req.sharedOffsetName ?? 'UNNAMED'} = ${sharedCode}`),
    comment(`Z0 IS THE SHARED OFFSET Z0 - STATION Z VALUES ARE MEASURED FROM IT`),
    comment('CAUTION: ADVICE ONLY - CHECK EVERY BLOCK AGAINST THE PROGRAMMING MANUAL OF YOUR CONTROL'),
    comment('CAUTION: PROVE OUT WITHOUT STOCK'),
    comment('CAUTION: THE OPERATOR CHECKS EVERY CLAMP BEFORE CYCLE START'),
    comment("CAUTION: FOLLOW THE MACHINE BUILDER'S INSTRUCTIONS"),
  );
  // Local shifts persist across programs and resets (LinuxCNC G-code reference, "G92" and "G52"):
  // clear them first. G92.1 zeroes the G92/G52 offset in LinuxCNC; other controls get G52 X0 Y0 Z0.
  if (req.family === 'ngc-g10' || req.family === 'ngc-g52') lines.push('G92.1');
  else lines.push('G52 X0 Y0 Z0');
  if (req.family === 'shift-rotate') lines.push('G69');
  lines.push(`${unit === 'in' ? 'G20' : 'G21'} G90 G17 G40 G49 G80`, sharedCode);
  return lines;
}

/** The program end: the local shift cleared (shift families), M30, and % where the family uses it. */
export function endingLines(req: Pick<OffsetFileRequest, 'family'>): string[] {
  const lines: string[] = [];
  if (req.family === 'shift-rotate') lines.push('G69');
  if (req.family === 'ngc-g52' || req.family === 'shift-rotate') lines.push(comment('CLEAR THE LOCAL SHIFT'), 'G52 X0 Y0 Z0');
  lines.push('M30');
  if (req.family === 'ext-l20') lines.push('%');
  return lines;
}

/** Register of a station: first + number − 1. */
export function stationRegister(req: OffsetFileRequest, s: Pick<Station, 'number'>): number {
  return (req.first ?? sharedRegister(req.sharedOffsetName) + 1) + s.number - 1;
}

/**
 * The lines that set (G10 families) or select (shift families) station s. Every block writes
 * every word it owns: a G10 keeps words it omits (LinuxCNC "G10 L2"), so R0 is written too.
 */
export function stationLines(req: OffsetFileRequest, s: Station): string[] {
  const n = (v: number) => formatNumber(v, req.unit);
  const base = req.sharedOffsetAt ?? { x: 0, y: 0, z: 0 };
  const p = stationRegister(req, s);
  switch (req.family) {
    case 'ngc-g10':
      return [comment(`STATION ${s.number} ${s.id} = ${workOffsetCode(p)}`), `G10 L2 P${p} X${n(base.x + s.x)} Y${n(base.y + s.y)} Z${n(base.z + s.z)} R${angleText(s.c)}`];
    case 'ext-l20':
      // G10 L20 P<n> / G54.1 P<n>: extended work offsets, trade syntax from memory.
      return [comment(`STATION ${s.number} ${s.id} = G54.1 P${p}`), `G10 L20 P${p} X${n(base.x + s.x)} Y${n(base.y + s.y)} Z${n(base.z + s.z)}`];
    case 'ngc-g52':
      return [comment(`STATION ${s.number} ${s.id}`), `G52 X${n(s.x)} Y${n(s.y)} Z${n(s.z)}`, comment(`PART PROGRAM FOR STATION ${s.number} GOES HERE`)];
    case 'shift-rotate':
      // G68 X Y R: rotate about (X, Y) of the shifted system; trade syntax from memory.
      return [comment(`STATION ${s.number} ${s.id}`), 'G69', `G52 X${n(s.x)} Y${n(s.y)} Z${n(s.z)}`, `G68 X0 Y0 R${angleText(s.c)}`, comment(`PART PROGRAM FOR STATION ${s.number} GOES HERE`)];
  }
}

/** Checks a request before anything is written; null when it can be written. */
export function checkOffsetRequest(req: OffsetFileRequest): OffsetFileError | null {
  const stations = byNumber(req.stations);
  const seen = new Set<number>();
  for (const s of stations) {
    if (!Number.isInteger(s.number) || s.number < 1 || seen.has(s.number)) {
      return { status: 422, code: 'bad-station-number', message: `Station ${s.id} has number ${s.number}; each station needs its own number, from 1.` };
    }
    seen.add(s.number);
  }
  const isG10 = G10_FAMILIES.includes(req.family);
  if (isG10 && !req.sharedOffsetAt) {
    return { status: 400, code: 'missing-base', message: `The ${req.family} family needs base=x,y,z: the machine position of the shared offset, e.g. base=-20.5,-12.25,-14.0.` };
  }
  if (!TURNING_FAMILIES.includes(req.family)) {
    const turned = stations.filter(isTurned).map((s) => s.number);
    if (turned.length) {
      return { status: 422, code: 'turned-station', message: `Station${turned.length > 1 ? 's' : ''} ${turned.join(', ')} ${turned.length > 1 ? 'are' : 'is'} turned and the ${req.family} family cannot turn a station; use ${TURNING_FAMILIES.join(' or ')}.` };
    }
  }
  if (!isG10) return null;
  const limit = registerLimit(req);
  const shared = sharedRegister(req.sharedOffsetName);
  const first = req.first ?? shared + 1;
  if (!Number.isInteger(first) || first < 1 || first > limit) {
    return { status: 400, code: 'bad-first', message: `first must be a whole register from 1 to ${limit} for the ${req.family} family.` };
  }
  const last = stations[stations.length - 1];
  if (last && stationRegister(req, last) > limit) {
    return { status: 422, code: 'too-many-stations', message: `Station ${last.number} would need register ${stationRegister(req, last)} but the ${req.family} family has ${limit} (P1-P${limit}); write fewer stations, a lower first register, or use a shift family.` };
  }
  const clash = stations.find((s) => stationRegister(req, s) === shared);
  if (clash) {
    return { status: 422, code: 'register-collision', message: `Station ${clash.number} would overwrite register P${shared}, which holds the shared offset ${workOffsetCode(shared)}; choose another first register.` };
  }
  return null;
}

/** The whole file for a family; refuses (writes nothing) what the family cannot write. */
export function writeOffsetFile(req: OffsetFileRequest): OffsetFileResult {
  const error = checkOffsetRequest(req);
  if (error) return { ok: false, error };
  const lines = preambleLines(req);
  const n = (v: number) => formatNumber(v, req.unit);
  if (req.sharedOffsetAt && G10_FAMILIES.includes(req.family)) {
    const b = req.sharedOffsetAt;
    lines.push(comment(`SHARED OFFSET AT MACHINE X${n(b.x)} Y${n(b.y)} Z${n(b.z)} ${req.unit.toUpperCase()}`));
  }
  for (const s of byNumber(req.stations)) lines.push(...stationLines(req, s));
  lines.push(...endingLines(req));
  return { ok: true, text: `${lines.join('\n')}\n` };
}
