import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_CONVENTION } from '../../shared/naming/conventions';
import { containsPattern, deleteSessionsOfUser, isoTime, isoTimeOrNull, isForeignKeyViolation, isPostgres, isUniqueViolation, orderByText, paged, timeValue, toBool, toNumber, whereContains } from '../../server/db/dialect';
import { DbRateLimitStore } from '../../server/db/rate-limit-store';
import { makeTestApp, ON_POSTGRES, type TestApp } from './test-app';

/**
 * The dialect helpers on the database of this test project: SQLite in "unit", PostgreSQL in
 * "server-pg" (TEST_DATABASE_URL). Expected answers are computed here in JavaScript, independently
 * of SQL: String.prototype.includes on lower-cased text for a case-insensitive contains-search
 * (common practice; ASCII case folding as SQLite's LIKE does, sqlite.org/lang_expr.html#like, and
 * PostgreSQL's ILIKE, PostgreSQL manual 9.7.1), Array.prototype.slice for paging.
 */
let t: TestApp;
beforeAll(async () => {
  t = await makeTestApp();
  await t.db.schema.createTable('dialect_probe', (tb) => {
    tb.increments('id');
    tb.string('code').notNullable().unique();
    tb.timestamps(true, true);
  });
  // On PostgreSQL the column gets a language-aware collation (ICU's root locale), as a database
  // created with a locale such as en_US.UTF-8 has, where plain ORDER BY interleaves capitals.
  if (ON_POSTGRES) await t.db.raw('ALTER TABLE dialect_probe ALTER COLUMN code TYPE varchar(255) COLLATE "und-x-icu"');
  await t.db('dialect_probe').insert(CODES.map((code) => ({ code })));
});
afterAll(async () => { await t.close(); });

const CODES = ['GP-LOWER', 'gp-upper', 'RAIL 100%', 'RAIL 1000', 'JAW_A', 'JAWXA', 'back\\slash', 'backslash', 'Vise-6'];

