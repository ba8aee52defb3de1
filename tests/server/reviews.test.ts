import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, type Agent, type TestApp } from './test-app';

let t: TestApp;
let programmer: Agent;
let reviewer: Agent;
let lead: Agent;
let admin: Agent;
beforeAll(async () => {
  t = await makeTestApp();
  [programmer, reviewer, lead, admin] = await Promise.all([t.agent('programmer'), t.agent('reviewer'), t.agent('lead'), t.agent('admin')]);
});
afterAll(async () => { await t.close(); });

/** A new draft v2 of the demo inch template (v1 released) with B-JR moved one hole in +X. */
async function draftWithMovedRail() {
  const v2 = (await programmer.post('/api/templates/1/versions', { from: 1 }).expect(201)).body;
  const placements = v2.placements.map((p: { id: string; hole: { col: number; row: number } }) =>
    p.id === 'B-CR' || p.id === 'B-JR' ? { ...p, hole: { ...p.hole, col: p.hole.col + 1 } } : p);
  await programmer.put(`/api/templates/1/versions/${v2.version}`, { ...v2, placements, revision: v2.revision }).expect(200);
  return v2.version as number;
}

describe('review lifecycle over the API', () => {
  it('submit → the author cannot approve → a reviewer approves, which releases it; the trail is kept', async () => {
    const n = await draftWithMovedRail();
    const submitted = await programmer.post(`/api/templates/1/versions/${n}/submit`).expect(200);
    expect(submitted.body.state).toBe('in-review');
    expect((await programmer.put(`/api/templates/1/versions/${n}`, { ...submitted.body })).status).toBe(409);
    const own = await programmer.post(`/api/templates/1/versions/${n}/approve`, { comment: 'fine' });
    expect(own.status).toBe(403);
    const approved = await reviewer.post(`/api/templates/1/versions/${n}/approve`, { comment: 'Stations 13–20 checked against the plate.' }).expect(200);
    expect(approved.body.state).toBe('released');
    const trail = (await reviewer.get(`/api/templates/1/versions/${n}/reviews`)).body.items;
    expect(trail.map((r: { action: string }) => r.action)).toEqual(['submit', 'approve']);
    expect(trail[1]).toMatchObject({ comment: 'Stations 13–20 checked against the plate.', byEmail: 'reviewer@gridset.test' });
    // Released versions never change; a lead retires them.
    expect((await reviewer.post(`/api/templates/1/versions/${n}/retire`)).status).toBe(403);
    expect((await lead.post(`/api/templates/1/versions/${n}/retire`).expect(200)).body.state).toBe('retired');
  });

  it('request-changes needs a comment and sends the version back to draft', async () => {
    const n = await draftWithMovedRail();
    await programmer.post(`/api/templates/1/versions/${n}/submit`).expect(200);
    expect((await reviewer.post(`/api/templates/1/versions/${n}/request-changes`, {})).status).toBe(400);
    const back = await reviewer.post(`/api/templates/1/versions/${n}/request-changes`, { comment: 'Rail B sits over the coolant drain; move it back.' }).expect(200);
    expect(back.body.state).toBe('draft');
  });

  it('refuses to submit a layout with problems, listing them', async () => {
    const v = (await programmer.post('/api/templates/1/versions', { from: 1 }).expect(201)).body;
    // Placed directly in the database: the save route would refuse it, but an older file or a catalog change can leave one behind.
    const row = await t.db('template_versions').where({ template_id: 1, number: v.version }).first();
    const content = JSON.parse(row.content);
    content.placements.push({ ...content.placements[0], id: 'DUP' });
    await t.db('template_versions').where({ id: row.id }).update({ content: JSON.stringify(content), content_hash: 'changed-for-test' });
    const res = await programmer.post(`/api/templates/1/versions/${v.version}/submit`);
    expect(res.status).toBe(400);
    expect(res.body.error.details.problems.length).toBeGreaterThan(0);
  });
});

describe('GET /api/templates/:id/diff', () => {
  it('one rail set moved one grid hole moves each of its stations by exactly the pitch (2.000 in)', async () => {
    const n = await draftWithMovedRail();
    const d = (await reviewer.get(`/api/templates/1/diff?from=1&to=${n}`).expect(200)).body;
    expect(d.placements.moved.map((m: { id: string }) => m.id).sort()).toEqual(['B-CR', 'B-JR']);
    for (const m of d.placements.moved) expect([m.dx, m.dy]).toEqual([2, 0]);
    expect(d.stations.changed).toHaveLength(8);
    for (const s of d.stations.changed) {
      expect(s.id).toMatch(/^B-CR:/);
      expect([s.dx, s.dy, s.dz, s.dc]).toEqual([2, 0, 0, 0]);
    }
    expect(d.stations.added).toEqual([]);
    expect(d.sharedOffset.changed).toBe(false);
    expect(d.summary).toMatch(/2 placements moved/);
    expect((await reviewer.get('/api/templates/1/diff?from=1')).status).toBe(400);
    expect((await reviewer.get('/api/templates/1/diff?from=1&to=99')).status).toBe(404);
  });
});

describe('audit trail', () => {
  it('records who did what, filterable by user and object, for lead and admin only', async () => {
    // Its own version, taken through every step here, so the trail does not rely on another test.
    const n = await draftWithMovedRail();
    await programmer.post(`/api/templates/1/versions/${n}/submit`).expect(200);
    await reviewer.post(`/api/templates/1/versions/${n}/approve`, { comment: 'Checked.' }).expect(200);
    await lead.post(`/api/templates/1/versions/${n}/retire`).expect(200);
    const all = (await admin.get('/api/audit').expect(200)).body;
    expect(all.total).toBeGreaterThan(0);
    const mine = (await lead.get(`/api/audit?object=template-version&objectId=1/${n}`).expect(200)).body.items;
    expect(mine.map((e: { action: string }) => e.action)).toEqual(expect.arrayContaining(['version.new-draft', 'version.save', 'version.submit', 'version.approve', 'version.retire']));
    const approve = mine.find((e: { action: string }) => e.action === 'version.approve');
    expect(approve).toMatchObject({ userEmail: 'reviewer@gridset.test', before: { state: 'in-review' }, after: { state: 'released' } });
    expect((await programmer.get('/api/audit')).status).toBe(403);
    expect((await admin.get('/api/audit?from=2026-13-01')).status).toBe(400);
  });
});
