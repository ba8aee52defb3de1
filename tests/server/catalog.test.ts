import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, tableCounts, withOwnApp, type Agent, type TestApp } from './test-app';

let t: TestApp;
let lead: Agent;
let programmer: Agent;
let operator: Agent;
beforeAll(async () => {
  t = await makeTestApp();
  [lead, programmer, operator] = await Promise.all([t.agent('lead'), t.agent('programmer'), t.agent('operator')]);
});
afterAll(async () => { await t.close(); });

const plate = { code: 'TEST-PLATE', name: 'Test plate', unit: 'in', pitch: 2, columns: 6, rows: 4, holeDiameter: 0.5, thread: '1/2-13', notes: '' };
const rail = {
  code: 'CR-12', kind: 'center-rail', name: 'Test rail', unit: 'in',
  dowels: [{ x: 0, y: 0 }, { x: 8, y: 0 }], stops: [{ x: 0.5, y: 0.375, angle: 0 }], jawFaces: [{ x: 0, y: 0.375, normal: 90 }],
};

describe('plates', () => {
  it('lists the demo plates as {items, total}', async () => {
    // The demo shop as seeded, on an app of its own: other tests here add plates.
    await withOwnApp(async (own) => {
      const operator = await own.agent('operator');
      const res = await operator.get('/api/plates').expect(200);
      expect(res.body.total).toBe(2);
      expect(res.body.items.map((p: { code: string }) => p.code)).toEqual(['GP-IN-12x8', 'GP-MM-10x7']);
    });
  });

  it('creates, reads, updates and deletes a plate; the edge margin defaults to half a pitch', async () => {
    const created = await programmer.post('/api/plates', plate).expect(201);
    expect(created.body).toMatchObject({ ...plate, edgeMargin: 1 });
    const id = created.body.id;
    const updated = await programmer.put(`/api/plates/${id}`, { ...plate, name: 'Renamed', columns: 7 }).expect(200);
    expect(updated.body).toMatchObject({ name: 'Renamed', columns: 7 });
    expect((await programmer.delete(`/api/plates/${id}`)).status).toBe(403);
    await lead.delete(`/api/plates/${id}`).expect(204);
    await lead.get(`/api/plates/${id}`).expect(404);
  });

  it('refuses bad input with 400 and field paths, and writes nothing', async () => {
    const before = await tableCounts(t.db, ['plates']);
    const res = await programmer.post('/api/plates', { ...plate, pitch: -2, columns: 2.5, unit: 'ft' });
    expect(res.status).toBe(400);
    const paths = res.body.error.details.issues.map((i: { path: string }) => i.path).sort();
    expect(paths).toEqual(['columns', 'pitch', 'unit']);
    expect(res.body.error.message).toMatch(/not valid/);
    expect(await tableCounts(t.db, ['plates'])).toEqual(before);
  });

  it('refuses a duplicate code with 409', async () => {
    const res = await programmer.post('/api/plates', { ...plate, code: 'GP-IN-12x8' });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/already exists/);
  });

  it('answers 400 for an id that is not a number', async () => {
    expect((await operator.get('/api/plates/abc')).status).toBe(400);
  });
});

