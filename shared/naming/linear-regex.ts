/**
 * A lead's regular expression, matched in time linear in the name's length wherever the engine
 * allows it. V8's linear-time engine (the `l` flag, on behind --enable-experimental-regexp-engine;
 * the server switches it on at start) runs no backtracking, so a pattern such as (A|A)+ cannot
 * stall the server however long the name. That engine has no case-insensitive mode in this V8, so
 * case is folded by hand: the value is lowercased and so are the pattern's letters outside escapes
 * (ASCII names, as DXF layer names and codes are). Where the flag does not exist — a browser, or a
 * script that did not switch it on — the ordinary engine runs with the `i` flag: there the
 * nested-repeat check of compile-rule.ts is the guard, and a slow pattern stalls only that tab.
 */

export type TokenMatcher = { ok: true; test: (value: string) => boolean } | { ok: false; reason: 'syntax' | 'not-linear'; message: string };

/** Whether the linear-time engine is switched on in this process (asked each time: it may be switched on after load). */
export function linearEngineOn(): boolean {
  try {
    new RegExp('a', 'l');
    return true;
  } catch {
    return false;
  }
}

/**
 * Lowercases the letters of a pattern that stand for themselves, leaving escapes as written:
 * \D is not \d, and \p{Lu} names a property.
 */
export function foldPatternCase(source: string): string {
  let out = '';
  for (let i = 0; i < source.length; i++) {
    const ch = source[i]!;
    if (ch !== '\\') {
      out += ch.toLowerCase();
      continue;
    }
    const next = source[i + 1] ?? '';
    out += ch + next;
    i++;
    // \p{…}, \P{…}, \u{…}, \k<…>: the braced or bracketed part is a name, copied as it is.
    const open = source[i + 1];
    if ((next === 'p' || next === 'P' || next === 'u' || next === 'k') && (open === '{' || open === '<')) {
      const close = source.indexOf(open === '{' ? '}' : '>', i + 1);
      const end = close < 0 ? source.length - 1 : close;
      out += source.slice(i + 1, end + 1);
      i = end;
    }
  }
  return out;
}

/** Compiles a whole-value, case-insensitive matcher for a token's regular expression. */
export function compileTokenMatcher(source: string): TokenMatcher {
  try {
    // Compiled alone first: an unbalanced ")" would otherwise close the anchoring group.
    new RegExp(source);
  } catch (e) {
    return { ok: false, reason: 'syntax', message: e instanceof Error ? e.message : String(e) };
  }
  if (!linearEngineOn()) {
    const re = new RegExp(`^(?:${source})$`, 'i');
    return { ok: true, test: (value) => re.test(value) };
  }
  try {
    const re = new RegExp(`^(?:${foldPatternCase(source)})$`, 'l');
    return { ok: true, test: (value) => re.test(value.toLowerCase()) };
  } catch {
    return { ok: false, reason: 'not-linear', message: 'it uses a back-reference or a look-around, which cannot be checked in time proportional to the name' };
  }
}
