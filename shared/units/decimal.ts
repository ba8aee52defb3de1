/**
 * The one grammar for a number a person writes into Gridset: a form field, a pasted bar size, a
 * spreadsheet cell held as text, a coordinate in a point list. It is the number grammar of
 * RS274/NGC (NIST RS274NGC Interpreter v3, §3.3.2.1; LinuxCNC G-code reference, "Numbers"),
 * which a machinist already types every day:
 *
 *   an optional sign (+ or -), then digits, then at most one decimal point "." and more digits,
 *   with at least one digit somewhere:   8   -0.5   .375   +2   1.
 *
 * Refused: exponents (1e-3: neither G-code nor a measured size is written so, and a stray "e" is
 * more often a typo), grouping or decimal commas (1,000 and 0,5 are ambiguous), spaces inside the
 * number, hexadecimal, Infinity and NaN. Spaces around the number are ignored.
 */
export const DECIMAL_PATTERN = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)$/;

/** Longer text is not a number a person wrote; bounded before the pattern runs. */
const MAX_DECIMAL_LENGTH = 64;

/** The number the text writes, or null when it is not a decimal of the grammar above (or does not fit a double). */
export function parseDecimal(text: string): number | null {
  if (text.length > MAX_DECIMAL_LENGTH * 4) return null;
  const t = text.trim();
  if (t.length > MAX_DECIMAL_LENGTH || !DECIMAL_PATTERN.test(t)) return null;
  const v = Number(t);
  return Number.isFinite(v) ? v : null;
}

/** True when the text writes a number in exponent form (1e-3, 2.5E+4): worth its own hint, since the grammar refuses it. */
export function isExponentForm(text: string): boolean {
  return /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)[eE][+-]?\d+$/.test(text.trim());
}
