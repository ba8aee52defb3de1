import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { HomeSchema } from '../../shared/schemas/home';
import { TemplateSummarySchema, TemplateVersionSchema } from '../../shared/schemas/template-api';
import { makeTestApp, type Agent, type TestApp } from './test-app';

// Which lists each role's home holds follows the README's Roles table: reviews for "reviews: approve,
// request changes", drafts for "templates: edit", jobs on an older release for "jobs: create and edit",
// jobs without a stock check for "measured bars: record", audit lines for "audit trail: read".
// Every expected list below is read from the database rows by the test itself, not from the service.

let t: TestApp;
const as: Record<string, Agent> = {};
beforeAll(async () => {
  t = await makeTestApp();
  for (const role of ['admin', 'lead', 'programmer', 'reviewer', 'operator'] as const) as[role] = await t.agent(role);
});
afterAll(async () => { await t.close(); });

const home = async (role: string) => HomeSchema.parse((await as[role]!.get('/api/home').expect(200)).body);
const userId = async (email: string) => (await t.db('users').where({ email }).first()).id as number;

const job = {
  name: 'Home list run', partNumber: 'BR-2002', partRevision: 'A', templateId: 1, version: 1,
  stock: { width: 1, thickness: 0.5, length: 2.75, material: '6061-T6' },
  carrier: 0.25, clearance: 0.03, minBite: 0.06, cycleMinutes: 13, loadMinutes: 10,
};

describe('GET /api/home on the demo shop', () => {
  it('answers 401 without a session', async () => {
    expect((await (await t.agent()).get('/api/home')).status).toBe(401);
  });

  it('gives each role only its own lists (README Roles table)', async () => {
    const sections = (h: Awaited<ReturnType<typeof home>>) => Object.entries(h).filter(([k, v]) => k !== 'role' && v !== null).map(([k]) => k).sort();
    expect(sections(await home('admin'))).toEqual(['audit']);
    expect(sections(await home('reviewer'))).toEqual(['reviews']);
    expect(sections(await home('operator'))).toEqual(['jobsUnchecked']);
    expect(sections(await home('programmer'))).toEqual(['drafts', 'jobsBehind', 'jobsUnchecked']);
    expect(sections(await home('lead'))).toEqual(['audit', 'drafts', 'jobsBehind', 'jobsUnchecked', 'reviews']);
  });

  it('lists nothing waiting in the demo shop: both templates released, its one job checked and on the latest release', async () => {
    const inReview = await t.db('template_versions').where({ state: 'in-review' });
    const checked = await t.db('job_stock_checks').distinct('job_id');
    const jobs = await t.db('jobs');
    expect(inReview).toHaveLength(0);
    expect(checked.map((r) => r.job_id).sort()).toEqual(jobs.map((j) => j.id).sort());
    const lead = await home('lead');
    expect(lead.reviews).toEqual([]);
    expect(lead.jobsBehind).toEqual([]);
    expect(lead.jobsUnchecked).toEqual([]);
  });

  it('shows the ten newest audit lines to lead and admin, newest first, as the audit table holds them', async () => {
    const rows = await t.db('audit').orderBy('id', 'desc').limit(10);
    const lines = (await home('admin')).audit!;
    expect(lines.map((l) => l.id)).toEqual(rows.map((r) => r.id));
    expect(lines.map((l) => l.summary)).toEqual(rows.map((r) => r.summary));
  });
});