describe(`dialect helpers on ${ON_POSTGRES ? 'PostgreSQL' : 'SQLite'}`, () => {
  it('knows which database it runs on', () => {
    expect(isPostgres(t.db)).toBe(ON_POSTGRES);
  });

  it.each(['gp-lower', 'GP-', 'Lower', '%', '_', '\\', '100%', 'jaw_a', 'x', 'vise', 'nothing-like-this'])('contains-search for %j ignores case and matches %, _ and \\ literally', async (q) => {
    const found = (await whereContains(t.db, t.db('dialect_probe').select('code'), ['code'], q).orderBy('code')).map((r: { code: string }) => r.code);
    const expected = CODES.filter((c) => c.toLowerCase().includes(q.toLowerCase())).sort();
    expect(found.sort()).toEqual(expected);
  });

  it('a search for "gp-lower" finds "GP-LOWER" and "%" finds only the code holding it', async () => {
    const search = async (q: string) => (await whereContains(t.db, t.db('dialect_probe').select('code'), ['code'], q)).map((r: { code: string }) => r.code);
    expect(await search('gp-lower')).toEqual(['GP-LOWER']);
    expect(await search('%')).toEqual(['RAIL 100%']);
    expect(containsPattern('a%b_c\\')).toBe('%a\\%b\\_c\\\\%');
  });

  it('orders text in code-point order, as JavaScript sorts ASCII strings', async () => {
    // Array.prototype.sort without a comparator compares UTF-16 code units (ECMA-262, SortCompare);
    // for these ASCII codes that is code-point order: capitals before small letters.
    const ordered = (await orderByText(t.db, t.db('dialect_probe').select('code').whereIn('code', CODES), 'code')).map((r: { code: string }) => r.code);
    expect(ordered).toEqual([...CODES].sort());
    const reversed = (await orderByText(t.db, t.db('dialect_probe').select('code').whereIn('code', CODES), 'code', 'desc')).map((r: { code: string }) => r.code);
    expect(reversed).toEqual([...CODES].sort().reverse());
    if (ON_POSTGRES) {
      const plain = (await t.db('dialect_probe').select('code').whereIn('code', CODES).orderBy('code')).map((r: { code: string }) => r.code);
      expect(plain, 'the locale-aware column orders differently without the helper').not.toEqual(ordered);
    }
  });

  it('pages without a limit when none is asked for, and with one when it is', async () => {
    const all = (await t.db('dialect_probe').select('id').orderBy('id')).map((r: { id: number }) => r.id);
    const page = async (limit: number | undefined, offset: number) => (await paged(t.db('dialect_probe').select('id').orderBy('id'), limit, offset)).map((r: { id: number }) => r.id);
    expect(await page(undefined, 0)).toEqual(all);
    expect(await page(undefined, 3)).toEqual(all.slice(3));
    expect(await page(2, 1)).toEqual(all.slice(1, 3));
    expect(await page(100, 0)).toEqual(all);
  });

  it('answers stored times as ISO 8601 UTC with milliseconds and a Z, at the moment they were written', async () => {
    const before = Date.now();
    await t.db('dialect_probe').insert({ code: `TIME-${before}` });
    const after = Date.now();
    const row = await t.db('dialect_probe').where({ code: `TIME-${before}` }).first();
    const at = isoTime(row.created_at);
    // ISO 8601 extended format in UTC, as Date.prototype.toISOString writes it (ECMA-262, Date Time String Format).
    expect(at).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/);
    // CURRENT_TIMESTAMP keeps whole seconds on SQLite: the stored second lies within the insert's.
    expect(Date.parse(at)).toBeGreaterThanOrEqual(Math.floor(before / 1000) * 1000);
    expect(Date.parse(at)).toBeLessThanOrEqual(after);
    expect(isoTime(row.updated_at)).toMatch(/Z$/);
  });

  it('reads both stored forms of a time as the same instant', () => {
    const expected = new Date(Date.UTC(2026, 11, 5, 6, 47, 39)).toISOString();
    expect(expected).toBe('2026-12-05T06:47:39.000Z');
    expect(isoTime('2026-12-05 06:47:39')).toBe(expected);
    expect(isoTime(new Date(Date.UTC(2026, 11, 5, 6, 47, 39)))).toBe(expected);
    expect(isoTime('2026-12-05T06:47:39Z')).toBe(expected);
    expect(isoTimeOrNull(null)).toBeNull();
    expect(() => isoTime('not a time')).toThrow();
  });

  it('compares stored times with moments on either side of them', async () => {
    const hour = 3_600_000;
    const count = async (op: '>=' | '<', at: number) => toNumber((await t.db('dialect_probe').where('created_at', op, timeValue(t.db, new Date(at))).count({ n: '*' }))[0]!.n);
    const total = toNumber((await t.db('dialect_probe').count({ n: '*' }))[0]!.n);
    expect(await count('>=', Date.now() - hour)).toBe(total);
    expect(await count('>=', Date.now() + hour)).toBe(0);
    expect(await count('<', Date.now() + hour)).toBe(total);
  });

  it('filters the audit by UTC day on either side of today', async () => {
    const admin = await t.agent('admin');
    await admin.put('/api/settings', (await admin.get('/api/settings').expect(200)).body).expect(200);
    const day = (offsetDays: number) => new Date(Date.now() + offsetDays * 86_400_000).toISOString().slice(0, 10);
    const today = (await admin.get(`/api/audit?from=${day(0)}&to=${day(0)}`).expect(200)).body;
    expect(today.items.map((e: { action: string }) => e.action)).toContain('settings.save');
    for (const e of today.items) expect(e.at.slice(0, 10)).toBe(day(0));
    expect((await admin.get(`/api/audit?from=${day(1)}`).expect(200)).body.total).toBe(0);
    expect((await admin.get(`/api/audit?to=${day(-1)}`).expect(200)).body.items.filter((e: { action: string }) => e.action === 'settings.save')).toEqual([]);
  });

  it('turns counts and booleans of either driver into numbers and booleans', async () => {
    const n = (await t.db('dialect_probe').count({ n: '*' }))[0]!.n;
    expect(toNumber(n)).toBe((await t.db('dialect_probe').select('id')).length);
    const users = await t.db('users').select('active');
    expect(users.map((u: { active: unknown }) => typeof toBool(u.active))).toEqual(users.map(() => 'boolean'));
    expect([toBool(1), toBool(0), toBool(true), toBool(false), toBool('t'), toBool('f')]).toEqual([true, false, true, false, true, false]);
  });

  it('an upsert (INSERT … ON CONFLICT DO UPDATE, which both databases have) inserts once, then updates that row', async () => {
    const put = (value: string) => t.db('settings').insert({ key: 'dialect-probe', value }).onConflict('key').merge({ value });
    await put('first');
    await put('second');
    const rows = await t.db('settings').where({ key: 'dialect-probe' }).select('value');
    expect(rows).toEqual([{ value: 'second' }]);
  });

  it('a rate-limit count taken by many requests at once loses none of them', async () => {
    const store = new DbRateLimitStore(t.db, 'dialect-probe:');
    store.init({ windowMs: 60_000 } as Parameters<DbRateLimitStore['init']>[0]);
    const hits = await Promise.all(Array.from({ length: 20 }, () => store.increment('client')));
    // Each increment answers its own count: together exactly 1..20, whatever order they ran in.
    expect(hits.map((h) => h.totalHits).sort((a, b) => a - b)).toEqual(Array.from({ length: 20 }, (_, i) => i + 1));
    expect((await store.get('client'))?.totalHits).toBe(20);
  });

  it('recognizes a broken unique constraint', async () => {
    const err = await t.db('dialect_probe').insert({ code: 'GP-LOWER' }).then(() => null, (e: unknown) => e);
    expect(err).not.toBeNull();
    expect(isUniqueViolation(err)).toBe(true);
    expect(isUniqueViolation(new Error('other'))).toBe(false);
    // A template on a plate that does not exist breaks templates.plate_id → plates.id.
    const fk = await t.db('templates').insert({ name: 'No such plate', plate_id: 999_999 }).then(() => null, (e: unknown) => e);
    expect(isForeignKeyViolation(fk)).toBe(true);
    expect(isUniqueViolation(fk)).toBe(false);
  });

  it("deletes the stored sessions of one user and keeps everyone else's", async () => {
    const operator = await t.agent('operator');
    const lead = await t.agent('lead');
    const me = (await operator.get('/api/auth/me').expect(200)).body.user.id as number;
    expect(await deleteSessionsOfUser(t.db, me)).toBeGreaterThanOrEqual(1);
    expect((await operator.get('/api/auth/me')).status).toBe(401);
    expect((await lead.get('/api/auth/me')).status).toBe(200);
  });

  it('a race for the next naming convention version answers 200 or 409, never 500, and never saves one number twice', async () => {
    const lead = await t.agent('lead');
    const { version: _v, ...rules } = DEMO_CONVENTION;
    const start = (await lead.get('/api/naming/conventions').expect(200)).body.items.length as number;
    const answers = await Promise.all(Array.from({ length: 8 }, () => lead.put('/api/naming/convention', rules)));
    const statuses = answers.map((a) => a.status);
    for (const a of answers) expect([200, 409], JSON.stringify(a.body)).toContain(a.status);
    const saved = statuses.filter((s) => s === 200).length;
    expect(saved).toBeGreaterThanOrEqual(1);
    const versions = (await lead.get('/api/naming/conventions').expect(200)).body.items.map((i: { version: number }) => i.version) as number[];
    expect(versions.length).toBe(start + saved);
    expect(new Set(versions).size).toBe(versions.length);
    for (const a of answers.filter((x) => x.status === 409)) expect(a.body.error.message).toMatch(/try again/);
  });
});

