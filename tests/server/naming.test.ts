import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { DEMO_CONVENTION } from '../../shared/naming/conventions';
import { makeTestApp, tableCounts, type Agent, type TestApp } from './test-app';

let t: TestApp;
let lead: Agent;
let programmer: Agent;
// A fresh demo shop per test: most tests here save a new convention version, which would change what the next one reads.
beforeEach(async () => { t = await makeTestApp(); [lead, programmer] = await Promise.all([t.agent('lead'), t.agent('programmer')]); });
afterEach(async () => { await t.close(); });

const rail = { kind: 'center-rail', name: 'Rail', unit: 'in', dowels: [{ x: 0, y: 0 }, { x: 8, y: 0 }], stops: [], jawFaces: [] };

describe('naming convention', () => {
  it('answers the demo convention and checks names with the token that fails', async () => {
    const current = (await programmer.get('/api/naming/convention').expect(200)).body;
    expect(current.version).toBe(1);
    const ok = await programmer.post('/api/naming/check', { target: 'layer', name: 'FX-CR-8' }).expect(200);
    expect(ok.body).toEqual({ ok: true, problems: [] });
    const bad = await programmer.post('/api/naming/check', { target: 'component', name: 'JR-1.5' }).expect(200);
    expect(bad.body.ok).toBe(false);
    expect(bad.body.problems.some((p: { token: string | null }) => p.token === 'width')).toBe(true);
    // DXF Reference symbol-table names, R12 set: at most 31 characters of letters, digits, $, - and _.
    const long = await programmer.post('/api/naming/check', { target: 'layer', name: `PART-${'A'.repeat(27)}` }).expect(200);
    expect(long.body.ok).toBe(false);
    expect((await programmer.post('/api/naming/check', { target: 'plate', name: 'x' })).status).toBe(400);
  });

  it('refuses a component whose code or layer breaks the convention, on the field to fix, writing nothing', async () => {
    const before = await tableCounts(t.db, ['components']);
    const res = await lead.post('/api/components', { ...rail, code: 'RAIL-8', layer: 'rails' });
    expect(res.status).toBe(400);
    const paths = res.body.error.details.issues.map((i: { path: string }) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['code', 'layer']));
    expect(await tableCounts(t.db, ['components'])).toEqual(before);
    await lead.post('/api/components', { ...rail, code: 'CR-9', layer: 'FX-CR-9' }).expect(201);
  });

  it('keeps every version; only a lead saves, and a broken rule is refused with its path', async () => {
    const { version: _v, ...rules } = DEMO_CONVENTION;
    expect((await programmer.put('/api/naming/convention', rules)).status).toBe(403);
    const bad = await lead.put('/api/naming/convention', { ...rules, component: { ...rules.component, patterns: ['{nope}-{size}'] } });
    expect(bad.status).toBe(400);
    const saved = await lead.put('/api/naming/convention', { ...rules, component: { ...rules.component, patterns: [...rules.component.patterns, 'TEST-{size}'] } }).expect(200);
    expect(saved.body.version).toBe(2);
    expect((await programmer.post('/api/naming/check', { target: 'component', name: 'TEST-5' })).body.ok).toBe(true);
    expect((await programmer.get('/api/naming/conventions')).body.items.map((i: { version: number }) => i.version)).toEqual([2, 1]);
  });

  it('refuses a save made from a version someone replaced meanwhile (409), writing nothing', async () => {
    const { version: _v, ...rules } = DEMO_CONVENTION;
    // Two leads open version 1; the first saves version 2 from it.
    await lead.put('/api/naming/convention', { ...rules, revision: 1 }).expect(200);
    const before = await tableCounts(t.db, ['naming_conventions', 'audit']);
    const stale = await lead.put('/api/naming/convention', { ...rules, revision: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error).toMatchObject({ code: 'stale-revision', details: { current: 2 } });
    expect(stale.body.error.message).toMatch(/version 2/);
    expect(await tableCounts(t.db, ['naming_conventions', 'audit'])).toEqual(before);
    expect((await lead.put('/api/naming/convention', { ...rules, revision: 0 })).status).toBe(400);
    expect((await lead.put('/api/naming/convention', { ...rules, revision: 2 }).expect(200)).body.version).toBe(3);
  });
});

