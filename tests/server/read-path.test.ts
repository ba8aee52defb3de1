import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import request from 'supertest';
import { createApp } from '../../server/app';
import { hotReads } from '../../server/db/hot-reads';
import { catalogRepo } from '../../server/db/catalog-repo';
import { openDb, targetOf, type Db } from '../../server/db/knex';
import { DEMO_PASSWORD } from '../../server/db/seed-demo';
import { makeTestApp, type Agent, type TestApp, bodyBytes } from './test-app';

let t: TestApp;
let programmer: Agent;
let lead: Agent;
let operator: Agent;
beforeAll(async () => {
  t = await makeTestApp();
  [programmer, lead, operator] = await Promise.all([t.agent('programmer'), t.agent('lead'), t.agent('operator')]);
});
afterAll(async () => { await t.close(); });

/** The expected tag, computed here from the bytes received: SHA-1 (FIPS 180-4) in base64url (RFC 4648, 5), quoted as an entity-tag (RFC 9110, 8.8.3). */
const sha1Tag = (b: Buffer) => `"${createHash('sha1').update(b).digest('base64url')}"`;

async function revalidates(agent: Agent, url: string): Promise<{ etag: string; body: unknown }> {
  const first = await bodyBytes(agent.get(url)).expect(200);
  const etag = first.headers.etag as string;
  // RFC 9110, 8.8.1: a strong validator has no W/ prefix; RFC 9111, 5.2.2.4 and 5.2.2.7: private, no-cache.
  expect(etag).toBe(sha1Tag(first.body as Buffer));
  expect(first.headers['cache-control']).toBe('private, no-cache');
  // RFC 9110, 13.1.2 and 15.4.5: a matching If-None-Match on a GET is 304 Not Modified with no body,
  // and the 304 carries the same ETag and Cache-Control.
  const again = await agent.get(url).set('If-None-Match', etag).expect(304);
  expect(again.text ?? '').toBe('');
  expect(again.headers.etag).toBe(etag);
  expect(again.headers['cache-control']).toBe('private, no-cache');
  // A tag that does not match gets the whole answer.
  await agent.get(url).set('If-None-Match', '"something-else"').expect(200);
  return { etag, body: JSON.parse((first.body as Buffer).toString('utf8')) };
}

describe('conditional GETs on catalog and version reads', () => {
  it('a catalog page: 200 with a strong ETag, 304 on a match, a new ETag after a component is edited', async () => {
    const url = '/api/components?limit=50';
    const before = await revalidates(operator, url);
    const item = (before.body as { items: { id: number; code: string; name: string }[] }).items[0]!;
    const full = (await operator.get(`/api/components/${item.id}`).expect(200)).body;
    const { id: _id, usedBy: _u, createdAt: _c, updatedAt: _up, ...fields } = full;
    await lead.put(`/api/components/${item.id}`, { ...fields, name: `${item.name} (re-measured)` }).expect(200);
    const after = await bodyBytes(operator.get(url).set('If-None-Match', before.etag)).expect(200);
    expect(after.headers.etag).not.toBe(before.etag);
    const renamed = JSON.parse((after.body as Buffer).toString('utf8')).items.find((c: { id: number }) => c.id === item.id);
    expect(renamed.name).toBe(`${item.name} (re-measured)`);
    // The component itself is revalidated the same way.
    await revalidates(operator, `/api/components/${item.id}`);
  });

  it('a version and its station table: 304 on a match, new ETags once the draft is saved with the shared offset moved', async () => {
    const draft = (await programmer.post('/api/templates/1/versions', { from: 1 }).expect(201)).body;
    const n = draft.version as number;
    const version = await revalidates(operator, `/api/templates/1/versions/${n}`);
    const stations = await revalidates(operator, `/api/templates/1/versions/${n}/stations`);
    // The demo layout's shared offset is on hole (1,1); one hole along X moves the origin +1 pitch in X,
    // so every station's X (measured from that origin) is one pitch less (hand arithmetic).
    expect(draft.sharedOffset).toMatchObject({ kind: 'hole', hole: { col: 1, row: 1 } });
    await programmer.put(`/api/templates/1/versions/${n}`, { placements: draft.placements, sharedOffset: { ...draft.sharedOffset, hole: { col: 2, row: 1 } }, numbering: draft.numbering, revision: draft.revision }).expect(200);
    const v2 = await bodyBytes(operator.get(`/api/templates/1/versions/${n}`).set('If-None-Match', version.etag)).expect(200);
    expect(v2.headers.etag).not.toBe(version.etag);
    expect(v2.headers.etag).toBe(sha1Tag(v2.body as Buffer));
    const s2 = await bodyBytes(operator.get(`/api/templates/1/versions/${n}/stations`).set('If-None-Match', stations.etag)).expect(200);
    expect(s2.headers.etag).not.toBe(stations.etag);
    expect(s2.headers.etag).toBe(sha1Tag(s2.body as Buffer));
    const before = (stations.body as { stations: { number: number; x: number }[] }).stations;
    const after = JSON.parse((s2.body as Buffer).toString('utf8')).stations as { number: number; x: number }[];
    expect(after).toHaveLength(before.length);
    for (const s of after) expect(s.x).toBeCloseTo(before.find((b) => b.number === s.number)!.x - draft.plate.pitch, 9);
    // The released version 1 is not touched: its tag still matches.
    const v1 = await revalidates(operator, '/api/templates/1/versions/1/stations');
    await operator.get('/api/templates/1/versions/1/stations').set('If-None-Match', v1.etag).expect(304);
  });

  it('a new draft that uses components counts in their usedBy at once (the catalog page changes)', async () => {
    const page = async () => (await operator.get('/api/components?limit=5000').expect(200)).body.items as { code: string; usedBy: number }[];
    const before = new Map((await page()).map((c) => [c.code, c.usedBy]));
    const draft = (await programmer.post('/api/templates/1/versions', { from: 1 }).expect(201)).body;
    const used = new Set((draft.placements as { component: string }[]).map((p) => p.component));
    for (const c of await page()) expect(c.usedBy).toBe(before.get(c.code)! + (used.has(c.code) ? 1 : 0));
  });

  it('routes grouped by their first word still answer an unknown path under that word as no route', async () => {
    const res = await operator.get('/api/templates/1/versions/1/nothing-here').expect(404);
    expect(res.body.error.message).toBe('There is no API route GET /templates/1/versions/1/nothing-here.');
    // The same word's list route and a route with a dot after the word are still found.
    await operator.get('/api/templates').expect(200);
    expect((await operator.get('/api/manifest.xlsx')).status).not.toBe(404);
  });

  it('an unknown version is 404 with its sentence, never a kept answer', async () => {
    const res = await operator.get('/api/templates/1/versions/999/stations').expect(404);
    expect(res.body.error.message).toBe('Version 999 of template 1 was not found.');
    expect(res.headers['cache-control']).toBeUndefined();
  });
});

