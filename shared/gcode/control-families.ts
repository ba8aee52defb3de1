/**
 * The control families Gridset writes G-code for. The user names one; Gridset never switches
 * to another behind their back (a file for the wrong control is worse than no file).
 *
 * Sources: the RS274/NGC words are NISTIR 6556 (RS274/NGC Interpreter v3) and the LinuxCNC
 * G-code reference ("G10 L2", "G52", "G92.1"); LinuxCNC's interpreter reads them back in the
 * tests. The ext-l20 and shift-rotate words (G10 L20, G54.1 P, G68/G69) are the trade's usual
 * syntax on controls with extended offsets and coordinate rotation, written from memory: no
 * published reference is at hand and no interpreter here implements them.
 */

/** G10 L2 Pn sets the origin of coordinate system n, counted from G54 (NISTIR 6556; LinuxCNC "G10 L2"). */
export const WORK_OFFSET_CODES = ['G54', 'G55', 'G56', 'G57', 'G58', 'G59', 'G59.1', 'G59.2', 'G59.3'] as const;

export const CONTROL_FAMILIES = ['ngc-g10', 'ngc-g52', 'ext-l20', 'shift-rotate'] as const;
export type ControlFamily = (typeof CONTROL_FAMILIES)[number];

export interface FamilyRules {
  label: string;
  /** What the file leaves set on the control, in one line for its header. */
  note: string;
  /** Sets work-offset registers (and so needs the machine position of the shared offset). */
  setsOffsets: boolean;
  /** Can turn a station's coordinates by its C. */
  turns: boolean;
  /** Which registers it writes: the nine standard ones, an extended bank, or none (shifts). */
  registers: 'standard' | 'extended' | 'none';
  /** Framed by percent signs (tape start and end) on its controls. */
  percent: boolean;
  /** Lines that cancel local shifts and rotation an earlier program may have left. */
  clearLines: readonly string[];
  /** Lines that cancel this family's station selection before the shared offset is made active again. */
  restoreLines: readonly string[];
  /** How a register is named to a person: "P2 G55", "G54.1 P7". */
  registerWords(register: number): string;
  /** The block that sets one register: every word it owns, rotation included where the family has it. */
  setBlock(register: number, xyz: string, angle: string): string;
  /** Lines that make one station active. */
  selectLines(s: { register: number | null; shift: string; angle: string }): string[];
}

export const FAMILIES: Record<ControlFamily, FamilyRules> = {
  'ngc-g10': {
    label: 'RS274/NGC AND LINUXCNC: G10 L2 P1-P9 WITH R',
    note: 'SETS ONE WORK OFFSET PER STATION (G10 L2 P X Y Z R); OFFSETS STAY SET AFTER THE PROGRAM ENDS',
    setsOffsets: true,
    turns: true,
    registers: 'standard',
    percent: false,
    // G92.1 zeroes the G92 offsets, which LinuxCNC's G52 shares (LinuxCNC G-code reference, "G52", "G92.1").
    clearLines: ['G92.1'],
    restoreLines: [],
    registerWords: (r) => `P${r} ${WORK_OFFSET_CODES[r - 1]}`,
    // R is LinuxCNC's rotation word, written even when 0 so no earlier turn survives (G10 keeps words it is not given).
    setBlock: (r, xyz, angle) => `G10 L2 P${r} ${xyz} R${angle}`,
    selectLines: (s) => [WORK_OFFSET_CODES[s.register! - 1]!],
  },
  'ngc-g52': {
    label: 'RS274/NGC AND LINUXCNC: G52 LOCAL SHIFT PER STATION',
    note: 'SHIFTS FROM THE SHARED WORK OFFSET WITH G52; CANNOT TURN A STATION; THE SHIFT IS CLEARED AT THE END',
    setsOffsets: false,
    turns: false,
    registers: 'none',
    percent: false,
    clearLines: ['G92.1'],
    restoreLines: ['G52 X0 Y0 Z0'],
    registerWords: (r) => `P${r}`,
    setBlock: () => '',
    selectLines: (s) => [`G52 ${s.shift}`],
  },
  'ext-l20': {
    label: 'EXTENDED WORK OFFSETS: G10 L20 P SET, G54.1 P SELECTS (SYNTAX FROM MEMORY)',
    note: 'SETS ONE EXTENDED WORK OFFSET PER STATION (G10 L20 P X Y Z); NO ROTATION; CHECK THE REGISTER COUNT OF YOUR CONTROL',
    setsOffsets: true,
    turns: false,
    registers: 'extended',
    percent: true,
    clearLines: ['G52 X0 Y0 Z0'],
    restoreLines: [],
    registerWords: (r) => `G54.1 P${r}`,
    setBlock: (r, xyz) => `G10 L20 P${r} ${xyz}`,
    selectLines: (s) => [`G54.1 P${s.register}`],
  },
  'shift-rotate': {
    label: 'LOCAL SHIFT WITH COORDINATE ROTATION: G52 THEN G68 (SYNTAX FROM MEMORY)',
    note: 'PER STATION: CANCEL ROTATION (G69), SHIFT (G52), ROTATE ABOUT THE STATION DATUM (G68 X0 Y0 R); ALL CLEARED AT THE END',
    setsOffsets: false,
    turns: true,
    registers: 'none',
    percent: true,
    clearLines: ['G69', 'G52 X0 Y0 Z0'],
    restoreLines: ['G69', 'G52 X0 Y0 Z0'],
    registerWords: (r) => `P${r}`,
    setBlock: () => '',
    // Rotation is cancelled before the shift: a shift made under rotation is turned on some controls.
    selectLines: (s) => ['G69', `G52 ${s.shift}`, `G68 X0 Y0 R${s.angle}`],
  },
};

/** What each family is called on a screen: the words a programmer looks for in the control's manual. */
export const FAMILY_NAMES: Record<ControlFamily, string> = {
  'ngc-g10': 'ngc-g10 — G10 L2 P1–P9 with R (RS274/NGC, LinuxCNC)',
  'ngc-g52': 'ngc-g52 — G52 shift per station (RS274/NGC, LinuxCNC)',
  'ext-l20': 'ext-l20 — G10 L20 / G54.1 P extended offsets',
  'shift-rotate': 'shift-rotate — G52 shift with G68 rotation',
};

/** Whether a family (by name, from a query or a select) sets work offsets and so needs the shared offset's machine position. */
export const setsOffsets = (family: string) => (family in FAMILIES ? FAMILIES[family as ControlFamily].setsOffsets : false);

/** The old names kept for links and scripts written before the families had names. */
export function familyFromAlias(q: { family?: string; dialect?: string; mode?: string }): string | undefined {
  const named = q.family ?? q.dialect;
  if (named === 'standard') return q.mode === 'g52' ? 'ngc-g52' : 'ngc-g10';
  if (named === 'extended') return 'ext-l20';
  if (named) return named;
  if (q.mode === 'g52') return 'ngc-g52';
  if (q.mode === 'g10') return 'ngc-g10';
  return undefined;
}
