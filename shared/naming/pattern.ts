/**
 * A pattern is literal text with {tokens}: `FX-{kind}-{size}`. Braces only ever mark tokens (no
 * layer or code character set needs them), so there is no escape syntax to learn.
 */

export type PatternPart = { kind: 'literal'; text: string } | { kind: 'token'; name: string };

export const TOKEN_NAME = /^[A-Za-z][A-Za-z0-9_]*$/;

export type ParsedPattern = { ok: true; parts: PatternPart[] } | { ok: false; problems: string[] };

/** Splits a pattern into literal text and token names; `label` names it in messages ("Pattern 2"). */
export function parsePattern(source: string, label: string): ParsedPattern {
  if (source.length === 0) {
    return { ok: false, problems: [`${label} is empty; write literal text and {tokens}, such as FX-{kind}.`] };
  }
  const parts: PatternPart[] = [];
  const problems: string[] = [];
  let literal = '';
  let i = 0;
  while (i < source.length) {
    const ch = source[i]!;
    if (ch === '}') {
      problems.push(`${label} has a "}" at character ${i + 1} with no "{" before it; write tokens as {name}.`);
      i += 1;
      continue;
    }
    if (ch !== '{') {
      literal += ch;
      i += 1;
      continue;
    }
    const close = source.indexOf('}', i + 1);
    const nextOpen = source.indexOf('{', i + 1);
    if (close < 0 || (nextOpen >= 0 && nextOpen < close)) {
      problems.push(`${label} has a "{" at character ${i + 1} with no "}" after it; write tokens as {name}.`);
      i += 1;
      continue;
    }
    const name = source.slice(i + 1, close);
    if (name.length === 0) {
      problems.push(`${label} has an empty token {} at character ${i + 1}; put a token name between the braces.`);
    } else if (!TOKEN_NAME.test(name)) {
      problems.push(`${label} has the token {${name}}; a token name starts with a letter and holds only letters, digits and "_".`);
    } else {
      if (literal) parts.push({ kind: 'literal', text: literal });
      literal = '';
      parts.push({ kind: 'token', name });
    }
    i = close + 1;
  }
  if (literal) parts.push({ kind: 'literal', text: literal });
  return problems.length ? { ok: false, problems } : { ok: true, parts };
}