describe('a second app process on the same database', () => {
  let db2: Db;
  let other: ReturnType<typeof createApp>;
  beforeAll(async () => {
    // Its own database handle: its own kept pages and statements, as another process would have.
    db2 = openDb(targetOf(t.db));
    other = createApp({ db: db2, sessionSecret: 'test-secret', dataDir: t.dataDir, log: () => {} });
  });
  afterAll(async () => {
    await other.locals.close();
    await db2.destroy();
  });

  async function signIn(role: string) {
    const agent = request.agent(other);
    const token = (await agent.get('/api/auth/csrf').expect(200)).body.token as string;
    const res = await agent.post('/api/auth/login').set('X-CSRF-Token', token).send({ email: `${role}@gridset.test`, password: DEMO_PASSWORD }).expect(200);
    const cookie = (res.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith('gridset.sid='))!.split(';')[0]!;
    return { agent, token: res.body.csrfToken as string, cookie };
  }

  it('sees a component edited through the first app at once, though it kept the page', async () => {
    const { agent } = await signIn('operator');
    const first = (await agent.get('/api/components?limit=50').expect(200)).body.items[1];
    const full = (await operator.get(`/api/components/${first.id}`).expect(200)).body;
    const { id: _id, usedBy: _u, createdAt: _c, updatedAt: _up, ...fields } = full;
    await lead.put(`/api/components/${first.id}`, { ...fields, notes: 'Edited on the first app.' }).expect(200);
    const after = (await agent.get('/api/components?limit=50').expect(200)).body.items.find((c: { id: number }) => c.id === first.id);
    expect(after.notes).toBe('Edited on the first app.');
  });

  it('ends a session at once when the first app deactivates its user', async () => {
    const { agent } = await signIn('reviewer');
    await agent.get('/api/auth/me').expect(200);
    const admin = await t.agent('admin');
    const users = (await admin.get('/api/users').expect(200)).body;
    const reviewer = (users.items ?? users).find((u: { email: string }) => u.email === 'reviewer@gridset.test');
    await admin.patch(`/api/users/${reviewer.id}`, { active: false }).expect(200);
    await agent.get('/api/auth/me').expect(401);
    await admin.patch(`/api/users/${reviewer.id}`, { active: true }).expect(200);
  });

  it('a session signed out on one app is gone on the other', async () => {
    const { cookie, token } = await signIn('operator');
    await request(t.app).get('/api/auth/me').set('Cookie', cookie).expect(200);
    await request(t.app).post('/api/auth/logout').set('Cookie', cookie).set('X-CSRF-Token', token).expect((r) => expect(r.status).toBeLessThan(300));
    await request(other).get('/api/auth/me').set('Cookie', cookie).expect(401);
  });
});

