import type { FieldIssue } from '../../../shared/schemas/issues';
import type { NamingTarget } from '../../../shared/schemas/naming';
import type { RulesDraft } from './rule-draft';

/**
 * Where each problem with the rules is shown. The schema and the server address a problem by its
 * path in the JSON (`layer.tokens.0.values.3`); the form has a field for each such place, whose id
 * is made from the same path, and a problem whose path ends inside no field (a list as a whole, a
 * token as a whole) is shown on the nearest field or list that holds it.
 */

/** Paths the form shows a field (or a list of rows) for, below a rule. */
const FIELD_PATHS = [
  /^patterns\.\d+$/, /^patterns$/, /^case$/, /^minLength$/, /^maxLength$/, /^tokens$/,
  /^tokens\.\d+\.(name|type|values|format|min|max|regex|hint)$/, /^tokens\.\d+\.values\.\d+$/,
];

/** The path of the field that shows a problem at `path`: the path itself, or the nearest one above it that is a field; '' for the form as a whole. */
export function fieldPathOf(path: string): string {
  const parts = path.split('.').filter(Boolean);
  const target = parts[0];
  if (target !== 'layer' && target !== 'component') return '';
  for (let n = parts.length; n > 1; n--) {
    const below = parts.slice(1, n).join('.');
    if (FIELD_PATHS.some((re) => re.test(below))) return `${target}.${below}`;
    // A token as a whole (its type is unknown): the token's name field is where the eye goes.
    if (/^tokens\.\d+$/.test(below)) return `${target}.${below}.name`;
  }
  return target;
}

/** The HTML id of the field for a path, e.g. naming-layer-tokens-0-values-3. */
export const fieldId = (path: string) => `naming-${path.replace(/\./g, '-') || 'form'}`;

/** The issues grouped by the field that shows them. */
export function issuesByField(issues: readonly FieldIssue[]): Map<string, string[]> {
  const out = new Map<string, string[]>();
  for (const i of issues) {
    const key = fieldPathOf(i.path);
    const message = inWords(i.message);
    const list = out.get(key) ?? [];
    if (!list.includes(message)) list.push(message);
    out.set(key, list);
  }
  return out;
}

/** The JSON names in a message said as the form labels its fields. */
export function inWords(message: string): string {
  return message
    .replace(/\bminLength\b/g, 'the shortest length')
    .replace(/\bmaxLength\b/g, 'the longest length')
    .replace(/\ba min\b/g, 'a smallest value')
    .replace(/\ba max\b/g, 'a largest value')
    .replace(/\bmin must\b/g, 'The smallest value must')
    .replace(/\bmax must\b/g, 'The largest value must')
    .replace(/\bhas max (\S+) below min (\S+)/g, 'has the largest value $1 below the smallest value $2')
    .replace(/^the (shortest|longest)/, (m) => m[0]!.toUpperCase() + m.slice(1));
}

const TARGET_WORDS: Record<NamingTarget, string> = { layer: 'Layer names', component: 'Component codes' };
const TOKEN_FIELD_WORDS: Record<string, string> = {
  name: 'name', type: 'type', values: 'values', format: 'number format', min: 'smallest value', max: 'largest value', regex: 'regular expression', hint: 'hint',
};

/** Where a field is, in words for the summary above the form: "Layer names, token what, value 6". */
export function fieldWords(path: string, rules: RulesDraft): string {
  const [target, ...rest] = path.split('.');
  if (target !== 'layer' && target !== 'component') return 'The rules';
  const words = [TARGET_WORDS[target]];
  const [what, index, field, sub] = rest;
  if (what === 'patterns') words.push(index === undefined ? 'patterns' : `pattern ${Number(index) + 1}`);
  else if (what === 'tokens') {
    if (index === undefined) words.push('tokens');
    else {
      const name = rules[target].tokens[Number(index)]?.name.trim();
      words.push(name ? `token ${name}` : `token ${Number(index) + 1}`);
      if (field === 'values' && sub !== undefined) words.push(`value ${Number(sub) + 1}`);
      else if (field) words.push(TOKEN_FIELD_WORDS[field] ?? field);
    }
  } else if (what === 'case') words.push('case');
  else if (what === 'minLength') words.push('shortest length');
  else if (what === 'maxLength') words.push('longest length');
  return words.join(', ');
}
