/**
 * The text form of a component's dowels, stops and jaw faces in one spreadsheet cell each
 * (server/manifest/FORMAT.md is the description for shops):
 *
 *   dowels     x,y; x,y                      0,0; 8,0
 *   stops      x,y[,z][@angle][#face]        0.5,0.375@0; 1.5,0.375@0#2
 *   jaw faces  x,y@normal                    0,0.375@90
 *
 * Items are separated by ";" and coordinates by ",", so the decimal point is always "." whatever
 * the spreadsheet's locale. Jaw faces are counted from 1 after "#", as the messages count them;
 * the catalog keeps the 0-based index.
 */
import type { Point, Unit } from '../../shared/schemas/common';
import type { JawFace, Stop } from '../../shared/schemas/catalog';
import { DISPLAY_DECIMALS, roundTo } from '../../shared/units/units';
// Coordinates and angles are read with the one decimal grammar (shared/units/decimal.ts).
import { isExponentForm, parseDecimal } from '../../shared/units/decimal';

/**
 * Two decimals past the display precision, so a value written and read back stays within the
 * display tolerance planManifest compares with, without writing binary noise such as 9.524999999999999.
 */
const lengthDecimals = (unit: Unit) => DISPLAY_DECIMALS[unit] + 2;
const ANGLE_DECIMALS = 6;

/** Shortest decimal text of a rounded value; never "-0" nor exponent form for values this small. */
function num(value: number, decimals: number): string {
  const r = roundTo(value, decimals);
  return r === 0 ? '0' : String(r);
}

export function formatDowels(points: readonly Point[], unit: Unit): string {
  const d = lengthDecimals(unit);
  return points.map((p) => `${num(p.x, d)},${num(p.y, d)}`).join('; ');
}

export function formatStops(stops: readonly Stop[], unit: Unit): string {
  const d = lengthDecimals(unit);
  return stops
    .map((s) => {
      let text = `${num(s.x, d)},${num(s.y, d)}`;
      if (s.z !== undefined) text += `,${num(s.z, d)}`;
      if (s.angle !== undefined) text += `@${num(s.angle, ANGLE_DECIMALS)}`;
      if (s.face !== undefined) text += `#${s.face + 1}`;
      return text;
    })
    .join('; ');
}

export function formatJawFaces(faces: readonly JawFace[], unit: Unit): string {
  const d = lengthDecimals(unit);
  return faces.map((f) => `${num(f.x, d)},${num(f.y, d)}@${num(f.normal, ANGLE_DECIMALS)}`).join('; ');
}

export type Parsed<T> = { ok: true; value: T } | { ok: false; message: string };


/** Items of a list; a trailing or doubled ";" leaves an empty item, which is skipped. */
const items = (text: string) => text.split(';').map((s) => s.trim()).filter((s) => s.length > 0);

function coordinates(text: string, what: string, example: string, count: readonly number[]): Parsed<number[]> {
  const parts = text.split(',').map((s) => s.trim());
  if (!count.includes(parts.length)) {
    const want = count.length === 1 ? 'x and y' : 'x and y, and optionally z,';
    return { ok: false, message: `${what} "${text}" needs ${want} separated by ","; write it like ${example}.` };
  }
  const values: number[] = [];
  for (const p of parts) {
    const v = parseDecimal(p);
    if (v === null) {
      const shown = p === '' ? 'a coordinate is missing' : isExponentForm(p) ? `"${p}" is in exponent form (write it as a plain decimal, digits and one ".")` : `"${p}" is not a number`;
      return { ok: false, message: `${what} "${text}": ${shown} (the decimal point is "." and "," separates coordinates); write it like ${example}.` };
    }
    values.push(v);
  }
  return { ok: true, value: values };
}

const DOWEL_EXAMPLE = '0,0; 8,0';
const STOP_EXAMPLE = '0.5,0.375@0; 1.5,0.375@0';
const FACE_EXAMPLE = '0,0.375@90';

export function parseDowels(text: string): Parsed<Point[]> {
  const out: Point[] = [];
  for (const [i, item] of items(text).entries()) {
    if (/[@#]/.test(item)) {
      return { ok: false, message: `Dowel ${i + 1} "${item}" has an angle or a face; a dowel is only x,y. Write dowels like ${DOWEL_EXAMPLE}.` };
    }
    const c = coordinates(item, `Dowel ${i + 1}`, DOWEL_EXAMPLE, [2]);
    if (!c.ok) return c;
    out.push({ x: c.value[0]!, y: c.value[1]! });
  }
  return { ok: true, value: out };
}

export function parseStops(text: string): Parsed<Stop[]> {
  const out: Stop[] = [];
  for (const [i, item] of items(text).entries()) {
    const what = `Stop ${i + 1}`;
    const m = /^([^@#]*)(?:@([^@#]*))?(?:#([^@#]*))?$/.exec(item);
    if (!m) {
      return { ok: false, message: `${what} "${item}" must read x,y[,z][@angle][#face], with "@" and "#" at most once each and in that order; write stops like ${STOP_EXAMPLE}.` };
    }
    const c = coordinates(m[1]!, what, STOP_EXAMPLE, [2, 3]);
    if (!c.ok) return c;
    const stop: Stop = { x: c.value[0]!, y: c.value[1]! };
    if (c.value.length === 3) stop.z = c.value[2]!;
    if (m[2] !== undefined) {
      const a = parseDecimal(m[2]);
      if (a === null) return { ok: false, message: `${what} "${item}": the angle after "@" must be a number of degrees, e.g. 0 or 90.` };
      stop.angle = a;
    }
    if (m[3] !== undefined) {
      const f = m[3].trim();
      if (!/^\d+$/.test(f) || Number(f) < 1) {
        return { ok: false, message: `${what} "${item}": the jaw face after "#" must be a whole number counted from 1 (#1 is the first jaw face).` };
      }
      stop.face = Number(f) - 1;
    }
    out.push(stop);
  }
  return { ok: true, value: out };
}

export function parseJawFaces(text: string): Parsed<JawFace[]> {
  const out: JawFace[] = [];
  for (const [i, item] of items(text).entries()) {
    const what = `Jaw face ${i + 1}`;
    const at = item.split('@');
    if (at.length !== 2) {
      return { ok: false, message: `${what} "${item}" needs a point and the direction of its normal after "@"; write jaw faces like ${FACE_EXAMPLE}.` };
    }
    const c = coordinates(at[0]!, what, FACE_EXAMPLE, [2]);
    if (!c.ok) return c;
    const normal = parseDecimal(at[1]!);
    if (normal === null) return { ok: false, message: `${what} "${item}": the normal after "@" must be a number of degrees, e.g. 90.` };
    out.push({ x: c.value[0]!, y: c.value[1]!, normal });
  }
  return { ok: true, value: out };
}
