import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ACTION_WORDS, CAN, ROLES, type Action } from '../../shared/schemas/auth';

/**
 * The README's Roles table (a GitHub-flavoured Markdown table, GFM spec "Tables") is the
 * published statement of who may do what; `CAN` is what the server enforces. Neither may drift.
 */
function readmeRolesTable(): { roles: string[]; rows: Map<string, string[]> } {
  const readme = readFileSync(path.join(__dirname, '../../README.md'), 'utf8');
  const section = readme.split(/^## /m).find((s) => s.startsWith('Roles\n'));
  if (!section) throw new Error('README has no "## Roles" section');
  const lines = section.split('\n').filter((l) => l.startsWith('|'));
  const cells = (l: string) => l.slice(1, l.endsWith('|') ? -1 : undefined).split('|').map((c) => c.trim());
  const [header, rule, ...body] = lines;
  expect(cells(rule!).every((c) => /^:?-+:?$/.test(c))).toBe(true);
  const roles = cells(header!).slice(1);
  const rows = new Map<string, string[]>();
  for (const l of body) {
    const [action, ...marks] = cells(l);
    rows.set(action!, roles.filter((_, i) => marks[i] === '✓'));
  }
  return { roles, rows };
}

describe('README Roles table equals the roles table the server enforces', () => {
  const { roles, rows } = readmeRolesTable();

  it('has one column per role, in the order of ROLES', () => {
    expect(roles).toEqual([...ROLES]);
  });

  it('has one row per action and no other', () => {
    expect([...rows.keys()].sort()).toEqual(Object.values(ACTION_WORDS).sort());
  });

  it.each(Object.keys(CAN) as Action[])('%s: the same roles', (action) => {
    expect([...(rows.get(ACTION_WORDS[action]) ?? [])].sort()).toEqual([...CAN[action]].sort());
  });

  it('measured bars: operators record them, reviewers and admins do not', () => {
    // The README states it in words too: operators record bars at the machine.
    expect(rows.get(ACTION_WORDS.recordBars)).toContain('operator');
    expect(rows.get(ACTION_WORDS.recordBars)).not.toContain('reviewer');
    expect(rows.get(ACTION_WORDS.recordBars)).not.toContain('admin');
  });
});
