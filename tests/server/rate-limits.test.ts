import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app';
import { DbRateLimitStore } from '../../server/db/rate-limit-store';
import { FAILED_SIGN_IN_LIMIT, FAILED_SIGN_IN_PER_IP_LIMIT } from '../../server/routes/auth';
import { DEMO_PASSWORD } from '../../server/db/seed-demo';
import { makeTestApp, type TestApp } from './test-app';

/**
 * Limits counted in the database (express-rate-limit's Store interface, its README "Data Stores"),
 * so several app processes on one database count one client together. Numbers: README, "Limits".
 */
let t: TestApp;
beforeAll(async () => { t = await makeTestApp(); });
afterAll(async () => { await t.close(); });

describe('the database store', () => {
  it('counts, decrements, resets and starts a new window after the old one', async () => {
    // A window far longer than the test for the counting, so a slow machine cannot end it early.
    const store = new DbRateLimitStore(t.db, 'test:');
    store.init({ windowMs: 15 * 60 * 1000 } as never);
    expect((await store.increment('a')).totalHits).toBe(1);
    expect((await store.increment('a')).totalHits).toBe(2);
    await store.decrement('a');
    expect((await store.get('a'))?.totalHits).toBe(1);
    await store.resetKey('a');
    expect(await store.get('a')).toBeUndefined();
    // A short window that surely passes while the test waits.
    const brief = new DbRateLimitStore(t.db, 'brief:');
    brief.init({ windowMs: 50 } as never);
    await brief.increment('b');
    await new Promise((r) => setTimeout(r, 120));
    expect(await brief.get('b')).toBeUndefined(); // the window has passed
    expect((await brief.increment('b')).totalHits).toBe(1);
  });
});

describe('limits shared by two app processes on one database', () => {
  it('five failed sign-ins for one address in all, whichever process answers', async () => {
    // A second app on the same SQLite file stands for a second process behind a load balancer.
    const second = createApp({ db: t.db, sessionSecret: 'test-secret', dataDir: t.dataDir });
    const apps = [t.app, second];
    const tokenOf = async (agent: ReturnType<typeof request.agent>) => (await agent.get('/api/auth/csrf')).body.token as string;
    const agents = apps.map((a) => request.agent(a));
    const tokens = await Promise.all(agents.map(tokenOf));
    for (let i = 0; i < FAILED_SIGN_IN_LIMIT; i++) {
      const k = i % 2;
      const res = await agents[k]!.post('/api/auth/login').set('X-CSRF-Token', tokens[k]!).send({ email: 'reviewer@gridset.test', password: `nope-${i}` });
      expect(res.status).toBe(401);
    }
    const locked = await agents[1]!.post('/api/auth/login').set('X-CSRF-Token', tokens[1]!).send({ email: 'reviewer@gridset.test', password: DEMO_PASSWORD });
    expect(locked.status).toBe(429);
  });

  it(`${FAILED_SIGN_IN_PER_IP_LIMIT} failed sign-ins from one client address, across addresses, then 429`, async () => {
    const fresh = await makeTestApp();
    try {
      const a = await fresh.agent();
      for (let i = 0; i < FAILED_SIGN_IN_PER_IP_LIMIT; i++) {
        // Each address tried once, below its own limit, so only the per-client count can stop them.
        expect((await a.post('/api/auth/login', { email: `nobody-${i}@example.com`, password: 'wrong' })).status).toBe(401);
      }
      const over = await a.post('/api/auth/login', { email: 'lead@gridset.test', password: DEMO_PASSWORD });
      expect(over.status).toBe(429);
      expect(over.body.error.message).toMatch(/from this machine/);
    } finally {
      await fresh.close();
    }
  });
});

describe('uploads per user', () => {
  it('refuses the upload past the limit with a sentence, per user', async () => {
    const small = await makeTestApp({ uploadsPer15Minutes: 3 });
    try {
      const lead = await small.agent('lead');
      const upload = () => lead.http.post('/api/dxf/inspect').set('X-CSRF-Token', lead.token).attach('file', Buffer.from('0\nEOF\n'), 'a.dxf');
      for (let i = 0; i < 3; i++) expect((await upload()).status).not.toBe(429);
      const over = await upload();
      expect(over.status).toBe(429);
      expect(over.body.error.message).toMatch(/3 files in 15 minutes/);
      const programmer = await small.agent('programmer');
      const other = await programmer.http.post('/api/dxf/inspect').set('X-CSRF-Token', programmer.token).attach('file', Buffer.from('0\nEOF\n'), 'a.dxf');
      expect(other.status).not.toBe(429);
    } finally {
      await small.close();
    }
  });
});
