import { describe, expect, it } from 'vitest';
import { CAN, ROLES, type Action, type Role } from '../../shared/schemas/auth';
import { appWithEveryRole } from './test-app';

/**
 * The lifecycle routes called on real versions, each prepared in the state its step starts from
 * and written by someone other than the caller, so the role rule itself is what answers. Where each
 * step leads is the README's "Reviews" lifecycle: draft → in-review → released → retired, changes
 * requested → draft, and a lead may release a draft (or a version in review) directly.
 */
type Step = 'submit' | 'approve' | 'request-changes' | 'release' | 'retire';
type State = 'draft' | 'in-review' | 'released';
type Who = Role | 'none';

/**
 * Who may take each step, written out from the README's Roles table (rows "templates: edit, submit
 * for review", "reviews: approve, request changes", "templates: release, retire") — not read from
 * `CAN`, so a change to the roles table that the README does not make fails here.
 */
const README_ROLES: Record<Step, readonly Role[]> = {
  submit: ['lead', 'programmer'],
  approve: ['lead', 'reviewer'],
  'request-changes': ['lead', 'reviewer'],
  release: ['lead'],
  retire: ['lead'],
};

const CASES: { step: Step; from: State; to: string; body?: object }[] = [
  { step: 'submit', from: 'draft', to: 'in-review' },
  { step: 'approve', from: 'in-review', to: 'released', body: { comment: 'Checked against the plate.' } },
  { step: 'request-changes', from: 'in-review', to: 'draft', body: { comment: 'Move the rail one hole.' } },
  { step: 'release', from: 'draft', to: 'released' },
  { step: 'release', from: 'in-review', to: 'released' },
  { step: 'retire', from: 'released', to: 'retired' },
];
const STEPS: Record<Step, { body?: object }> = Object.fromEntries(CASES.map((c) => [c.step, { body: c.body }])) as Record<Step, { body?: object }>;

/** The exact answer for each role: 401 without a session, 200 for a role the README names, else 403. */
const expectedStatus = (step: Step, who: Who) => (who === 'none' ? 401 : README_ROLES[step].includes(who) ? 200 : 403);

const ctx = appWithEveryRole();
const as = (who: Role | 'none') => ctx.agents.get(who)!;

/** A new version of the demo template 1 (its v1 is released), written by `author`, brought to `state`. */
async function versionIn(state: State, author: 'lead' | 'programmer'): Promise<number> {
  const n = (await as(author).post('/api/templates/1/versions', { from: 1 }).expect(201)).body.version as number;
  if (state === 'in-review') await as(author).post(`/api/templates/1/versions/${n}/submit`).expect(200);
  if (state === 'released') await as('lead').post(`/api/templates/1/versions/${n}/release`).expect(200);
  return n;
}

const everyone: Who[] = ['none', 'operator', 'programmer', 'reviewer', 'lead', 'admin'];
const cases = CASES.flatMap((c) => everyone.map((who) => ({ ...c, who })));

describe('lifecycle routes on real versions, for every role', () => {
  it('covers every role there is and every lifecycle route the app serves', () => {
    expect([...everyone].sort()).toEqual(['none', ...ROLES].sort());
    const served = ctx.t.app.locals.routes
      .filter((r) => r.method.toUpperCase() === 'POST' && /^\/templates\/:id\/versions\/:n\/[a-z-]+$/.test(r.path))
      .map((r) => r.path.split('/').at(-1)!)
      .sort();
    expect(served).toEqual(Object.keys(README_ROLES).sort());
  });

  it('the README Roles table and the server agree on every step (CAN and the review lifecycle)', () => {
    const access: Record<Step, Action> = { submit: 'editTemplates', approve: 'signOff', 'request-changes': 'signOff', release: 'releaseTemplates', retire: 'releaseTemplates' };
    for (const step of Object.keys(README_ROLES) as Step[]) expect([...CAN[access[step]]].sort(), step).toEqual([...README_ROLES[step]].sort());
  });

  it.each(cases)('$step from $from as $who', async ({ step, from, to, body, who }) => {
    // Someone else wrote it: a lead's version for everyone but the lead, a programmer's for the lead.
    const n = await versionIn(from, who === 'lead' ? 'programmer' : 'lead');
    const res = await as(who).post(`/api/templates/1/versions/${n}/${step}`, body ?? {});
    const expected = expectedStatus(step, who);
    expect(res.status, JSON.stringify(res.body)).toBe(expected);
    const now = (await as('lead').get(`/api/templates/1/versions/${n}`).expect(200)).body;
    if (expected === 200) expect(now.state).toBe(to);
    else {
      expect(res.body.error.message).toMatch(/^[A-Z].*\.$/);
      expect(now.state).toBe(from);
    }
  });

  it.each([
    { step: 'approve' as const, author: 'lead' as const },
    { step: 'request-changes' as const, author: 'lead' as const },
  ])('the author may not $step their own version (403), and it stays in review', async ({ step, author }) => {
    const n = await versionIn('in-review', author);
    const res = await as(author).post(`/api/templates/1/versions/${n}/${step}`, STEPS[step].body);
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/someone else must/);
    expect((await as('lead').get(`/api/templates/1/versions/${n}`)).body.state).toBe('in-review');
    const audit = (await as('lead').get(`/api/audit?object=template-version&objectId=1/${n}`)).body.items.map((e: { action: string }) => e.action);
    expect(audit).toContain('version.submit');
    expect(audit).not.toContain(`version.${step}`);
  });

  it('a step from the wrong state is a 409 with a sentence, and writes nothing', async () => {
    const n = await versionIn('draft', 'programmer');
    const res = await as('reviewer').post(`/api/templates/1/versions/${n}/approve`, {});
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/^This version is draft/);
    const trail = (await as('lead').get(`/api/templates/1/versions/${n}/reviews`)).body.items;
    expect(trail).toEqual([]);
  });
});
