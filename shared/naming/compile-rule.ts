/**
 * compileRule turns a rule (patterns, tokens, case, lengths) into a checker, or lists what is wrong
 * with the rule itself, each problem on the path of the field to fix.
 */
import type { NamingCheckResult, NamingProblem, NamingRule, NamingTarget, NamingToken } from '../schemas/naming';
import { DXF_CHARS_IN_WORDS, DXF_NAME_MAX_LENGTH, dxfBadChars } from './dxf-names';
import { bestSplit, describeMisses, diagnose, outranks, respellThrough, type CompiledPattern, type CompiledToken, type Segment, type Split } from './match-pattern';
import { compileTokenMatcher } from './linear-regex';
import { describeNumberFormat, fitsNumberFormat, formatNumber, parseNumberFormat, respellNumber } from './number-format';
import { TOKEN_NAME, parsePattern } from './pattern';
import { listInWords, listValues, plural, quote, showChar } from './words';

export interface RuleProblem {
  path: (string | number)[];
  message: string;
}

export interface NameChecker {
  readonly rule: NamingRule;
  readonly patterns: readonly CompiledPattern[];
  check(name: string, target: NamingTarget): NamingCheckResult;
  /** The name re-spelled through each pattern whose literal text it fits, closest first. */
  respell(name: string): string[];
}

export type CompileResult = { ok: true; checker: NameChecker } | { ok: false; problems: RuleProblem[] };

/** Longer names are refused on length alone, without matching (the DXF limit since R2000). */
const MATCH_LIMIT = 255;
const CASES = ['upper', 'lower', 'any'];

const nounOf = (target: NamingTarget) => (target === 'layer' ? 'layer name' : 'component code');

/**
 * Compiles a rule. With a target, the target's own limits count too: a layer rule may not write
 * text a DXF R12 name cannot hold, nor allow more than 31 characters.
 */
export function compileRule(rule: NamingRule, target?: NamingTarget): CompileResult {
  const problems: RuleProblem[] = [];
  const add = (path: (string | number)[], message: string) => problems.push({ path, message });

  if (!CASES.includes(rule.case)) add(['case'], 'Case must be "upper" (capitals only), "lower" (lower case only) or "any".');
  const caseProblem = (text: string): string | null => {
    if (rule.case === 'upper' && text !== text.toUpperCase()) return `the rule asks for capitals; write ${quote(text.toUpperCase())}`;
    if (rule.case === 'lower' && text !== text.toLowerCase()) return `the rule asks for lower case; write ${quote(text.toLowerCase())}`;
    return null;
  };
  const dxfProblem = (text: string): string | null => {
    if (target !== 'layer') return null;
    const bad = dxfBadChars(text);
    return bad.length ? `a layer name cannot hold ${listInWords(bad.map(showChar))} (DXF R12 names take only ${DXF_CHARS_IN_WORDS})` : null;
  };

  const lengthsOk = checkLengths(rule, target, add);

  // ---------- tokens ----------
  const compiled = new Map<string, CompiledToken>();
  const firstIndex = new Map<string, number>();
  rule.tokens.forEach((token, i) => {
    const name = token.name;
    if (!TOKEN_NAME.test(name)) {
      add(['tokens', i, 'name'], `Token name ${quote(name)} must start with a letter and hold only letters, digits and "_".`);
      return;
    }
    const first = firstIndex.get(name);
    if (first !== undefined) {
      add(['tokens', i, 'name'], `Token ${name} is defined twice (tokens ${first + 1} and ${i + 1}); give each token its own name.`);
      return;
    }
    firstIndex.set(name, i);
    const made = compileToken(token, i, add, caseProblem, dxfProblem);
    if (made) compiled.set(name, made);
  });

  // ---------- patterns ----------
  const patterns: CompiledPattern[] = [];
  const used = new Set<string>();
  const seen = new Map<string, number>();
  rule.patterns.forEach((source, i) => {
    const label = `Pattern ${i + 1}`;
    const again = seen.get(source);
    if (again !== undefined) {
      add(['patterns', i], `${label} is the same as pattern ${again + 1}; remove one.`);
      return;
    }
    seen.set(source, i);
    const parsed = parsePattern(source, label);
    if (!parsed.ok) {
      for (const message of parsed.problems) add(['patterns', i], message);
      return;
    }
    const segments: Segment[] = [];
    let literalLength = 0;
    let tokens = 0;
    let fine = true;
    for (const part of parsed.parts) {
      if (part.kind === 'literal') {
        const why = caseProblem(part.text) ?? dxfProblem(part.text);
        if (why) {
          add(['patterns', i], `${label} has the text ${quote(part.text)}, but ${why}.`);
          fine = false;
        }
        literalLength += part.text.length;
        segments.push({ kind: 'literal', text: part.text });
        continue;
      }
      used.add(part.name);
      tokens += 1;
      const token = compiled.get(part.name);
      if (token) segments.push({ kind: 'token', token });
      else {
        fine = false;
        if (!firstIndex.has(part.name)) {
          const near = [...firstIndex.keys()].find((k) => k.toLowerCase() === part.name.toLowerCase());
          add(['patterns', i], `${label} uses {${part.name}}, but no token is named ${part.name}; ${near ? `did you mean {${near}}?` : 'define it or fix the spelling.'}`);
        }
        // A token defined but broken is reported on the token itself.
      }
    }
    if (lengthsOk && literalLength + tokens > rule.maxLength) {
      add(['patterns', i], `${label} needs at least ${literalLength + tokens} characters, more than maxLength (${rule.maxLength}) allows.`);
      fine = false;
    }
    if (fine) patterns.push({ source, index: i, segments, literalLength });
  });
  rule.tokens.forEach((token, i) => {
    if (firstIndex.get(token.name) === i && !used.has(token.name)) {
      add(['tokens', i, 'name'], `Token ${token.name} is not used by any pattern; use it as {${token.name}} or remove it.`);
    }
  });

  if (problems.length) return { ok: false, problems };
  return { ok: true, checker: makeChecker(rule, patterns) };
}