describe('hot reads (prepared statements) answer what the query builder answers', () => {
  it('the catalog page: contains-search ignoring case with % and _ taken literally, kind filter, code-point order, count of all matches', async () => {
    const base = (await operator.get('/api/components/1').expect(200)).body;
    const { id: _id, usedBy: _u, createdAt: _c, updatedAt: _up, ...fields } = base;
    // Straight into the table: the naming convention would refuse these codes through the API.
    for (const code of ['ZZ_50%-A', 'ZZX50X-B', 'zz_50%-c']) {
      await catalogRepo(t.db).insertComponent({ ...fields, code, layer: 'FX-ESC', name: `Escape test ${code}` });
    }
    const all = (await t.db('components').select('id', 'code', 'name', 'layer', 'kind')) as { id: number; code: string; name: string; layer: string; kind: string }[];
    // Expected, computed here: substring match ignoring ASCII case, then sorted by UTF-16 code units
    // (the same as code points for these ASCII codes).
    const expected = (q: string | null, kind: string | null) => all
      .filter((c) => (kind === null || c.kind === kind) && (q === null || [c.code, c.name, c.layer].some((f) => f.toLowerCase().includes(q.toLowerCase()))))
      .map((c) => c.code)
      .sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
    const hot = hotReads(t.db);
    const pattern = (q: string) => `%${q.replace(/[\\%_]/g, (m) => `\\${m}`)}%`;
    for (const [q, kind] of [['_50%', null], ['zz', null], [null, 'jaw-rail'], [null, null], ['rail', 'center-rail']] as [string | null, string | null][]) {
      const page = await hot.componentPage({ kind, pattern: q === null ? null : pattern(q), limit: null, offset: 0 });
      expect(page.rows.map((r) => r.code)).toEqual(expected(q, kind));
      expect(page.total).toBe(expected(q, kind).length);
    }
    expect((await hot.componentPage({ kind: null, pattern: pattern('_50%'), limit: null, offset: 0 })).rows.map((r) => r.code)).toEqual(['ZZ_50%-A', 'zz_50%-c']);
    // A page past the end: no rows, and still the count of all.
    const past = await hot.componentPage({ kind: null, pattern: null, limit: 10, offset: all.length + 5 });
    expect(past).toEqual({ rows: [], total: all.length });
    const second = await hot.componentPage({ kind: null, pattern: null, limit: 3, offset: 3 });
    expect(second.rows.map((r) => r.code)).toEqual(expected(null, null).slice(3, 6));
  });

  it('a session is found only until its stored expiry, with its signed-in user beside it', async () => {
    const hot = hotReads(t.db);
    const rows = (await t.db('sessions').select('sid', 'sess', 'expired')) as { sid: string; sess: string | object; expired: string | Date }[];
    const signedIn = rows.find((r) => (typeof r.sess === 'string' ? JSON.parse(r.sess) : r.sess).passport?.user !== undefined)!;
    const userId = (typeof signedIn.sess === 'string' ? JSON.parse(signedIn.sess) : signedIn.sess).passport.user as number;
    const expiry = new Date(signedIn.expired);
    const found = await hot.sessionAndUser(signedIn.sid, new Date(expiry.getTime() - 60_000));
    expect(found?.user?.id).toBe(userId);
    const stampRow = (await t.db('read_stamps').where({ name: 'catalog' }).first()) as { version: number | string } | undefined;
    expect(found?.catalogStamp).toBe(Number(stampRow?.version ?? 0));
    const user = (await t.db('users').where({ id: userId }).first()) as { email: string };
    expect(found?.user?.email).toBe(user.email);
    expect(await hot.sessionAndUser(signedIn.sid, new Date(expiry.getTime() + 60_000))).toBeUndefined();
    expect(await hot.sessionAndUser('no-such-session', new Date())).toBeUndefined();
    expect((await hot.userById(userId))?.email).toBe(user.email);
    expect(await hot.userById(987654)).toBeUndefined();
  });

  it('a version hash and the catalog stamp as stored', async () => {
    const hot = hotReads(t.db);
    const v = (await t.db('template_versions').where({ template_id: 1, number: 1 }).first()) as { content_hash: string; state: string };
    expect(await hot.versionHash(1, 1)).toEqual({ hash: v.content_hash, state: v.state });
    expect(await hot.versionHash(1, 999)).toBeUndefined();
    const stamp = await hot.stamp('catalog');
    const row = (await t.db('read_stamps').where({ name: 'catalog' }).first()) as { version: number | string } | undefined;
    expect(stamp).toBe(Number(row?.version ?? 0));
    const base = (await operator.get('/api/components/1').expect(200)).body;
    const { id: _id, usedBy: _u, createdAt: _c, updatedAt: _up, ...fields } = base;
    await lead.put('/api/components/1', { ...fields, notes: 'Stamp moves.' }).expect(200);
    expect(await hot.stamp('catalog')).toBe(stamp + 1);
  });
});