describe('release and the naming convention', () => {
  it('refuses to release a version whose names break the convention, unless a lead waives it in writing', async () => {
    const created = await programmer.post('/api/templates', { name: 'Naming release', plateId: 1 }).expect(201);
    const id = created.body.id;
    await programmer.put(`/api/templates/${id}/versions/1`, {
      revision: 1, sharedOffset: { kind: 'center' }, numbering: { order: 'row-by-row' },
      placements: [
        { id: 'P1', component: 'CR-8', hole: { col: 1, row: 1 }, rotation: 0, stopsInUse: [0] },
        { id: 'J1', component: 'JR-1.000', hole: { col: 1, row: 2 }, rotation: 0, stopsInUse: [] },
      ],
    }).expect(200);
    // The lead tightens the convention after the fact: center rails are now "CRS-…".
    const { version: _v, ...rules } = DEMO_CONVENTION;
    const tightened = { ...rules, component: { ...rules.component, tokens: rules.component.tokens.map((tk) => (tk.name === 'kind' ? { ...tk, values: ['SR', 'VS'] } : tk)) } };
    await lead.put('/api/naming/convention', tightened).expect(200);
    const refused = await lead.post(`/api/templates/${id}/versions/1/release`, {});
    expect(refused.status).toBe(400);
    expect(refused.body.error.code).toBe('naming');
    expect(refused.body.error.details.naming[0]).toMatchObject({ target: 'component', name: 'CR-8' });
    expect((await lead.post(`/api/templates/${id}/versions/1/release`, { waiver: 'short' })).status).toBe(400);
    const released = await lead.post(`/api/templates/${id}/versions/1/release`, { waiver: 'Rail codes are renamed next month; this layout runs tonight.' }).expect(200);
    expect(released.body).toMatchObject({ state: 'released', namingWaiver: 'Rail codes are renamed next month; this layout runs tonight.' });
    await lead.put('/api/naming/convention', rules).expect(200);
  });
});

describe('drawing export and the naming convention', () => {
  it('refuses a drawing whose layers break the convention, naming the layer', async () => {
    // A convention without the GRID-… pattern refuses the drawing's own plate and hole layers.
    const { version: _v, ...rules } = DEMO_CONVENTION;
    await lead.put('/api/naming/convention', { ...rules, layer: { ...rules.layer, patterns: rules.layer.patterns.filter((p) => !p.startsWith('GRID-')), tokens: rules.layer.tokens.filter((tk) => tk.name !== 'what') } }).expect(200);
    const res = await programmer.get('/api/templates/2/versions/1/drawing.dxf');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/GRID-/);
    await lead.put('/api/naming/convention', rules).expect(200);
    expect((await programmer.get('/api/templates/2/versions/1/drawing.dxf')).status).toBe(200);
  });
});

describe('naming patterns that cannot freeze the server', () => {
  it('checks a name against (A|A)+ at once: the server matches in linear time', async () => {
    // (A|A)+ against A…AB backtracks through 2^n ways in a backtracking engine (Cox, "Regular
    // Expression Matching Can Be Simple And Fast", 2007): at 40 characters that would outlast the
    // test's time limit by days; V8's linear-time engine answers in one pass.
    const { version: _v, ...rules } = DEMO_CONVENTION;
    const evil = { ...rules, component: { ...rules.component, case: 'any' as const, patterns: ['{part}'], tokens: [{ name: 'part', type: 'regex', regex: '(A|A)+' }] } };
    await lead.put('/api/naming/convention', evil).expect(200);
    const res = await programmer.post('/api/naming/check', { target: 'component', name: `${'A'.repeat(39)}B` }).expect(200);
    expect(res.body.ok).toBe(false);
    expect((await programmer.post('/api/naming/check', { target: 'component', name: 'AAAA' }).expect(200)).body.ok).toBe(true);
    // Case still folds: a lowercase name fits an uppercase pattern, as the rule's regex tokens always have.
    expect((await programmer.post('/api/naming/check', { target: 'component', name: 'aaa' }).expect(200)).body.ok).toBe(true);
    await lead.put('/api/naming/convention', rules).expect(200);
  });

  it('refuses a pattern the linear engine cannot run (a back-reference), saying why, and keeps the old rules', async () => {
    const before = (await programmer.get('/api/naming/convention')).body.version;
    const { version: _v, ...rules } = DEMO_CONVENTION;
    const res = await lead.put('/api/naming/convention', { ...rules, layer: { ...rules.layer, patterns: ['{part}'], tokens: [{ name: 'part', type: 'regex', regex: '(A)\\1' }] } });
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body.error)).toMatch(/back-reference or a look-around/);
    expect((await programmer.get('/api/naming/convention')).body.version).toBe(before);
  });
});
