import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { VersionDiffAnswerSchema } from '../../shared/schemas/diff';
import { TemplateVersionSchema } from '../../shared/schemas/template-api';
import { makeTestApp, type Agent, type TestApp } from './test-app';

let t: TestApp;
let programmer: Agent;
beforeAll(async () => { t = await makeTestApp(); programmer = await t.agent('programmer'); });
afterAll(async () => { await t.close(); });

describe('GET /api/templates/:id/diff lists every changed station value', () => {
  it('moving rail set B one hole in +X moves each of its stations by one pitch in X, before → after', async () => {
    const v1 = TemplateVersionSchema.parse((await programmer.get('/api/templates/1/versions/1').expect(200)).body);
    const draft = TemplateVersionSchema.parse((await programmer.post('/api/templates/1/versions', { from: 1 }).expect(201)).body);
    // Grid hole (i, j) is at (i·pitch, j·pitch) (PRODUCT.md, placement transform); the demo plate's pitch is read from the version.
    const pitch = v1.plate.pitch;
    const placements = draft.placements.map((p) => (p.id === 'B-CR' || p.id === 'B-JR' ? { ...p, hole: { ...p.hole, col: p.hole.col + 1 } } : p));
    await programmer.put(`/api/templates/1/versions/${draft.version}`, { revision: draft.revision, placements, sharedOffset: draft.sharedOffset, numbering: draft.numbering }).expect(200);

    const diff = VersionDiffAnswerSchema.parse((await programmer.get(`/api/templates/1/diff?from=1&to=${draft.version}`).expect(200)).body);
    const railB = v1.stations.filter((s) => s.placement === 'B-CR');
    expect(railB.length).toBeGreaterThan(0);
    // One X line per station of rail B, with v1's X before and X + pitch after; nothing else moved, no width changed.
    expect(diff.stationValues.map((v) => [v.id, v.field])).toEqual(railB.map((s) => [s.id, 'x']));
    for (const s of railB) {
      const line = diff.stationValues.find((v) => v.id === s.id)!;
      expect(line.from).toBeCloseTo(s.x, 9);
      expect(line.to).toBeCloseTo(s.x + pitch, 9);
    }
  });

  it('refuses a version that does not exist with a 404 sentence', async () => {
    const res = await programmer.get('/api/templates/1/diff?from=1&to=999');
    expect(res.status).toBe(404);
    expect(res.body.error.message).toMatch(/Version 999/);
  });
});
