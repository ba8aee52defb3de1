import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, type Role } from '../../shared/schemas/auth';
import { makeTestApp, type Agent, type TestApp } from './test-app';

/**
 * Who may call what. Written by hand from the role table in the README, not derived from the
 * route declarations, so a change to either without the other fails here. A route the app
 * serves without a row below fails the test.
 */
const PUBLIC = 'public' as const;
const SIGNED_IN = ROLES;
const EDITORS: Role[] = ['lead', 'programmer'];
const EXPECTED: Record<string, typeof PUBLIC | readonly Role[]> = {
  'GET /health': PUBLIC,
  'GET /auth/csrf': PUBLIC,
  'POST /auth/login': PUBLIC,
  'POST /auth/logout': PUBLIC,
  'GET /auth/me': SIGNED_IN,
  'PATCH /auth/me': SIGNED_IN,
  'GET /users': ['admin'],
  'POST /users': ['admin'],
  'PATCH /users/:id': ['admin'],
  'POST /users/invite': ['admin'],
  // The mailed links lead to these; the token (or nothing at all) is the credential.
  'POST /auth/set-password': PUBLIC,
  'POST /auth/forgot-password': PUBLIC,
  'GET /outbox': ['admin'],
  'GET /plates': SIGNED_IN,
  'POST /plates': EDITORS,
  'GET /plates/:id': SIGNED_IN,
  'PUT /plates/:id': EDITORS,
  'DELETE /plates/:id': ['lead'],
  'GET /components': SIGNED_IN,
  'POST /components': EDITORS,
  'GET /components/:id': SIGNED_IN,
  'PUT /components/:id': EDITORS,
  'DELETE /components/:id': ['lead'],
  'GET /settings': SIGNED_IN,
  'PUT /settings': ['admin', 'lead'],
  'GET /templates': SIGNED_IN,
  'POST /templates': EDITORS,
  'POST /templates/import': EDITORS,
  'GET /templates/:id': SIGNED_IN,
  'POST /templates/:id/versions': EDITORS,
  'GET /templates/:id/versions/:n': SIGNED_IN,
  'PUT /templates/:id/versions/:n': EDITORS,
  'POST /templates/:id/versions/:n/release': ['lead'],
  'GET /templates/:id/versions/:n/stations': SIGNED_IN,
  'GET /templates/:id/versions/:n/stations.csv': SIGNED_IN,
  'GET /templates/:id/versions/:n/stations.xlsx': SIGNED_IN,
  'GET /templates/:id/versions/:n/template.json': SIGNED_IN,
  'GET /templates/:id/versions/:n/offsets.nc': SIGNED_IN,
  'GET /templates/:id/versions/:n/drawing.dxf': SIGNED_IN,
  'GET /templates/:id/versions/:n/drawing.svg': SIGNED_IN,
  'POST /stock-check': SIGNED_IN,
  'POST /stock-check/bars-file': SIGNED_IN,
  'GET /naming/convention': SIGNED_IN,
  'PUT /naming/convention': ['lead'],
  'GET /naming/conventions': SIGNED_IN,
  'POST /naming/check': SIGNED_IN,
  // The lifecycle decides per step and per state who may (shared/review/lifecycle.ts, tested on its own).
  'POST /templates/:id/versions/:n/submit': SIGNED_IN,
  'POST /templates/:id/versions/:n/approve': SIGNED_IN,
  'POST /templates/:id/versions/:n/request-changes': SIGNED_IN,
  'POST /templates/:id/versions/:n/retire': SIGNED_IN,
  'GET /templates/:id/versions/:n/reviews': SIGNED_IN,
  'GET /templates/:id/diff': SIGNED_IN,
  'GET /audit': ['lead', 'admin'],
  'GET /jobs': SIGNED_IN,
  'POST /jobs': EDITORS,
  'GET /jobs/:id': SIGNED_IN,
  'PUT /jobs/:id': EDITORS,
  'POST /jobs/:id/stock-check': SIGNED_IN,
  'GET /jobs/:id/load-list': SIGNED_IN,
  'PUT /jobs/:id/load-list': ['lead', 'programmer', 'operator'],
  'GET /jobs/:id/setup-sheet.html': SIGNED_IN,
  'GET /jobs/:id/package.zip': SIGNED_IN,
  'GET /jobs/:id/drawing.svg': SIGNED_IN,
  'POST /dxf/inspect': EDITORS,
  'GET /manifest.xlsx': SIGNED_IN,
  'GET /templates/:id/versions/:n/manifest.xlsx': SIGNED_IN,
  'POST /manifest/preview': EDITORS,
  'POST /manifest/commit': EDITORS,
  'POST /components/:id/outline': EDITORS,
  'POST /jobs/:id/outline': EDITORS,
  'POST /jobs/:id/part-program': EDITORS,
  'GET /jobs/:id/program.nc': SIGNED_IN,
  'GET /jobs/:id/part-program.nc': SIGNED_IN,
};

let t: TestApp;
const agents = new Map<Role | 'none', Agent>();
beforeAll(async () => {
  t = await makeTestApp();
  agents.set('none', await t.agent());
  for (const role of ROLES) agents.set(role, await t.agent(role));
});
afterAll(async () => { await t.close(); });

// Ids that do not exist keep allowed writes from changing what later rows see.
const concrete = (path: string) => path.replace(/:[a-zA-Z]+/g, '999999');

function call(agent: Agent, method: string, path: string) {
  const url = `/api${concrete(path)}`;
  switch (method) {
    case 'get': return agent.get(url);
    case 'post': return agent.post(url, {});
    case 'put': return agent.put(url, {});
    case 'patch': return agent.patch(url, {});
    case 'delete': return agent.delete(url);
    default: throw new Error(method);
  }
}

describe('authorization table', () => {
  it('has a row for every route the app serves, and no row for a route it does not', () => {
    const served = t.app.locals.routes.map((r) => `${r.method.toUpperCase()} ${r.path}`).sort();
    expect(served.filter((k) => !(k in EXPECTED))).toEqual([]);
    expect(Object.keys(EXPECTED).filter((k) => !served.includes(k))).toEqual([]);
  });

  it('answers every route, for every role and for no session, as the table says', async () => {
    // Sign-out ends the session it is called with, so it runs last.
    const routes = [...t.app.locals.routes].sort((a, b) => Number(a.path === '/auth/logout') - Number(b.path === '/auth/logout'));
    const mismatches: string[] = [];
    for (const r of routes) {
      const key = `${r.method.toUpperCase()} ${r.path}`;
      const allowed = EXPECTED[key]!;
      for (const who of ['none', ...ROLES] as const) {
        const res = await call(agents.get(who)!, r.method, r.path);
        const mayCall = allowed === PUBLIC || (who !== 'none' && allowed.includes(who));
        const expected = mayCall ? 'allowed' : who === 'none' ? 401 : 403;
        const got = res.status === 401 || res.status === 403 ? res.status : 'allowed';
        if (got !== expected) mismatches.push(`${key} as ${who}: expected ${expected}, got ${res.status}`);
        if (res.status >= 400) expect(res.body.error, `${key} as ${who}`).toMatchObject({ code: expect.any(String), message: expect.any(String) });
        expect(res.status, `${key} as ${who} must never be a 500`).toBeLessThan(500);
      }
    }
    expect(mismatches).toEqual([]);
  });
});
