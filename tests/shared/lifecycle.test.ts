import { describe, expect, it } from 'vitest';
import { transition, REVIEW_ACTIONS, type ReviewAction } from '../../shared/review/lifecycle';
import { ROLES, type Role } from '../../shared/schemas/auth';
import { VERSION_STATES, type VersionState } from '../../shared/schemas/template-api';

/**
 * Every (state, action, role) triple with its expected answer, written out by hand: a new state is
 * where the version goes; 403 means the role may not; 409 means not from this state. The author
 * column is the same actor when they wrote the version (approving or sending back one's own → 403).
 * Columns: admin, lead, programmer, reviewer, operator.
 */
const TABLE: Record<ReviewAction, Record<VersionState, string>> = {
  edit: {
    draft: '403 draft draft 403 403',
    'in-review': '403 409 409 403 403',
    released: '403 409 409 403 403',
    retired: '403 409 409 403 403',
  },
  submit: {
    draft: '403 in-review in-review 403 403',
    'in-review': '403 409 409 403 403',
    released: '403 409 409 403 403',
    retired: '403 409 409 403 403',
  },
  approve: {
    draft: '403 409 403 409 403',
    'in-review': '403 released 403 released 403',
    released: '403 409 403 409 403',
    retired: '403 409 403 409 403',
  },
  'request-changes': {
    draft: '403 409 403 409 403',
    'in-review': '403 draft 403 draft 403',
    released: '403 409 403 409 403',
    retired: '403 409 403 409 403',
  },
  retire: {
    draft: '403 409 403 403 403',
    'in-review': '403 409 403 403 403',
    released: '403 retired 403 403 403',
    retired: '403 409 403 403 403',
  },
  release: {
    draft: '403 released 403 403 403',
    'in-review': '403 released 403 403 403',
    released: '403 409 403 403 403',
    retired: '403 409 403 403 403',
  },
};

const rows = REVIEW_ACTIONS.flatMap((action) =>
  VERSION_STATES.flatMap((state) => {
    const cells = TABLE[action][state].split(' ');
    return ROLES.map((role, i) => ({ action, state, role, expected: cells[i]! }));
  }),
);

const answer = (state: VersionState, action: ReviewAction, role: Role, isAuthor: boolean) => {
  const t = transition(state, action, { role, isAuthor });
  return t.ok ? t.to : String(t.status);
};

describe('review lifecycle (draft → in-review → released → retired; changes requested → draft)', () => {
  it('covers every action, state and role', () => {
    expect(rows).toHaveLength(REVIEW_ACTIONS.length * VERSION_STATES.length * ROLES.length);
  });

  it.each(rows)('$action on a $state version by a $role (not its author) → $expected', ({ action, state, role, expected }) => {
    expect(answer(state, action, role, false)).toBe(expected);
  });

  it.each(rows.filter((r) => r.action === 'approve' || r.action === 'request-changes'))(
    '$action on a $state version by its own author, a $role → never allowed',
    ({ action, state, role, expected }) => {
      // Where a non-author would succeed, the author is refused with 403; elsewhere the answer stands.
      const ownExpected = expected === '403' || expected === '409' ? expected : '403';
      expect(answer(state, action, role, true)).toBe(ownExpected);
    },
  );

  it('says why in a sentence', () => {
    const own = transition('in-review', 'approve', { role: 'reviewer', isAuthor: true });
    expect(own).toMatchObject({ ok: false, status: 403, message: expect.stringMatching(/someone else must approve/) });
    const frozen = transition('released', 'edit', { role: 'programmer', isAuthor: true });
    expect(frozen).toMatchObject({ ok: false, status: 409, message: expect.stringMatching(/released versions never change/) });
  });

  // Starting a new draft from a version leaves that version's state alone, from any state;
  // only the roles that write templates may (README, Roles: "templates: edit").
  it.each(VERSION_STATES.flatMap((state) => ROLES.map((role) => ({ state, role }))))('new draft from a $state version by a $role', ({ state, role }) => {
    const expected = role === 'lead' || role === 'programmer' ? state : '403';
    const t = transition(state, 'new-version', { role, isAuthor: false });
    expect(t.ok ? t.to : String(t.status)).toBe(expected);
  });
});
