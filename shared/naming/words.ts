/** Small helpers that put names and values into message sentences. */

/** Long names are cut in messages so a sentence stays readable; the cut is marked. */
const QUOTE_MAX = 40;

export function quote(s: string): string {
  return s.length > QUOTE_MAX ? `"${s.slice(0, QUOTE_MAX - 1)}…"` : `"${s}"`;
}

/** A character as a message shows it: "a space", "a tab", a control character by code, or quoted. */
export function showChar(ch: string): string {
  if (ch === ' ') return 'a space';
  if (ch === '\t') return 'a tab';
  const code = ch.codePointAt(0) ?? 0;
  if (code < 0x20 || code === 0x7f) return `a control character (U+${code.toString(16).toUpperCase().padStart(4, '0')})`;
  return `"${ch}"`;
}

/** "a, b and c" */
export function listInWords(items: string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

/** Allowed values as a message lists them; a long list is cut after a dozen. */
export function listValues(values: readonly string[]): string {
  const shown = values.slice(0, 12).join(', ');
  return values.length > 12 ? `${shown} and ${values.length - 12} more` : shown;
}

export function plural(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}

/** Like quote, but a long text keeps its end: what comes just before a problem is what matters. */
export function quoteEnd(s: string): string {
  return s.length > QUOTE_MAX ? `"…${s.slice(s.length - QUOTE_MAX + 1)}"` : `"${s}"`;
}
