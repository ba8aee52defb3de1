/**
 * Matching a name against one compiled pattern. Letters match regardless of case here (the rule's
 * case setting judges case, once, for the whole name), and every token takes at least one
 * character.
 *
 * Where a name can be split several ways (two tokens side by side, or a literal "-" that a token
 * value may also hold), the split with the fewest failing tokens wins; among equally good splits
 * the earlier token takes the longest value (greedy, with backtracking). Dynamic programming over
 * (pattern part, position) keeps this at O(parts × length²) token checks.
 */
import { quote, quoteEnd } from './words';

export interface CompiledToken {
  name: string;
  /** Null when the value is allowed, else the sentence that says why not. */
  check(value: string): string | null;
  /** The value in the token's own spelling (list value as listed, number in its format), or null. */
  respell(value: string): string | null;
}

export type Segment = { kind: 'literal'; text: string } | { kind: 'token'; token: CompiledToken };

export interface CompiledPattern {
  source: string;
  index: number;
  segments: Segment[];
  /** Characters of literal text; a pattern with more is the more specific one. */
  literalLength: number;
}

export interface Span {
  token: CompiledToken;
  value: string;
  problem: string | null;
}

export interface Split {
  cost: number;
  spans: Span[];
}

/** How far a name got before the pattern's literal text stopped fitting, and what was expected there. */
export type Miss = {
  at: number;
  /** Whether the token just before the miss (if any) held an allowed value: such misses read best. */
  prevOk: boolean;
} & (
  | { kind: 'literal'; wanted: string }
  | { kind: 'value'; token: string }
  | { kind: 'extra' }
);

const sameText = (a: string, b: string) => a.length === b.length && a.toLowerCase() === b.toLowerCase();

/** The best split of `name` into the pattern's literals and token values, or null when the literals do not fit. */
export function bestSplit(p: CompiledPattern, name: string): Split | null {
  const n = name.length;
  const memo = new Map<number, Split | null>();
  const go = (i: number, pos: number): Split | null => {
    if (i === p.segments.length) return pos === n ? { cost: 0, spans: [] } : null;
    const key = i * (n + 1) + pos;
    const known = memo.get(key);
    if (known !== undefined) return known;
    const seg = p.segments[i]!;
    let best: Split | null = null;
    if (seg.kind === 'literal') {
      if (sameText(name.slice(pos, pos + seg.text.length), seg.text)) best = go(i + 1, pos + seg.text.length);
    } else {
      for (let end = n; end > pos; end--) {
        const rest = go(i + 1, end);
        if (!rest) continue;
        const value = name.slice(pos, end);
        const problem = seg.token.check(value);
        const cost = rest.cost + (problem ? 1 : 0);
        if (!best || cost < best.cost) best = { cost, spans: [{ token: seg.token, value, problem }, ...rest.spans] };
        if (best.cost === 0) break;
      }
    }
    memo.set(key, best);
    return best;
  };
  return go(0, 0);
}

/** Where and why the pattern's literal text does not fit `name`; call it when bestSplit is null. */
export function diagnose(p: CompiledPattern, name: string): Miss {
  const n = name.length;
  const width = n + 1;
  const prevOk = new Map<number, boolean>();
  const queue: number[] = [];
  const reach = (i: number, pos: number, ok: boolean) => {
    const key = i * width + pos;
    const had = prevOk.get(key);
    if (had === undefined) {
      prevOk.set(key, ok);
      queue.push(key);
    } else if (ok && !had) prevOk.set(key, true);
  };
  const misses: Miss[] = [];
  reach(0, 0, true);
  // First in, first out: every arrival at part i + 1 is in before any state of part i + 1 is read.
  for (let q = 0; q < queue.length; q++) {
    const key = queue[q]!;
    const i = Math.floor(key / width);
    const pos = key % width;
    const ok = prevOk.get(key)!;
    const seg = p.segments[i];
    if (!seg) {
      if (pos < n) {
        misses.push({ at: pos, prevOk: ok, kind: 'extra' });
      }
      continue;
    }
    if (seg.kind === 'literal') {
      const text = seg.text;
      let k = 0;
      while (k < text.length && pos + k < n && sameText(name[pos + k]!, text[k]!)) k++;
      if (k === text.length) {
        reach(i + 1, pos + k, true);
        continue;
      }
      misses.push({ at: pos + k, prevOk: ok, kind: 'literal', wanted: text.slice(k) });
      continue;
    }
    if (pos === n) {
      misses.push({ at: n, prevOk: ok, kind: 'value', token: seg.token.name });
      continue;
    }
    for (let end = pos + 1; end <= n; end++) reach(i + 1, end, seg.token.check(name.slice(pos, end)) === null);
  }
  let best = misses[0] ?? { at: 0, prevOk: true, kind: 'extra' };
  for (const m of misses) if (outranks(m, best)) best = m;
  return best;
}

/** The miss that reads best: after an allowed token value, then the furthest into the name. */
export function outranks(a: Miss, b: Miss): boolean {
  return (a.prevOk && !b.prevOk) || (a.prevOk === b.prevOk && a.at > b.at);
}

/**
 * One sentence for misses at the same place (from one pattern or several): `Expected "-" after
 * "FX", found "_".` Several expected texts are cut to what they share ("-JR-" and "-ST" → "-"),
 * or listed when they share nothing (`Expected "FX-", "PART-" or "GRID-" at the start`).
 */
export function describeMisses(name: string, misses: Miss[]): { token: string | null; message: string; alternatives: boolean } {
  const first = misses[0]!;
  const at = first.at;
  const where = at === 0 ? 'at the start' : `after ${quoteEnd(name.slice(0, at))}`;
  if (first.kind === 'extra') {
    return { token: null, message: `Expected the name to end after ${quoteEnd(name.slice(0, at))}, found ${quote(name.slice(at))}.`, alternatives: false };
  }
  if (first.kind === 'value') {
    return { token: first.token, message: `Expected a value for {${first.token}} ${where}, but the name ends there.`, alternatives: false };
  }
  const wanted = [...new Set(misses.flatMap((m) => (m.kind === 'literal' ? [m.wanted] : [])))];
  let shared = wanted[0]!;
  for (const w of wanted) while (!w.toLowerCase().startsWith(shared.toLowerCase())) shared = shared.slice(0, -1);
  // Drop an expected text that another one starts with: "JR-" covers "JR-S".
  const shown = shared ? [shared] : wanted.filter((w) => !wanted.some((v) => v !== w && w.startsWith(v))).slice(0, 6);
  const longest = Math.max(...shown.map((w) => w.length));
  const found = at < name.length ? `, found ${quote(name.slice(at, at + longest))}` : ', but the name ends there';
  const expected = shown.map((w) => quote(w));
  const list = expected.length > 1 ? `${expected.slice(0, -1).join(', ')} or ${expected[expected.length - 1]}` : expected[0];
  return { token: null, message: `Expected ${list} ${where}${found}.`, alternatives: shown.length > 1 };
}

/** The name re-spelled through the pattern: literals as the pattern writes them, token values in their own spelling. */
export function respellThrough(p: CompiledPattern, split: Split): string {
  let k = 0;
  return p.segments
    .map((seg) => {
      if (seg.kind === 'literal') return seg.text;
      const span = split.spans[k++]!;
      return span.token.respell(span.value) ?? span.value;
    })
    .join('');
}
