/**
 * Layer names are DXF symbol-table names (DXF Reference, TABLES section, LAYER). Gridset holds
 * them to the R12 rules, which every DXF reader accepts: at most 31 characters, each a letter,
 * a digit, "$", "-" or "_". Later releases allow longer names with spaces and most punctuation,
 * but a DXF written for a machine's CAM station must open anywhere, so the strict set is the
 * fixed rule under every layer convention.
 */

export const DXF_NAME_MAX_LENGTH = 31;

const DXF_NAME_CHAR = /^[A-Za-z0-9$_-]$/;

export function isDxfNameChar(ch: string): boolean {
  return DXF_NAME_CHAR.test(ch);
}

/** The distinct characters of `name` that DXF R12 names may not hold, in order of first use. */
export function dxfBadChars(name: string): string[] {
  const seen = new Set<string>();
  for (const ch of name) if (!isDxfNameChar(ch)) seen.add(ch);
  return [...seen];
}

export const DXF_CHARS_IN_WORDS = 'letters, digits, "$", "-" and "_"';