describe('components', () => {
  it('pages with limit and offset, filters with q and kind', async () => {
    // The demo catalog as seeded (9 components, 4 jaw rails), on an app of its own: other tests here add components.
    await withOwnApp(async (own) => {
      const operator = await own.agent('operator');
      const page = await operator.get('/api/components?limit=3&offset=2').expect(200);
      expect(page.body.items).toHaveLength(3);
      expect(page.body.total).toBe(9);
      const all = await operator.get('/api/components').expect(200);
      expect(page.body.items.map((c: { code: string }) => c.code)).toEqual(all.body.items.slice(2, 5).map((c: { code: string }) => c.code));
      const q = await operator.get('/api/components?q=jaw').expect(200);
      expect(q.body.items.every((c: { name: string }) => /jaw/i.test(c.name))).toBe(true);
      expect(q.body.total).toBe(q.body.items.length);
      const rails = await operator.get('/api/components?kind=jaw-rail').expect(200);
      expect(rails.body.total).toBe(4);
      // LIKE wildcards in the search text match themselves, not any character.
      expect((await operator.get('/api/components?q=%25').expect(200)).body.total).toBe(0);
      expect((await operator.get('/api/components?limit=0')).status).toBe(400);
    });
  });

  it('creates a component with dowels, stops, jaw faces and a clamp model', async () => {
    const clamp = { acceptBelow: 0.03, acceptAbove: 0.03, topHeight: 0.2, topSlope: 0.5, gripLow: 0.04, gripHigh: 0.16, gripSlope: 0.5, slotSlop: 0.015 };
    const res = await lead.post('/api/components', { ...rail, code: 'JR-2.500', kind: 'jaw-rail', stops: [], clamp }).expect(201);
    expect(res.body).toMatchObject({ code: 'JR-2.500', clamp, outline: null, usedBy: 0 });
    const back = await operator.get(`/api/components/${res.body.id}`).expect(200);
    expect(back.body.dowels).toEqual(rail.dowels);
  });

  it('refuses a primary dowel off the origin, a stop naming a missing face, and an unknown kind', async () => {
    const before = await tableCounts(t.db, ['components']);
    const kind = await programmer.post('/api/components', { ...rail, kind: 'clamp' });
    expect(kind.status).toBe(400);
    expect(kind.body.error.details.issues[0]).toMatchObject({ path: 'kind', message: expect.stringMatching(/Kind must be one of/) });
    const res = await programmer.post('/api/components', { ...rail, dowels: [{ x: 1, y: 0 }], stops: [{ x: 0, y: 0, face: 3 }] });
    expect(res.status).toBe(400);
    const byPath = Object.fromEntries(res.body.error.details.issues.map((i: { path: string; message: string }) => [i.path, i.message]));
    expect(byPath['dowels.0']).toMatch(/local origin/);
    expect(byPath['stops.0.face']).toMatch(/jaw face 4/);
    expect(await tableCounts(t.db, ['components'])).toEqual(before);
  });

  it('lets an operator read but not write', async () => {
    expect((await operator.post('/api/components', rail)).status).toBe(403);
    expect((await operator.get('/api/components/1')).status).toBe(200);
  });

  it('refuses deleting a component a template version uses, with the reason', async () => {
    const comp = await lead.post('/api/components', { ...rail, code: 'CR-13' }).expect(201);
    const [tpl] = await t.db('templates').insert({ name: 'Uses CR-13', plate_id: 1 }).returning('id');
    const [ver] = await t.db('template_versions').insert({ template_id: tpl.id, number: 1, state: 'draft', content: '{}', content_hash: 'x' }).returning('id');
    await t.db('template_version_components').insert({ version_id: ver.id, component_id: comp.body.id });
    const res = await lead.delete(`/api/components/${comp.body.id}`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/CR-13 is used by 1 template version/);
    const plateRes = await lead.delete('/api/plates/1');
    expect(plateRes.status).toBe(409);
    // the demo template and the one above
    expect(plateRes.body.error.message).toMatch(/used by 2 template/);
  });
});

describe('settings and profile', () => {
  it('lets a lead change shop settings and an operator only read them', async () => {
    const current = (await operator.get('/api/settings').expect(200)).body;
    expect(current.probeToleranceIn).toBe(0.003);
    await lead.put('/api/settings', { ...current, shopName: 'Renamed shop' }).expect(200);
    expect((await operator.get('/api/settings')).body.shopName).toBe('Renamed shop');
    expect((await operator.put('/api/settings', current)).status).toBe(403);
    expect((await lead.put('/api/settings', { ...current, probeToleranceIn: 0 })).status).toBe(400);
  });

  it('keeps a display unit per user', async () => {
    await operator.patch('/api/auth/me', { displayUnit: 'mm' }).expect(200);
    expect((await operator.get('/api/auth/me')).body.user.displayUnit).toBe('mm');
    expect((await lead.get('/api/auth/me')).body.user.displayUnit).toBe(null);
    expect((await operator.patch('/api/auth/me', { displayUnit: 'ft' })).status).toBe(400);
  });
});

describe('users (admin)', () => {
  it('adds a user, changes the role, deactivates, and the old session stops working', async () => {
    const admin = await t.agent('admin');
    const created = await admin.post('/api/users', { email: 'New.Hand@gridset.test', name: 'New Hand', role: 'operator', password: 'a-long-password' }).expect(201);
    expect(created.body).toMatchObject({ email: 'new.hand@gridset.test', role: 'operator', active: true });
    const newbie = await t.agent();
    await newbie.post('/api/auth/login', { email: 'new.hand@gridset.test', password: 'a-long-password' }).expect(200);
    await admin.patch(`/api/users/${created.body.id}`, { role: 'reviewer' }).expect(200);
    expect((await newbie.get('/api/auth/me')).body.user.role).toBe('reviewer');
    await admin.patch(`/api/users/${created.body.id}`, { active: false }).expect(200);
    expect((await newbie.get('/api/auth/me')).status).toBe(401);
    expect((await admin.post('/api/users', { email: 'new.hand@gridset.test', name: 'x', role: 'operator', password: 'a-long-password' })).status).toBe(409);
  });

  it('keeps the last active admin', async () => {
    const admin = await t.agent('admin');
    const me = (await admin.get('/api/auth/me')).body.user;
    const res = await admin.patch(`/api/users/${me.id}`, { role: 'lead' });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/last active admin/);
  });
});
