/**
 * Canonical JSON: object keys sorted by UTF-16 code units, no white space, numbers as
 * JavaScript writes them (the shortest round-tripping form, ECMA-262 Number::toString), undefined
 * members left out. The same layout always gives the same text, so its SHA-256 identifies it.
 */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') {
    if (typeof value === 'number' && !Number.isFinite(value)) throw new Error('Canonical JSON cannot hold NaN or Infinity.');
    return JSON.stringify(value) ?? 'null';
  }
  if (Array.isArray(value)) return `[${value.map((v) => (v === undefined ? 'null' : canonicalJson(v))).join(',')}]`;
  const entries = Object.entries(value as Record<string, unknown>)
    .filter(([, v]) => v !== undefined)
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
}
