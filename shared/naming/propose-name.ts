import type { NamingRule, NamingTarget } from '../schemas/naming';
import { compileRule } from './compile-rule';
import { DXF_NAME_MAX_LENGTH } from './dxf-names';

/**
 * A conforming name derived simply from `name`, or null when none is. Used to offer a mapping
 * from a DXF file's layers (or a spreadsheet's codes) to the convention; a person confirms it.
 *
 * Tried in order, the first that passes checkName wins:
 *   1. the name as it is;
 *   2. the name with runs of spaces, then also dots, turned into one "-" (and, for layers, any
 *      other character a DXF R12 name cannot hold turned into "_");
 *   3. each of those re-spelled through the patterns whose literal text it fits: literals as the
 *      pattern writes them, a list value as listed ("vs" → "VS"), a number padded to its format
 *      ("1.5" → "1.500"; a decimal digit is never dropped);
 *   4. the rule's case applied, and for layers the result cut to the length limit.
 * Component codes are never cut: a shortened code could name another component.
 */
export function proposeName(rule: NamingRule, name: string, target: NamingTarget = 'layer'): string | null {
  const compiled = compileRule(rule, target);
  if (!compiled.ok || name.length === 0) return null;
  const { checker } = compiled;
  if (checker.check(name, target).ok) return name;

  const cap = target === 'layer' ? Math.min(rule.maxLength, DXF_NAME_MAX_LENGTH) : Infinity;
  const tried = new Set<string>([name]);
  for (const variant of variantsOf(name, target)) {
    for (const spelled of [...checker.respell(variant), variant]) {
      const cased = applyCase(spelled, rule.case);
      const candidates = cased.length > cap ? [cased, cased.slice(0, cap).replace(/[-_]+$/, '')] : [cased];
      for (const candidate of candidates) {
        if (candidate.length === 0 || tried.has(candidate)) continue;
        tried.add(candidate);
        if (checker.check(candidate, target).ok) return candidate;
      }
    }
  }
  return null;
}

function applyCase(s: string, rule: NamingRule['case']): string {
  if (rule === 'upper') return s.toUpperCase();
  if (rule === 'lower') return s.toLowerCase();
  return s;
}

const trimDashes = (s: string) => s.replace(/^-+|-+$/g, '');

function variantsOf(name: string, target: NamingTarget): string[] {
  const trimmed = name.trim();
  const spaced = trimDashes(trimmed.replace(/[\s-]*\s[\s-]*/g, '-'));
  const dotted = trimDashes(spaced.replace(/[.-]*\.[.-]*/g, '-'));
  const out = [name, trimmed, spaced, dotted];
  if (target === 'layer') out.push(dotted.replace(/[^A-Za-z0-9$_-]/gu, '_'));
  return [...new Set(out)].filter((s) => s.length > 0);
}