function checkLengths(rule: NamingRule, target: NamingTarget | undefined, add: (path: (string | number)[], message: string) => void): boolean {
  let ok = true;
  if (!Number.isInteger(rule.minLength) || rule.minLength < 1) {
    add(['minLength'], 'minLength must be a whole number, 1 or more.');
    ok = false;
  }
  if (!Number.isInteger(rule.maxLength) || rule.maxLength < 1 || rule.maxLength > MATCH_LIMIT) {
    add(['maxLength'], `maxLength must be a whole number from 1 to ${MATCH_LIMIT}.`);
    return false;
  }
  if (ok && rule.maxLength < rule.minLength) {
    add(['maxLength'], `maxLength (${rule.maxLength}) is below minLength (${rule.minLength}); no name could pass.`);
    ok = false;
  }
  if (target === 'layer' && rule.maxLength > DXF_NAME_MAX_LENGTH) {
    add(['maxLength'], `maxLength is ${rule.maxLength}, but a layer name can be at most ${DXF_NAME_MAX_LENGTH} characters (DXF R12 symbol-table names); set it to ${DXF_NAME_MAX_LENGTH} or less.`);
    ok = false;
  }
  return ok;
}

function compileToken(
  token: NamingToken,
  i: number,
  add: (path: (string | number)[], message: string) => void,
  caseProblem: (text: string) => string | null,
  dxfProblem: (text: string) => string | null,
): CompiledToken | null {
  const name = token.name;
  switch (token.type) {
    case 'list': {
      if (token.values.length === 0) {
        add(['tokens', i, 'values'], `Token ${name} has no values; list at least one allowed value.`);
        return null;
      }
      let fine = true;
      const byKey = new Map<string, number>();
      token.values.forEach((value, k) => {
        const path = ['tokens', i, 'values', k];
        if (value.length === 0) {
          add(path, `Token ${name} has an empty value (value ${k + 1}); fill it in or remove it.`);
          fine = false;
          return;
        }
        const key = value.toLowerCase();
        const first = byKey.get(key);
        if (first !== undefined) {
          add(path, `Token ${name} lists ${quote(value)} twice (values ${first + 1} and ${k + 1}; case does not tell values apart); remove one.`);
          fine = false;
          return;
        }
        byKey.set(key, k);
        const why = caseProblem(value) ?? dxfProblem(value);
        if (why) {
          add(path, `Token ${name} has the value ${quote(value)}, but ${why}.`);
          fine = false;
        }
      });
      if (!fine) return null;
      const values = token.values;
      const canonical = new Map(values.map((v) => [v.toLowerCase(), v]));
      return {
        name,
        check: (value) => (canonical.has(value.toLowerCase()) ? null : `${name}: ${quote(value)} is not one of ${listValues(values)}.`),
        respell: (value) => canonical.get(value.toLowerCase()) ?? null,
      };
    }
    case 'number': {
      const format = parseNumberFormat(token.format);
      let fine = true;
      if (!format) {
        add(['tokens', i, 'format'], `Token ${name} has the format ${quote(token.format)}; write it like 0, 000, 0.000 or 0.0## (0 is a digit that must be there, # a decimal that may be left off).`);
        fine = false;
      }
      for (const end of ['min', 'max'] as const) {
        const v = token[end];
        if (v !== undefined && !Number.isFinite(v)) {
          add(['tokens', i, end], `Token ${name} has a ${end} that is not a finite number; enter a number or leave it out.`);
          fine = false;
        }
      }
      const { min, max } = token;
      if (fine && min !== undefined && max !== undefined && min > max) {
        add(['tokens', i, 'max'], `Token ${name} has max ${max} below min ${min}; no value could pass.`);
        fine = false;
      }
      if (format && format.maxDecimals > 0) {
        const why = dxfProblem('.');
        if (why) {
          add(['tokens', i, 'format'], `Token ${name} has the format ${quote(token.format)} with decimals, but ${why}; write the number without a point, as in 0000 for thousandths.`);
          fine = false;
        }
      }
      if (!fine || !format) return null;
      const like = describeNumberFormat(format);
      return {
        name,
        check: (value) => {
          if (!fitsNumberFormat(value, format)) return `${name}: ${quote(value)} must be a number written ${like}.`;
          const v = Number(value);
          if (min !== undefined && v < min) return `${name}: ${quote(value)} is below the smallest allowed, ${formatNumber(min, format)}.`;
          if (max !== undefined && v > max) return `${name}: ${quote(value)} is above the largest allowed, ${formatNumber(max, format)}.`;
          return null;
        },
        respell: (value) => respellNumber(value, format),
      };
    }
    case 'regex': {
      const path = ['tokens', i, 'regex'];
      if (token.regex.length === 0) {
        add(path, `Token ${name} has an empty regular expression; write one, such as [A-Z0-9]+.`);
        return null;
      }
      const matcher = compileTokenMatcher(token.regex);
      if (!matcher.ok) {
        add(path, matcher.reason === 'syntax'
          ? `Token ${name} has a regular expression that does not compile (${matcher.message}); fix it.`
          : `Token ${name} has a regular expression that cannot be checked safely: ${matcher.message}; write it without.`);
        return null;
      }
      if (hasNestedRepeat(token.regex)) {
        add(path, `Token ${name} repeats a group that itself repeats, as in (A+)+, which can take very long to check; write it without the outer repeat.`);
        return null;
      }
      const hint = token.hint?.trim();
      return {
        name,
        check: (value) =>
          matcher.test(value) ? null : hint ? `${name}: ${quote(value)} must be ${hint}.` : `${name}: ${quote(value)} does not match ${token.regex}.`,
        respell: () => null,
      };
    }
    default: {
      const type = (token as { type?: unknown }).type;
      add(['tokens', i, 'type'], `Token ${name} has the type ${quote(String(type))}; use "list", "number" or "regex".`);
      return null;
    }
  }
}

