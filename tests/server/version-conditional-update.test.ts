import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { templatesRepo } from '../../server/db/templates-repo';
import { makeTestApp, type TestApp } from './test-app';

/**
 * A version changes by one conditional UPDATE (SQLite documentation, "UPDATE": only rows matching
 * the WHERE clause change, and the changes() count says how many): if another writer moved the
 * version's state or revision since it was read, nothing changes and the caller answers 409.
 */
let t: TestApp;
beforeAll(async () => { t = await makeTestApp(); });
afterAll(async () => { await t.close(); });

describe('conditional version update', () => {
  it('applies only from the state and revision read; otherwise changes nothing', async () => {
    const programmer = await t.agent('programmer');
    const draft = (await programmer.post('/api/templates/1/versions', { from: 1 }).expect(201)).body;
    const repo = templatesRepo(t.db);
    const row = async () => (await repo.version(1, draft.version))!.row;
    const read = await row();

    // Someone else saved first: the revision read is stale.
    expect(await repo.applyTransition(t.db, read.id, { from: 'draft', revision: read.revision - 1 }, 'in-review')).toBe(false);
    // Someone else submitted first: the state read is stale.
    expect(await repo.applyTransition(t.db, read.id, { from: 'in-review', revision: read.revision }, 'released')).toBe(false);
    expect(await row()).toEqual(read);

    expect(await repo.applyTransition(t.db, read.id, { from: 'draft', revision: read.revision }, 'in-review')).toBe(true);
    const after = await row();
    expect({ state: after.state, revision: after.revision }).toEqual({ state: 'in-review', revision: read.revision + 1 });
    // The same step again finds nothing to change: the second of two racing callers gets 409.
    expect(await repo.applyTransition(t.db, read.id, { from: 'draft', revision: read.revision }, 'in-review')).toBe(false);
  });

  it('answers 409 with a sentence when a step comes after another changed the version', async () => {
    const [programmer, lead] = await Promise.all([t.agent('programmer'), t.agent('lead')]);
    const draft = (await programmer.post('/api/templates/1/versions', { from: 1 }).expect(201)).body;
    await programmer.post(`/api/templates/1/versions/${draft.version}/submit`).expect(200);
    const res = await lead.post(`/api/templates/1/versions/${draft.version}/release`);
    expect(res.status).toBe(200);
    const again = await lead.post(`/api/templates/1/versions/${draft.version}/release`);
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/^This version is released: released versions never change\.$/);
  });
});
