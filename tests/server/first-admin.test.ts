import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditRepo } from '../../server/db/audit-repo';
import { oneProcessAtATime } from '../../server/db/dialect';
import { DEMO_USERS, seedDemoDataIfEmpty } from '../../server/db/seed-demo';
import { userTokensRepo } from '../../server/db/user-tokens-repo';
import { usersRepo } from '../../server/db/users-repo';
import { accountLinksService } from '../../server/services/account-links';
import { makeTestApp, ON_POSTGRES, type TestApp } from './test-app';

/**
 * A shop's own database started without the demo shop (GRIDSET_DEMO=0): the first admin comes from
 * the server's command line as an invitation link, and the demo shop, when wanted, is loaded once
 * even by processes starting together.
 */
let t: TestApp;
beforeAll(async () => { t = await makeTestApp({ seed: false }); });
afterAll(async () => { await t.close(); });

const links = () => accountLinksService({
  db: t.db, users: usersRepo(t.db), tokens: userTokensRepo(t.db), audit: auditRepo(t.db),
  mailer: { send: async () => { throw new Error('the first admin gets no mail'); } } as never,
  publicUrl: 'http://gridset.shop.example', log: () => {},
});

describe('the first admin', () => {
  it('gets a link that sets a password and signs in as admin; a second first admin is refused', async () => {
    const { user, link } = await links().firstAdmin({ email: 'owner@shop.example', name: 'Shop Owner' });
    expect(user).toMatchObject({ role: 'admin', active: false, invited: true });
    const url = new URL(link);
    expect(url.origin + url.pathname).toBe('http://gridset.shop.example/set-password');
    const anon = await t.agent();
    await anon.post('/api/auth/set-password', { token: url.searchParams.get('token'), password: 'a long shop password' }).expect(200);
    const signIn = await anon.post('/api/auth/login', { email: 'owner@shop.example', password: 'a long shop password' });
    expect(signIn.status).toBe(200);
    expect(signIn.body.user?.role ?? signIn.body.role).toBe('admin');
    await expect(links().firstAdmin({ email: 'second@shop.example', name: 'Second' })).rejects.toMatchObject({ status: 409 });
  });
});

// A SQLite file is served by one process, which loads the demo shop once at its start.
describe.skipIf(!ON_POSTGRES)('loading the demo shop on PostgreSQL', () => {
  it('happens once when several processes start together', async () => {
    const fresh = await makeTestApp({ seed: false });
    try {
      const results = await Promise.all([0, 1, 2].map(() => oneProcessAtATime(fresh.db, () => seedDemoDataIfEmpty(fresh.db))));
      expect(results.filter(Boolean)).toHaveLength(1);
      expect(Number(((await fresh.db('users').count({ n: '*' })) as [{ n: number | string }])[0].n)).toBe(DEMO_USERS.length);
    } finally {
      await fresh.close();
    }
  });
});