/**
 * A group holding a repeat, itself repeated — (A+)+, (\d*-?)*, ([A-Z]{2,})+ — can make a
 * backtracking engine take exponential time on a name that almost matches. A scan for that shape
 * catches the usual cause; names are short (at most 255 characters) besides.
 */
export function hasNestedRepeat(source: string): boolean {
  const groups: boolean[] = [];
  let current = false;
  let i = 0;
  // Only repeats of varying count matter: (AB){2} or (A{3})+ match one way only.
  const repeatAt = (j: number) => {
    const c = source[j];
    if (c === '+' || c === '*') return true;
    if (c === '{') return /^\{\d*,\d*\}/.test(source.slice(j));
    return false;
  };
  while (i < source.length) {
    const c = source[i]!;
    if (c === '\\') {
      i += 2;
    } else if (c === '[') {
      i += 1;
      if (source[i] === '^') i += 1;
      if (source[i] === ']') i += 1;
      while (i < source.length && source[i] !== ']') i += source[i] === '\\' ? 2 : 1;
      i += 1;
    } else if (c === '(') {
      groups.push(current);
      current = false;
      i += 1;
    } else if (c === ')') {
      const inner = current;
      current = groups.pop() ?? false;
      i += 1;
      if (repeatAt(i)) {
        if (inner) return true;
        current = true;
      } else if (inner) current = true;
      continue;
    } else {
      i += 1;
    }
    if (repeatAt(i)) current = true;
  }
  return false;
}

