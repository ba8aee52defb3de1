import type { Unit } from '../schemas/common';
import type { Station } from '../schemas/template';
import type { MachinePosition } from '../stations/work-offsets';
import { formatNumber, roundTo } from '../units/units';
import { normalizeDegrees } from '../geometry/transform';
import { FAMILIES, WORK_OFFSET_CODES, type ControlFamily } from './control-families';
import { draftMark } from '../interchange/draft-mark';

export { CONTROL_FAMILIES, FAMILIES, WORK_OFFSET_CODES, type ControlFamily } from './control-families';

/**
 * Offset files by control family: the blocks that make each station's copy of the part
 * active, for the family of control the user names. Every file clears what an earlier file
 * may have left (local shifts, rotation), sets the modal state, writes every word it owns and
 * ends the program, because offsets and local shifts outlive a program on common controls
 * (LinuxCNC G-code reference, "G10 L2", "G52", "G92": offsets persist across program end and
 * reset; NISTIR 6556 §3.5.5 G10 L2 keeps axis words it is not given).
 */

export interface OffsetFileSource {
  templateName: string;
  version: string | number;
  /** draft, in-review, released or retired: a file from a version not released says so at its top. */
  state: string;
  contentHash: string;
}

export interface OffsetFileRequest {
  family: ControlFamily;
  source: OffsetFileSource;
  /** The unit the stations (and the machine position) are in; written as G20 or G21. */
  unit: Unit;
  /** The stations to write, any subset of a version's; registers follow station numbers. */
  stations: readonly Station[];
  /** Name of the shared offset, e.g. "G54" or "hole (6, 5)"; a work-offset code there picks its register. */
  sharedOffsetName?: string;
  /** Machine position of the shared offset origin; required by the families that set offsets. */
  base?: MachinePosition;
  /** Register of station 1; by default the one after the shared offset's (ngc-g10) or 1 (ext-l20). */
  first?: number;
  /** How many extended registers the control has (ext-l20); a shop setting. */
  extendedRegisters?: number;
}

export type OffsetFileErrorCode =
  | 'bad-station-number'
  | 'missing-base'
  | 'register-is-shared-offset'
  | 'too-many-stations'
  | 'bad-first-register'
  | 'turned-station'
  | 'no-stations';

