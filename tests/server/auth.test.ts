import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { makeTestApp, type TestApp } from './test-app';
import { DEMO_PASSWORD } from '../../server/db/seed-demo';

let t: TestApp;
beforeAll(async () => { t = await makeTestApp(); });
afterAll(async () => { await t.close(); });

describe('sign-in', () => {
  it('answers health once migrated', async () => {
    const res = await request(t.app).get('/api/health').expect(200);
    expect(res.body).toEqual({ ok: true });
  });

  it('refuses a POST without a CSRF token with a JSON 403', async () => {
    const res = await request(t.app).post('/api/auth/login').send({ email: 'lead@gridset.test', password: DEMO_PASSWORD });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf-invalid');
    expect(res.body.error.message).toMatch(/X-CSRF-Token/);
  });

  it('signs in with the right password, regenerates the session and sets a safe cookie', async () => {
    const a = await t.agent();
    const before = (await a.get('/api/auth/csrf')).headers['set-cookie'];
    const res = await a.post('/api/auth/login', { email: 'Lead@Gridset.test ', password: DEMO_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email: 'lead@gridset.test', role: 'lead', active: true });
    expect(res.body.user.passwordHash).toBeUndefined();
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    // The session id changes at sign-in (session fixation defence, OWASP Session Management Cheat Sheet).
    expect(cookie.split(';')[0]).not.toBe(String(before ?? '').split(';')[0]);
    const me = await a.get('/api/auth/me').expect(200);
    expect(me.body.user.role).toBe('lead');
  });

  it('answers 401 on a wrong password and on no session', async () => {
    const a = await t.agent();
    const res = await a.post('/api/auth/login', { email: 'reviewer@gridset.test', password: 'wrong-password' });
    expect(res.status).toBe(401);
    expect(res.body.error).toMatchObject({ code: 'bad-credentials' });
    expect((await request(t.app).get('/api/auth/me')).status).toBe(401);
  });

  it('answers 400 with field paths for a malformed sign-in', async () => {
    const a = await t.agent();
    const res = await a.post('/api/auth/login', { email: 'not-an-address' });
    expect(res.status).toBe(400);
    const paths = res.body.error.details.issues.map((i: { path: string }) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['email', 'password']));
  });

  it('locks an address after five failed sign-ins within 15 minutes (429), other addresses unaffected', async () => {
    const a = await t.agent();
    for (let i = 0; i < 5; i++) {
      expect((await a.post('/api/auth/login', { email: 'operator@gridset.test', password: `nope-${i}` })).status).toBe(401);
    }
    const locked = await a.post('/api/auth/login', { email: 'operator@gridset.test', password: DEMO_PASSWORD });
    expect(locked.status).toBe(429);
    expect(locked.body.error.message).toMatch(/15 minutes/);
    const other = await a.post('/api/auth/login', { email: 'programmer@gridset.test', password: DEMO_PASSWORD });
    expect(other.status).toBe(200);
  });

  it('signs out', async () => {
    const a = await t.agent('programmer');
    const out = await a.post('/api/auth/logout');
    expect(out.status).toBe(200);
    expect((await a.get('/api/auth/me')).status).toBe(401);
  });

  it('answers unknown API routes with a JSON 404', async () => {
    const res = await request(t.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error).toMatchObject({ code: 'not-found' });
  });

  it('answers invalid JSON with a 400, not a 500', async () => {
    const a = await t.agent('lead');
    const res = await a.http.post('/api/plates').set('X-CSRF-Token', a.token).set('Content-Type', 'application/json').send('{"code": ');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/not valid JSON/);
    expect(t.errors).toEqual([]);
  });
});
