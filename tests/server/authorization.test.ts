import { describe, expect, it } from 'vitest';
import { CAN, ROLES, type Action, type Role } from '../../shared/schemas/auth';
import { appWithEveryRole, type Agent } from './test-app';

/**
 * Who may call what: one row per route. A row names the action of the roles table (`CAN` in
 * shared/schemas/auth.ts, which tests/shared/roles-readme.test.ts holds equal to the README's Roles
 * table); the route must declare exactly that entry, and every role and no session is called
 * against it. A route the app serves without a row below fails the test.
 */
const PUBLIC = 'public' as const;
const SIGNED_IN = 'signed-in' as const;
const EXPECTED: Record<string, typeof PUBLIC | typeof SIGNED_IN | Action> = {
  'GET /health': PUBLIC,
  'GET /auth/csrf': PUBLIC,
  'POST /auth/login': PUBLIC,
  'POST /auth/logout': PUBLIC,
  'GET /auth/me': SIGNED_IN,
  'PATCH /auth/me': SIGNED_IN,
  'GET /users': 'manageUsers',
  'POST /users': 'manageUsers',
  'PATCH /users/:id': 'manageUsers',
  'POST /users/invite': 'manageUsers',
  // The mailed links lead to these; the token (or nothing at all) is the credential.
  'POST /auth/set-password': PUBLIC,
  'POST /auth/forgot-password': PUBLIC,
  'GET /outbox': 'readOutbox',
  'GET /plates': SIGNED_IN,
  'POST /plates': 'editCatalog',
  'GET /plates/:id': SIGNED_IN,
  'PUT /plates/:id': 'editCatalog',
  'DELETE /plates/:id': 'deleteCatalog',
  'GET /components': SIGNED_IN,
  'POST /components': 'editCatalog',
  'GET /components/:id': SIGNED_IN,
  'PUT /components/:id': 'editCatalog',
  'DELETE /components/:id': 'deleteCatalog',
  'GET /settings': SIGNED_IN,
  'PUT /settings': 'editSettings',
  'GET /templates': SIGNED_IN,
  'POST /templates': 'editTemplates',
  'POST /templates/import': 'editTemplates',
  'GET /templates/:id': SIGNED_IN,
  'POST /templates/:id/versions': 'editTemplates',
  'GET /templates/:id/versions/:n': SIGNED_IN,
  'PUT /templates/:id/versions/:n': 'editTemplates',
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
  'PUT /naming/convention': 'editNaming',
  'GET /naming/conventions': SIGNED_IN,
  'POST /naming/check': SIGNED_IN,
  // Here these are called on a version that does not exist, which proves only the refusals (401/403
  // come before the 404). authorization-lifecycle.test.ts calls each on a real version in the state
  // it starts from, as every role, and checks the exact answer against the README's Roles table.
  'POST /templates/:id/versions/:n/release': 'releaseTemplates',
  'POST /templates/:id/versions/:n/submit': 'editTemplates',
  'POST /templates/:id/versions/:n/approve': 'signOff',
  'POST /templates/:id/versions/:n/request-changes': 'signOff',
  'POST /templates/:id/versions/:n/retire': 'releaseTemplates',
  'GET /templates/:id/versions/:n/reviews': SIGNED_IN,
  'GET /templates/:id/diff': SIGNED_IN,
  'GET /home': SIGNED_IN,
  'GET /audit': 'readAudit',
  'GET /jobs': SIGNED_IN,
  'POST /jobs': 'editJobs',
  'GET /jobs/:id': SIGNED_IN,
  'PUT /jobs/:id': 'editJobs',
  'POST /jobs/:id/stock-check': 'recordBars',
  'PUT /jobs/:id/bars-draft': 'recordBars',
  'GET /jobs/:id/load-list': SIGNED_IN,
  'GET /admin/backup': 'backups',
  'PUT /jobs/:id/load-list': 'editLoadLists',
  'PUT /jobs/:id/load-list/ticks': 'editLoadLists',
  'GET /jobs/:id/setup-sheet.html': SIGNED_IN,
  'GET /jobs/:id/package.zip': SIGNED_IN,
  'GET /jobs/:id/drawing.svg': SIGNED_IN,
  'POST /dxf/inspect': 'editCatalog',
  'GET /manifest.xlsx': SIGNED_IN,
  'GET /templates/:id/versions/:n/manifest.xlsx': SIGNED_IN,
  'POST /manifest/preview': 'editCatalog',
  'POST /manifest/commit': 'editCatalog',
  'POST /components/:id/outline': 'editCatalog',
  'POST /components/:id/outline/from-inspection': 'editCatalog',
  'GET /components/:id/outline-file.dxf': SIGNED_IN,
  'GET /jobs/:id/part-file.dxf': SIGNED_IN,
  'POST /jobs/:id/outline': 'editJobs',
  'POST /jobs/:id/outline/from-inspection': 'editJobs',
  'POST /jobs/:id/part-program': 'uploadPartPrograms',
  'GET /jobs/:id/program.nc': SIGNED_IN,
  'GET /jobs/:id/part-program.nc': SIGNED_IN,
};

const ctx = appWithEveryRole();

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
    const served = ctx.t.app.locals.routes.map((r) => `${r.method.toUpperCase()} ${r.path}`).sort();
    expect(served.filter((k) => !(k in EXPECTED))).toEqual([]);
    expect(Object.keys(EXPECTED).filter((k) => !served.includes(k))).toEqual([]);
  });

  it('each route declares the access its row names, by the entry of the roles table itself', () => {
    const wrong = ctx.t.app.locals.routes.flatMap((r) => {
      const row = EXPECTED[`${r.method.toUpperCase()} ${r.path}`];
      const declared = row === PUBLIC || row === SIGNED_IN ? row : CAN[row!];
      return r.access === declared ? [] : [`${r.method.toUpperCase()} ${r.path}: declares ${JSON.stringify(r.access)}, row says ${row}`];
    });
    expect(wrong).toEqual([]);
  });

  it('answers every route, for every role and for no session, as the table says', async () => {
    // Sign-out ends the session it is called with, so it runs last.
    const routes = [...ctx.t.app.locals.routes].sort((a, b) => Number(a.path === '/auth/logout') - Number(b.path === '/auth/logout'));
    const mismatches: string[] = [];
    for (const r of routes) {
      const key = `${r.method.toUpperCase()} ${r.path}`;
      const row = EXPECTED[key]!;
      const allowed: typeof PUBLIC | readonly Role[] = row === PUBLIC ? PUBLIC : row === SIGNED_IN ? ROLES : CAN[row];
      for (const who of ['none', ...ROLES] as const) {
        const res = await call(ctx.agents.get(who)!, r.method, r.path);
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