export interface OffsetFileError {
  code: OffsetFileErrorCode;
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

export const comment = (text: string) => `(${commentText(text)})`;

/** The work-offset code named by the shared offset (G54 … G59.3), or G54 when it names none. */
export function sharedOffsetCode(name: string | undefined): (typeof WORK_OFFSET_CODES)[number] {
  const code = (name ?? '').trim().toUpperCase();
  return WORK_OFFSET_CODES.find((c) => c === code) ?? 'G54';
}

/** Register of a work-offset code: G54 → 1 … G59.3 → 9 (LinuxCNC "G10 L2": P1–P9 are G54–G59.3). */
export const registerOf = (code: (typeof WORK_OFFSET_CODES)[number]) => WORK_OFFSET_CODES.indexOf(code) + 1;

/** C at three decimals in 0 ≤ C < 360; a turn that rounds to 360 is no turn. */
export function angleText(c: number): string {
  return normalizeDegrees(roundTo(normalizeDegrees(c), 3)).toFixed(3);
}

/** A station whose C does not round to 0.000°: a family that cannot turn must not write it. */
export const isTurned = (s: Pick<Station, 'c'>) => angleText(s.c) !== '0.000';

/** How one family makes each station active: the plan every writer (offsets file, whole-table program) follows. */
export interface StationPlan {
  family: ControlFamily;
  unit: Unit;
  sharedCode: (typeof WORK_OFFSET_CODES)[number];
  sharedRegister: number;
  /** Stations in numbering order, each with its register where the family uses registers. */
  stations: Array<{ station: Station; register: number | null }>;
  base: MachinePosition | null;
}

export type StationPlanResult = { ok: true; plan: StationPlan } | { ok: false; error: OffsetFileError };

const fail = (code: OffsetFileErrorCode, message: string): { ok: false; error: OffsetFileError } => ({ ok: false, error: { code, message } });

/** Checks that a family can write these stations and assigns registers; refuses rather than writes anything wrong. */
export function planStations(req: Omit<OffsetFileRequest, 'source'>): StationPlanResult {
  const f = FAMILIES[req.family];
  const stations = [...req.stations].sort((a, b) => a.number - b.number);
  if (!stations.length) return fail('no-stations', 'There are no stations to write: the layout (or the job) has none in use.');
  const seen = new Set<number>();
  for (const s of stations) {
    if (!Number.isInteger(s.number) || s.number < 1 || seen.has(s.number)) {
      return fail('bad-station-number', `Station ${s.id} has number ${s.number}; each station must be numbered once, from 1.`);
    }
    seen.add(s.number);
  }
  if (!f.turns) {
    const turned = stations.filter(isTurned);
    if (turned.length) {
      const list = turned.map((s) => `${s.number} (C${angleText(s.c)})`).join(', ');
      const can = (Object.keys(FAMILIES) as ControlFamily[]).filter((k) => FAMILIES[k].turns).join(' or ');
      return fail('turned-station', `Station${turned.length === 1 ? '' : 's'} ${list} ${turned.length === 1 ? 'is' : 'are'} turned, and the ${req.family} family cannot turn a station; choose ${can}, or a whole-table program written out for every station.`);
    }
  }
  const sharedCode = sharedOffsetCode(req.sharedOffsetName);
  const sharedRegister = registerOf(sharedCode);
  if (f.setsOffsets && !req.base) {
    return fail('missing-base', `The ${req.family} family sets work offsets from the machine position of the shared offset: give base=x,y,z (entered or probed once), e.g. base=-20.5,-12.25,-14.0.`);
  }
  if (f.registers === 'none') {
    return { ok: true, plan: { family: req.family, unit: req.unit, sharedCode, sharedRegister, stations: stations.map((station) => ({ station, register: null })), base: null } };
  }
  const limit = f.registers === 'standard' ? WORK_OFFSET_CODES.length : (req.extendedRegisters ?? 48);
  const first = req.first ?? (f.registers === 'standard' ? sharedRegister + 1 : 1);
  if (!Number.isInteger(first) || first < 1 || first > limit) {
    return fail('bad-first-register', `The first register must be a whole number from 1 to ${limit} for the ${req.family} family; ${first} was given.`);
  }
  const registerFor = (s: Station) => first + s.number - 1;
  const last = stations[stations.length - 1]!;
  if (registerFor(last) > limit) {
    const room = limit - first + 1;
    return fail('too-many-stations', `Station ${last.number} would need register ${registerFor(last)}, but the ${req.family} family has ${limit} (${f.registerWords(1)} to ${f.registerWords(limit)}); starting at register ${first} there is room for ${room} station${room === 1 ? '' : 's'}. Use a local-shift family, or a family with more registers.`);
  }
  if (f.registers === 'standard') {
    const clash = stations.find((s) => registerFor(s) === sharedRegister);
    if (clash) {
      return fail('register-is-shared-offset', `Station ${clash.number} would be written to register ${sharedRegister} (${sharedCode}), the shared offset's own register; start the stations at another register (first=${sharedRegister + 1}).`);
    }
  }
  return { ok: true, plan: { family: req.family, unit: req.unit, sharedCode, sharedRegister, stations: stations.map((station) => ({ station, register: registerFor(station) })), base: req.base ?? null } };
}

const num = (unit: Unit) => (v: number) => formatNumber(v, unit);

/** Lines that clear what an earlier program may have left and set the modal state, then make the shared offset active. */
export function preambleLines(plan: StationPlan): string[] {
  const f = FAMILIES[plan.family];
  return [
    // Units first and absolute: some controls add G10 values to the old offset under G91 (NISTIR 6556 §3.5.5).
    `${plan.unit === 'in' ? 'G20' : 'G21'} G90 G17 G40 G49 G80`,
    ...f.clearLines,
    plan.sharedCode,
  ];
}

/** Offset-setting blocks, one per station (families that set offsets), from the machine position of the shared offset. */
export function offsetSettingLines(plan: StationPlan): string[] {
  const f = FAMILIES[plan.family];
  if (!f.setsOffsets || !plan.base) return [];
  const n = num(plan.unit);
  const b = plan.base;
  const lines: string[] = [];
  for (const { station: s, register } of plan.stations) {
    lines.push(comment(`STATION ${s.number} ${s.id} = ${f.registerWords(register!)}`));
    lines.push(f.setBlock(register!, `X${n(b.x + s.x)} Y${n(b.y + s.y)} Z${n(b.z + s.z)}`, angleText(s.c)));
  }
  return lines;
}

/** Lines that make one station's coordinates active (its offset, or its shift and turn). */
export function selectStationLines(plan: StationPlan, entry: StationPlan['stations'][number]): string[] {
  const f = FAMILIES[plan.family];
  const s = entry.station;
  const n = num(plan.unit);
  return f.selectLines({ register: entry.register, shift: `X${n(s.x)} Y${n(s.y)} Z${n(s.z)}`, angle: angleText(s.c) });
}

/** Lines that make the shared offset active again and leave no shift or turn behind. */
export function restoreSharedLines(plan: StationPlan): string[] {
  return [...FAMILIES[plan.family].restoreLines, plan.sharedCode];
}

/** The draft mark as the first comment of a file from a version that is not released; nothing for a released one. */
export function draftMarkLines(source: OffsetFileSource): string[] {
  const mark = draftMark(source);
  return mark ? [comment(mark)] : [];
}

/** The header comments every Gridset G-code file carries: what, from which version, in which state, and the cautions. */
export function headerLines(plan: StationPlan, source: OffsetFileSource, title: string): string[] {
  const f = FAMILIES[plan.family];
  const lines = [
    ...draftMarkLines(source),
    comment(`GRIDSET ${title}`),
    comment(`CONTROL FAMILY: ${plan.family} - ${f.label}`),
    comment(`TEMPLATE: ${source.templateName}`),
    comment(`VERSION: ${source.version} - ${source.state.toUpperCase()}`),
  ];
  lines.push(
    comment(`CONTENT HASH: ${source.contentHash}`),
    comment(plan.unit === 'in' ? 'UNIT: INCH - G20' : 'UNIT: MILLIMETER - G21'),
    comment(`SHARED OFFSET: ${plan.sharedCode} (REGISTER ${plan.sharedRegister}) - NOT WRITTEN BY THIS FILE`),
    comment('Z0: THE SHARED OFFSET Z0; EACH STATION Z IS ITS PART SEAT MEASURED FROM THERE'),
    comment(`NOTE: ${f.note}`),
    comment('CAUTION: ADVICE ONLY - CHECK EVERY BLOCK AGAINST THE PROGRAMMING MANUAL OF YOUR CONTROL'),
    comment('CAUTION: PROVE OUT WITHOUT STOCK; THE OPERATOR CHECKS EVERY CLAMP BEFORE CYCLE START'),
    comment("CAUTION: FOLLOW THE MACHINE BUILDER'S INSTRUCTIONS"),
  );
  return lines;
}

/** Wraps a program's lines in the family's framing (percent signs where its controls use them). */
export function frame(plan: StationPlan, lines: string[]): string {
  const f = FAMILIES[plan.family];
  const all = f.percent ? ['%', ...lines, 'M30', '%'] : [...lines, 'M30'];
  return `${all.join('\n')}\n`;
}

/**
 * The offsets file: the offset-setting blocks (families that set offsets), or the station-by-station
 * shift sequence with a place for the part program under each station (shift families).
 */
export function writeOffsetFile(req: OffsetFileRequest): OffsetFileResult {
  const planned = planStations(req);
  if (!planned.ok) return planned;
  const plan = planned.plan;
  const f = FAMILIES[plan.family];
  const n = num(plan.unit);
  const lines = headerLines(plan, req.source, f.setsOffsets ? 'WORK OFFSETS, ONE PER STATION' : 'STATION SEQUENCE FROM THE SHARED WORK OFFSET');
  if (plan.base) lines.push(comment(`SHARED OFFSET AT MACHINE X${n(plan.base.x)} Y${n(plan.base.y)} Z${n(plan.base.z)}`));
  lines.push(...preambleLines(plan));
  if (f.setsOffsets) {
    lines.push(...offsetSettingLines(plan));
  } else {
    for (const entry of plan.stations) {
      const s = entry.station;
      lines.push(comment(`STATION ${s.number} ${s.id}${isTurned(s) ? ` TURNED C${angleText(s.c)}` : ''}`));
      lines.push(...selectStationLines(plan, entry));
      lines.push(comment(`PART PROGRAM FOR STATION ${s.number} GOES HERE`));
    }
    lines.push(comment('BACK TO THE SHARED OFFSET'));
    lines.push(...restoreSharedLines(plan));
  }
  return { ok: true, text: frame(plan, lines) };
}