describe(`races for unique values on ${ON_POSTGRES ? 'PostgreSQL' : 'SQLite'} answer a success or 409, never 500`, () => {
  const race = async (n: number, send: () => PromiseLike<{ status: number; body: { error?: { message: string } } }>) => {
    const answers = await Promise.all(Array.from({ length: n }, () => send()));
    for (const a of answers) expect([200, 201, 409], JSON.stringify(a.body)).toContain(a.status);
    return answers.map((a) => a.status);
  };

  it('the next template version number: every new draft gets its own number', async () => {
    const programmer = await t.agent('programmer');
    const statuses = await race(6, () => programmer.post('/api/templates/1/versions', { from: 1 }));
    const numbers = (await programmer.get('/api/templates/1').expect(200)).body.versions.map((v: { number: number }) => v.number) as number[];
    expect(new Set(numbers).size).toBe(numbers.length);
    expect(statuses.filter((s) => s === 201).length).toBeGreaterThanOrEqual(1);
  });

  it('one template name and one plate code: exactly one of the same-named creations is kept', async () => {
    const programmer = await t.agent('programmer');
    const names = await race(6, () => programmer.post('/api/templates', { name: 'Raced template', plateId: 1 }));
    expect(names.filter((s) => s === 201)).toHaveLength(1);
    const plate = { code: 'GP-RACE', name: 'Raced plate', unit: 'mm', pitch: 50, columns: 6, rows: 4, holeDiameter: 12, thread: 'M12', notes: '' };
    const plates = await race(6, () => programmer.post('/api/plates', plate));
    expect(plates.filter((s) => s === 201)).toHaveLength(1);
    expect(toNumber((await t.db('plates').where({ code: 'GP-RACE' }).count({ n: '*' }))[0]!.n)).toBe(1);
  });

  it('two admins taken out of the admin role at once: one stays', async () => {
    const admin = await t.agent('admin');
    const me = (await admin.get('/api/auth/me').expect(200)).body.user.id as number;
    const other = (await admin.post('/api/users', { email: 'second-admin@gridset.test', name: 'Second admin', role: 'admin', password: 'a long enough password 1' }).expect(201)).body;
    const activeAdmins = async () => toNumber((await t.db('users').where({ role: 'admin', active: true }).count({ n: '*' }))[0]!.n);
    const before = await activeAdmins();
    const both = await Promise.all([admin.patch(`/api/users/${other.id}`, { role: 'lead' }), admin.patch(`/api/users/${me}`, { role: 'lead' })]);
    for (const a of both) expect([200, 409], JSON.stringify(a.body)).toContain(a.status);
    const demoted = both.filter((a) => a.status === 200).length;
    expect(await activeAdmins()).toBe(before - demoted);
    expect(await activeAdmins()).toBeGreaterThanOrEqual(1);
  });
});
