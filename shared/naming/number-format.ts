/**
 * Number formats for number tokens, written the way a shop writes sizes: one character per digit,
 * `0` a digit that must be there, `#` a decimal that may be left off.
 *   "0"      8, 12, 200        a whole number, no leading zeros
 *   "000"    008, 050, 200     a whole number, zero-padded to at least 3 digits
 *   "0.000"  1.000, 12.500     exactly 3 decimals
 *   "0.0##"  0.5, 0.25, 0.375  1 to 3 decimals
 * No sign: a number in a name is a size or a count.
 */

export interface NumberFormat {
  /** Digits the whole part is zero-padded to. */
  intDigits: number;
  minDecimals: number;
  maxDecimals: number;
}

const FORMAT = /^(0+)(?:\.(0*)(#*))?$/;
const WRITTEN = /^(\d+)(?:\.(\d+))?$/;
/** Beyond 15 significant digits a double no longer holds every decimal written. */
const MAX_DIGITS = 15;

export function parseNumberFormat(format: string): NumberFormat | null {
  const m = FORMAT.exec(format);
  if (!m) return null;
  const intDigits = m[1]!.length;
  const zeros = m[2]?.length ?? 0;
  const hashes = m[3]?.length ?? 0;
  if (format.includes('.') && zeros + hashes === 0) return null;
  if (intDigits + zeros + hashes > MAX_DIGITS) return null;
  return { intDigits, minDecimals: zeros, maxDecimals: zeros + hashes };
}

/** The digits-and-point text of a value in the format; more decimals only when the value needs them. */
export function formatNumber(value: number, f: NumberFormat): string {
  let s = value.toFixed(f.maxDecimals);
  for (let d = f.minDecimals; d < f.maxDecimals; d++) {
    const t = value.toFixed(d);
    if (Number(t) === value) {
      s = t;
      break;
    }
  }
  const [whole = '0', decimals] = s.split('.');
  const padded = whole.padStart(f.intDigits, '0');
  return decimals === undefined ? padded : `${padded}.${decimals}`;
}

/** "like 1.000 (3 decimals)": an example and the rule in words, for messages. */
export function describeNumberFormat(f: NumberFormat): string {
  const example = formatNumber(1, { ...f, maxDecimals: f.minDecimals });
  if (f.maxDecimals === 0) {
    return f.intDigits > 1
      ? `like ${example} (a whole number of at least ${f.intDigits} digits, zero-padded)`
      : `like ${example} (a whole number)`;
  }
  let decimals: string;
  if (f.minDecimals === f.maxDecimals) decimals = `${f.minDecimals} decimal${f.minDecimals === 1 ? '' : 's'}`;
  else if (f.minDecimals === 0) decimals = `a whole number or up to ${f.maxDecimals} decimals`;
  else decimals = `${f.minDecimals} to ${f.maxDecimals} decimals`;
  const padding = f.intDigits > 1 ? `, at least ${f.intDigits} digits before the point, zero-padded` : '';
  return `like ${example} (${decimals}${padding})`;
}

/** Whether `written` is spelled exactly as the format writes a number. */
export function fitsNumberFormat(written: string, f: NumberFormat): boolean {
  const m = WRITTEN.exec(written);
  if (!m) return false;
  const whole = m[1]!;
  const decimals = m[2]?.length ?? 0;
  if (decimals < f.minDecimals || decimals > f.maxDecimals) return false;
  if (whole.length < f.intDigits) return false;
  // Zero-padding goes to the format's width and no further: with "000", 050 but not 0050.
  return whole.length === f.intDigits || whole[0] !== '0';
}

/**
 * The value re-spelled in the format when only zeros change (1.5 → 1.500 for "0.000", 8 → 008
 * for "000"), or null: a decimal digit is never dropped, not even a zero, since "1.000" written
 * where the format is "0000" may mean thousandths and must not become 0001.
 */
export function respellNumber(written: string, f: NumberFormat): string | null {
  const m = /^(\d*)(?:\.(\d*))?$/.exec(written);
  if (!m || written === '' || written === '.') return null;
  if ((m[2]?.length ?? 0) > f.maxDecimals) return null;
  const value = Number(written);
  if (!Number.isFinite(value)) return null;
  const s = formatNumber(value, f);
  return Number(s) === value ? s : null;
}
