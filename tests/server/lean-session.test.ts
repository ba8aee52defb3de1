// Signed-in reads that skip express-session and passport (server/middleware/lean-session.ts) must
// answer exactly as the whole path does. Each check below is one the whole path already makes:
// a session is found only with its signed cookie (express-session's cookie-signature format), only
// until it expires or is destroyed, and only while its user is active; and its expiry is still
// pushed forward ("touched") as express-session does, at most once a minute here.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { createHmac } from 'node:crypto';
import request from 'supertest';
import { SessionStore } from '../../server/db/session-store';
import { makeTestApp, type Agent, type TestApp } from './test-app';

let t: TestApp;
let operator: Agent;
let admin: Agent;
beforeEach(async () => {
  t = await makeTestApp();
  [operator, admin] = await Promise.all([t.agent('operator'), t.agent('admin')]);
});
afterEach(async () => {
  vi.restoreAllMocks();
  await t.close();
});

/** The session id inside the agent's gridset.sid cookie ("s:" + id + "." + signature). */
async function sessionIdOf(agent: Agent): Promise<string> {
  const me = await agent.get('/api/auth/me').expect(200);
  expect(me.body.user?.email ?? me.body.email).toBeTruthy();
  const rows = (await t.db('sessions').select('sid', 'sess')) as { sid: string; sess: string | object }[];
  const mine = rows.filter((r) => {
    const sess = typeof r.sess === 'string' ? JSON.parse(r.sess) : r.sess;
    return sess.passport?.user === (me.body.user?.id ?? me.body.id);
  });
  expect(mine).toHaveLength(1);
  return mine[0]!.sid;
}

/** A cookie signed as express-session signs it: HMAC-SHA256 in base64 without padding (cookie-signature's README). */
const signedCookie = (sid: string, secret: string) =>
  `gridset.sid=${encodeURIComponent(`s:${sid}.${createHmac('sha256', secret).update(sid).digest('base64').replace(/=+$/, '')}`)}`;

describe('signed-in reads without express-session', () => {
  it('a read after the first one takes the lean path and answers the same', async () => {
    const whole = await operator.get('/api/components?limit=5').expect(200);
    const storeGet = vi.spyOn(SessionStore.prototype, 'get');
    const lean = vi.spyOn(SessionStore.prototype, 'signedInRead');
    const again = await operator.get('/api/components?limit=5').expect(200);
    expect(again.body).toEqual(whole.body);
    expect(lean).toHaveBeenCalledTimes(1);
    // express-session reads the store through get(); the lean read did not need it.
    expect(storeGet).not.toHaveBeenCalled();
    // A write still goes the whole way (express-session, passport, the CSRF check).
    await operator.post('/api/auth/logout').expect((r) => expect(r.status).toBeLessThan(300));
    expect(storeGet).toHaveBeenCalled();
  });

  it('a cookie signed with our secret by hand is accepted, and the same id with a wrong signature is not', async () => {
    const sid = await sessionIdOf(operator);
    await operator.get('/api/components?limit=1').expect(200);
    await request(t.app).get('/api/components?limit=1').set('Cookie', signedCookie(sid, 'test-secret')).expect(200);
    await request(t.app).get('/api/components?limit=1').set('Cookie', signedCookie(sid, 'not-the-secret')).expect(401);
    // Unsigned, or signed over a different id, is refused too.
    await request(t.app).get('/api/components?limit=1').set('Cookie', `gridset.sid=${sid}`).expect(401);
    await request(t.app).get('/api/components?limit=1').set('Cookie', signedCookie(`${sid}x`, 'test-secret')).expect(401);
  });

  it('a user deactivated by the admin is refused at their next read', async () => {
    await operator.get('/api/components?limit=1').expect(200);
    await operator.get('/api/components?limit=1').expect(200);
    const me = (await operator.get('/api/auth/me').expect(200)).body;
    const id = me.user?.id ?? me.id;
    await admin.patch(`/api/users/${id}`, { active: false }).expect(200);
    await operator.get('/api/components?limit=1').expect(401);
    await operator.get('/api/templates/1/versions/1/stations').expect(401);
  });

  it('a signed-out or expired session is refused at the next read', async () => {
    const sid = await sessionIdOf(operator);
    await operator.get('/api/components?limit=1').expect(200);
    await t.db('sessions').where({ sid }).update({ expired: new Date(Date.now() - 1000).toISOString() });
    await operator.get('/api/components?limit=1').expect(401);

    const other = await t.agent('programmer');
    await other.get('/api/components?limit=1').expect(200);
    await other.post('/api/auth/logout').expect((r) => expect(r.status).toBeLessThan(300));
    await other.get('/api/components?limit=1').expect(401);
  });

  it('a session whose touch is due goes the whole way, and its stored expiry moves forward', async () => {
    const sid = await sessionIdOf(operator);
    await operator.get('/api/components?limit=1').expect(200);
    const before = new Date((await t.db('sessions').where({ sid }).first()).expired).getTime();
    // 61 s later (the store touches at most once a minute).
    const now = Date.now() + 61_000;
    vi.spyOn(Date, 'now').mockReturnValue(now);
    const storeGet = vi.spyOn(SessionStore.prototype, 'get');
    await operator.get('/api/components?limit=1').expect(200);
    expect(storeGet).toHaveBeenCalledTimes(1);
    await vi.waitFor(async () => {
      const after = new Date((await t.db('sessions').where({ sid }).first()).expired).getTime();
      expect(after).toBeGreaterThan(before);
    });
  });
});
