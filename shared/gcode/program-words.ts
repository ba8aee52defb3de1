/**
 * One line of RS274/NGC G-code split into words (a letter and a number) and comments, as in
 * NISTIR 6556 §3.3 ("Format of a line") and the LinuxCNC G-code overview: spaces between and
 * inside words are ignored, letters are case-insensitive, "( … )" and "; …" are comments.
 * Anything a part program of the supported subset never holds — parameters (#), expressions
 * ([ ]), O-word control, block delete (/) — is refused here with a sentence, not skipped.
 */
export interface Word {
  letter: string;
  value: number;
  /** The number as written (sign and decimals kept), so unchanged words are written back exactly. */
  text: string;
}

export interface LineWords {
  words: Word[];
  comments: string[];
  /** A "%" framing line. */
  percent: boolean;
}

export type LineResult = { ok: true; line: LineWords } | { ok: false; message: string };

/** LinuxCNC reads at most 255 characters per line (LINELEN in its interpreter). */
export const MAX_LINE_CHARS = 255;

const O_CONTROL = /^o\s*(?:<[^>]*>|\d+)\s*(sub|endsub|call|do|while|endwhile|if|elseif|else|endif|repeat|endrepeat|return|break|continue)\b/i;

const isDigitOrSign = (c: string) => (c >= '0' && c <= '9') || c === '.' || c === '+' || c === '-';

export function lineWords(raw: string): LineResult {
  if (raw.length > MAX_LINE_CHARS) return { ok: false, message: `the line is ${raw.length} characters long; a block holds at most ${MAX_LINE_CHARS}.` };
  const trimmed = raw.trim();
  if (trimmed.startsWith('%')) {
    if (trimmed.replace(/\(.*\)/, '').trim() !== '%') return { ok: false, message: 'a "%" line frames the program and holds nothing else.' };
    return { ok: true, line: { words: [], comments: [], percent: true } };
  }
  if (trimmed.startsWith('/')) return { ok: false, message: 'block delete ("/") is not in the supported subset: remove the block or the slash.' };
  if (O_CONTROL.test(trimmed)) return { ok: false, message: 'subprograms and O-word control (sub, call, if, while, repeat) are not in the supported subset: post the part program without them.' };
  const words: Word[] = [];
  const comments: string[] = [];
  let i = 0;
  const n = trimmed.length;
  while (i < n) {
    const ch = trimmed[i]!;
    if (ch === ' ' || ch === '\t') { i++; continue; }
    if (ch === '(') {
      const end = trimmed.indexOf(')', i + 1);
      if (end < 0) return { ok: false, message: 'a comment opened with "(" is not closed on the same line.' };
      const body = trimmed.slice(i + 1, end);
      if (body.includes('(')) return { ok: false, message: 'a comment holds another "(": comments do not nest.' };
      comments.push(body.trim());
      i = end + 1;
      continue;
    }
    if (ch === ';') { comments.push(trimmed.slice(i + 1).trim()); break; }
    if (ch === '#') return { ok: false, message: 'parameters (#) are not in the supported subset: post the part program with numbers only.' };
    if (ch === '[' || ch === ']') return { ok: false, message: 'expressions ([ ]) are not in the supported subset: post the part program with numbers only.' };
    const upper = ch.toUpperCase();
    if (upper < 'A' || upper > 'Z') return { ok: false, message: `"${ch}" is not a G-code word letter.` };
    let j = i + 1;
    let text = '';
    while (j < n) {
      const c = trimmed[j]!;
      if (c === ' ' || c === '\t') { j++; continue; }
      if (!isDigitOrSign(c)) break;
      text += c;
      j++;
    }
    if (text === '') {
      const next = trimmed[j];
      if (next === '[') return { ok: false, message: 'expressions ([ ]) are not in the supported subset: post the part program with numbers only.' };
      if (next === '#') return { ok: false, message: 'parameters (#) are not in the supported subset: post the part program with numbers only.' };
      return { ok: false, message: `the letter ${upper} has no number after it.` };
    }
    if (!/^[+-]?(\d+\.?\d*|\.\d+)$/.test(text)) return { ok: false, message: `"${upper}${text}" is not a number G-code can read.` };
    const value = Number(text);
    if (!Number.isFinite(value) || Math.abs(value) > 1e6) return { ok: false, message: `${upper}${text} is out of range.` };
    words.push({ letter: upper, value, text });
    i = j;
  }
  return { ok: true, line: { words, comments, percent: false } };
}