describe('GET /api/home with versions and jobs the test makes', () => {
  it('takes a draft through submit, changes requested, submit and approval, and each home follows', async () => {
    const programmerId = await userId('programmer@gridset.test');
    const draft = TemplateVersionSchema.parse((await as.programmer!.post('/api/templates/1/versions', { from: 1 }).expect(201)).body);
    expect(draft.status).toBe('draft');
    const n = draft.version;
    expect((await t.db('template_versions').where({ template_id: 1, number: n }).first()).author_id).toBe(programmerId);

    // The author's draft is on the author's home, and on nobody else's.
    expect((await home('programmer')).drafts!.map((d) => [d.templateId, d.version, d.status])).toEqual([[1, n, 'draft']]);
    expect((await home('lead')).drafts).toEqual([]);

    await as.programmer!.post(`/api/templates/1/versions/${n}/submit`).expect(200);
    // Waits for the reviewer and the lead (both sign off; neither wrote it), read against released v1.
    const programmerName = (await t.db('users').where({ id: programmerId }).first()).name as string;
    for (const role of ['reviewer', 'lead']) {
      const r = (await home(role)).reviews!;
      expect(r).toHaveLength(1);
      expect(r[0]).toMatchObject({ templateId: 1, version: n, compareFrom: 1, submittedBy: programmerName });
    }
    expect((await home('programmer')).drafts).toEqual([]);

    const comment = 'Stop 3 on rail B faces the wrong way; turn it and submit again.';
    await as.reviewer!.post(`/api/templates/1/versions/${n}/request-changes`, { comment }).expect(200);
    const reviewerName = (await t.db('users').where({ email: 'reviewer@gridset.test' }).first()).name as string;
    // Still a draft in the database (the lifecycle table's request-changes step leads to draft) …
    expect((await t.db('template_versions').where({ template_id: 1, number: n }).first()).state).toBe('draft');
    // … but it shows as sent back, with the comment, on the author's home, the version and the list.
    const sentBack = (await home('programmer')).drafts!;
    expect(sentBack).toHaveLength(1);
    expect(sentBack[0]).toMatchObject({ version: n, status: 'changes-requested', changesRequested: { comment, by: reviewerName } });
    const version = TemplateVersionSchema.parse((await as.reviewer!.get(`/api/templates/1/versions/${n}`).expect(200)).body);
    expect(version).toMatchObject({ state: 'draft', status: 'changes-requested', changesRequested: { comment, by: reviewerName } });
    const summary = TemplateSummarySchema.parse((await as.operator!.get('/api/templates/1').expect(200)).body);
    expect(summary.versions.find((v) => v.number === n)).toMatchObject({ state: 'draft', status: 'changes-requested' });
    expect(summary.versions.find((v) => v.number === 1)).toMatchObject({ status: 'released', changesRequested: null });
    expect((await home('reviewer')).reviews).toEqual([]);

    // Saving keeps the mark (the comment still applies); submitting again clears it.
    await as.programmer!.put(`/api/templates/1/versions/${n}`, { revision: version.revision, placements: version.placements, sharedOffset: version.sharedOffset, numbering: version.numbering }).expect(200);
    expect((await home('programmer')).drafts![0]!.status).toBe('changes-requested');
    const again = TemplateVersionSchema.parse((await as.programmer!.post(`/api/templates/1/versions/${n}/submit`).expect(200)).body);
    expect(again).toMatchObject({ status: 'in-review', changesRequested: null });
    expect((await home('programmer')).drafts).toEqual([]);

    // Released: the demo job pinned to v1 now has a newer release to look at.
    await as.reviewer!.post(`/api/templates/1/versions/${n}/approve`, { comment: 'Checked.' }).expect(200);
    const pinnedToV1 = await t.db('jobs as j').join('template_versions as v', 'v.id', 'j.version_id').where({ 'v.template_id': 1, 'v.number': 1 }).select('j.id');
    expect(pinnedToV1.length).toBeGreaterThan(0);
    const behind = (await home('programmer')).jobsBehind!;
    expect(behind.map((j) => j.id).sort()).toEqual(pinnedToV1.map((r) => r.id).sort());
    expect(behind.every((j) => j.version === 1 && j.newerRelease === n)).toBe(true);
    expect((await home('reviewer')).reviews).toEqual([]);
  });

  it('does not ask the author of a version in review to review it', async () => {
    const leadDraft = (await as.lead!.post('/api/templates/2/versions', { from: 1 }).expect(201)).body.version as number;
    await as.lead!.post(`/api/templates/2/versions/${leadDraft}/submit`).expect(200);
    expect((await home('lead')).reviews!.some((r) => r.templateId === 2 && r.version === leadDraft)).toBe(false);
    expect((await home('reviewer')).reviews!.filter((r) => r.templateId === 2).map((r) => r.version)).toEqual([leadDraft]);
  });

  it('lists a new job until its first stock check', async () => {
    const released = await t.db('template_versions').where({ template_id: 1, state: 'released' }).max({ n: 'number' }).first();
    const id = (await as.programmer!.post('/api/jobs', { ...job, version: Number(released!.n) }).expect(201)).body.id as number;
    expect((await home('operator')).jobsUnchecked!.map((j) => j.id)).toEqual([id]);
    await as.operator!.post(`/api/jobs/${id}/stock-check`, { bars: [{ id: 'B1', width: 1, thickness: 0.5, cornerRadius: 0.02 }] }).expect(200);
    expect(await t.db('job_stock_checks').where({ job_id: id })).toHaveLength(1);
    expect((await home('operator')).jobsUnchecked).toEqual([]);
  });
});