function makeChecker(rule: NamingRule, patterns: CompiledPattern[]): NameChecker {
  const ranked = (name: string) =>
    patterns
      .map((p) => ({ p, split: bestSplit(p, name) }))
      .filter((x): x is { p: CompiledPattern; split: Split } => x.split !== null)
      .sort((a, b) => a.split.cost - b.split.cost || b.p.literalLength - a.p.literalLength || a.p.index - b.p.index);

  const patternProblems = (name: string, noun: string): NamingProblem[] => {
    const fits = ranked(name);
    let problems: NamingProblem[];
    let closest: CompiledPattern | null;
    const best = fits[0];
    if (best) {
      if (best.split.cost === 0) return [];
      closest = best.p;
      problems = best.split.spans.filter((s) => s.problem).map((s) => ({ token: s.token.name, message: s.problem! }));
    } else {
      // Each pattern's best miss; those that read best and stop at the same place share one sentence.
      const misses = patterns.map((p) => ({ p, miss: diagnose(p, name) }));
      let top = misses[0]!.miss;
      for (const m of misses) if (outranks(m.miss, top)) top = m.miss;
      const group = misses.filter((m) => m.miss.at === top.at && m.miss.prevOk === top.prevOk);
      const pick = group.reduce((a, b) => (b.p.literalLength < a.p.literalLength ? b : a));
      const said = describeMisses(name, pick.miss.kind === 'literal' ? group.filter((m) => m.miss.kind === 'literal').map((m) => m.miss) : [pick.miss]);
      closest = said.alternatives ? null : pick.p;
      problems = [{ token: said.token, message: said.message }];
    }
    if (patterns.length > 1) {
      const which = `${patterns.length} ${noun.replace(' ', '-')} patterns`;
      problems.unshift({
        token: null,
        message: closest ? `${quote(name)} fits none of the ${which}; the closest is ${closest.source}.` : `${quote(name)} fits none of the ${which}.`,
      });
    }
    return problems;
  };

  return {
    rule,
    patterns,
    check(name, target) {
      const noun = nounOf(target);
      if (name.length === 0) return { ok: false, problems: [{ token: null, message: `The ${noun} is empty; enter one.` }] };
      const problems: NamingProblem[] = [];
      const cap = target === 'layer' ? Math.min(rule.maxLength, DXF_NAME_MAX_LENGTH) : rule.maxLength;
      if (name.length > cap) {
        const dxf = target === 'layer' && cap === DXF_NAME_MAX_LENGTH ? ' (DXF R12 symbol-table names)' : '';
        problems.push({ token: null, message: `A ${noun} must be at most ${plural(cap, 'character')}${dxf}; ${quote(name)} has ${name.length}.` });
      }
      if (name.length < rule.minLength) {
        problems.push({ token: null, message: `A ${noun} must be at least ${plural(rule.minLength, 'character')}; ${quote(name)} has ${name.length}.` });
      }
      if (target === 'layer') {
        const bad = dxfBadChars(name);
        if (bad.length) {
          const shown = bad.slice(0, 5).map(showChar);
          if (bad.length > 5) shown.push('others');
          problems.push({ token: null, message: `A layer name may hold only ${DXF_CHARS_IN_WORDS} (DXF R12 symbol-table names); ${quote(name)} has ${listInWords(shown)}.` });
        }
      }
      if (rule.case === 'upper' && name !== name.toUpperCase()) {
        problems.push({ token: null, message: `A ${noun} must be written in capitals: ${quote(name.toUpperCase())}, not ${quote(name)}.` });
      } else if (rule.case === 'lower' && name !== name.toLowerCase()) {
        problems.push({ token: null, message: `A ${noun} must be written in lower case: ${quote(name.toLowerCase())}, not ${quote(name)}.` });
      }
      if (name.length <= MATCH_LIMIT) problems.push(...patternProblems(name, noun));
      return { ok: problems.length === 0, problems };
    },
    respell(name) {
      if (name.length === 0 || name.length > MATCH_LIMIT) return [];
      return ranked(name).map(({ p, split }) => respellThrough(p, split));
    },
  };
}
