import { describe, expect, it } from 'vitest';
import { CAN, ROLES, type Action, type Role } from '../../shared/schemas/auth';
import { appWithEveryRole, type Agent } from './test-app';

/**
 * The lifecycle routes called on real versions, each prepared in the state its step starts from
 * and written by someone other than the caller, so the role rule itself is what answers. Who may
 * take each step comes from the roles table (`CAN`); where each step leads is the README's
 * "Reviews" lifecycle: draft → in-review → released → retired, changes requested → draft, and a
 * lead may release a draft directly.
 */
type Step = 'submit' | 'approve' | 'request-changes' | 'release' | 'retire';
type State = 'draft' | 'in-review' | 'released';
const STEPS: Record<Step, { access: Action; from: State; to: string; body?: object }> = {
  submit: { access: 'editTemplates', from: 'draft', to: 'in-review' },
  approve: { access: 'signOff', from: 'in-review', to: 'released', body: { comment: 'Checked against the plate.' } },
  'request-changes': { access: 'signOff', from: 'in-review', to: 'draft', body: { comment: 'Move the rail one hole.' } },
  release: { access: 'releaseTemplates', from: 'draft', to: 'released' },
  retire: { access: 'releaseTemplates', from: 'released', to: 'retired' },
};

const ctx = appWithEveryRole();
const as = (who: Role | 'none') => ctx.agents.get(who)!;

/** A new version of the demo template 1 (its v1 is released), written by `author`, brought to `state`. */
async function versionIn(state: State, author: 'lead' | 'programmer'): Promise<number> {
  const n = (await as(author).post('/api/templates/1/versions', { from: 1 }).expect(201)).body.version as number;
  if (state === 'in-review') await as(author).post(`/api/templates/1/versions/${n}/submit`).expect(200);
  if (state === 'released') await as('lead').post(`/api/templates/1/versions/${n}/release`).expect(200);
  return n;
}

const cases = (Object.keys(STEPS) as Step[]).flatMap((step) => (['none', ...ROLES] as const).map((who) => ({ step, who })));

describe('lifecycle routes on real versions, for every role', () => {
  it.each(cases)('$step as $who', async ({ step, who }) => {
    const s = STEPS[step];
    // Someone else wrote it: a lead's version for everyone but the lead, a programmer's for the lead.
    const n = await versionIn(s.from, who === 'lead' ? 'programmer' : 'lead');
    const res = await as(who).post(`/api/templates/1/versions/${n}/${step}`, s.body ?? {});
    const expected = who === 'none' ? 401 : CAN[s.access].includes(who) ? 200 : 403;
    expect(res.status, JSON.stringify(res.body)).toBe(expected);
    const now = (await as('lead').get(`/api/templates/1/versions/${n}`).expect(200)).body;
    if (expected === 200) expect(now.state).toBe(s.to);
    else {
      expect(res.body.error.message).toMatch(/^[A-Z].*\.$/);
      expect(now.state).toBe(s.from);
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
