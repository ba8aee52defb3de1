// `npm run screens [-- --out DIR] [--roles lead,reviewer] [--only home,compare]`: starts Gridset on a
// temporary data folder with the demo shop plus a little review work (a version in review, a draft
// sent back with a comment, a job pinned to an older release and one not yet checked), signs in as
// each demo role, visits every screen that role may open and saves a full-page screenshot of each at
// 1440×900 (desk) and 390×844 (phone) into DIR (default ./screens). Debian's chromium (CHROMIUM_PATH).
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { chromium, type Page } from 'playwright-core';
import { createApp } from '../server/app';
import { migrate, openDb } from '../server/db/knex';
import { DEMO_PASSWORD, seedDemoDataIfEmpty } from '../server/db/seed-demo';
import { CAN, ROLES, type Role } from '../shared/schemas/auth';
import { buildClientIfStale, clientDir, projectRoot } from './build-client';

const VIEWPORTS = [
  { name: 'desk', width: 1440, height: 900 },
  { name: 'phone', width: 390, height: 844 },
] as const;

interface Screen { name: string; url: string; roles?: readonly Role[] }
const SCREENS: Screen[] = [
  { name: 'home', url: '/' },
  { name: 'templates', url: '/templates' },
  { name: 'version', url: '/templates/1/versions/1' },
  { name: 'version-in-review', url: '/templates/1/versions/2' },
  { name: 'version-sent-back', url: '/templates/2/versions/3' },
  { name: 'compare', url: '/templates/1/compare?from=1&to=2' },
  { name: 'reviews', url: '/reviews' },
  { name: 'jobs', url: '/jobs' },
  { name: 'job', url: '/jobs/1' },
  { name: 'setup-sheet', url: '/api/jobs/1/setup-sheet.html' },
  { name: 'stock-check', url: '/stock-check' },
  { name: 'components', url: '/catalog/components' },
  { name: 'component', url: '/catalog/components/1' },
  { name: 'plates', url: '/catalog/plates' },
  { name: 'plate', url: '/catalog/plates/1' },
  { name: 'naming', url: '/naming' },
  { name: 'settings', url: '/settings', roles: CAN.editSettings },
  { name: 'audit', url: '/audit', roles: CAN.readAudit },
  { name: 'users', url: '/admin/users', roles: CAN.manageUsers },
  { name: 'outbox', url: '/admin/outbox', roles: CAN.readOutbox },
];

const { values: args } = parseArgs({ options: { out: { type: 'string' }, roles: { type: 'string' }, only: { type: 'string' } } });
const outDir = path.resolve(args.out ?? path.join(projectRoot, 'screens'));
const roles = (args.roles ? args.roles.split(',') : [...ROLES]) as Role[];
const only = args.only ? new Set(args.only.split(',')) : null;

/** A JSON write with the page's own session and a fresh CSRF token; throws with the answer when it is refused. */
async function call(page: Page, base: string, method: 'POST' | 'PUT', url: string, data: object = {}) {
  const token = (await (await page.request.get(`${base}/api/auth/csrf`)).json()).token as string;
  const res = await page.request.fetch(`${base}${url}`, { method, data, headers: { 'X-CSRF-Token': token } });
  if (!res.ok()) throw new Error(`${method} ${url} answered ${res.status()}: ${await res.text()}`);
  return res.json();
}

async function signIn(page: Page, base: string, role: Role) {
  await page.context().clearCookies();
  await page.goto(`${base}/sign-in`);
  await page.getByLabel('E-mail address').fill(`${role}@gridset.test`);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByTestId('signed-in-user').waitFor();
}

/** Review work on top of the demo shop, made through the API as the people who would do it. */
async function addReviewWork(page: Page, base: string) {
  await signIn(page, base, 'programmer');
  // Template 1 v2: rail set B moved one hole in +X, in review.
  const v2 = await call(page, base, 'POST', '/api/templates/1/versions', { from: 1 });
  const moved = v2.placements.map((p: { id: string; hole: { col: number; row: number } }) => (p.id === 'B-CR' || p.id === 'B-JR' ? { ...p, hole: { ...p.hole, col: p.hole.col + 1 } } : p));
  await call(page, base, 'PUT', '/api/templates/1/versions/2', { revision: v2.revision, placements: moved, sharedOffset: v2.sharedOffset, numbering: v2.numbering });
  await call(page, base, 'POST', '/api/templates/1/versions/2/submit');
  // A job on template 2 v1, before v2 of it is released: pinned to an older release, never checked.
  await call(page, base, 'POST', '/api/jobs', {
    name: 'Clip CL-20 trial', partNumber: 'CL-20', partRevision: 'A', templateId: 2, version: 1,
    stock: { width: 30, thickness: 12, length: 40, material: '6082 bar' }, carrier: 3, clearance: 1, minBite: 1.5, cycleMinutes: 9, loadMinutes: 6,
  });
  await call(page, base, 'POST', '/api/templates/2/versions', { from: 1 });
  await call(page, base, 'POST', '/api/templates/2/versions/2/submit');
  await call(page, base, 'POST', '/api/templates/2/versions', { from: 2 });
  await call(page, base, 'POST', '/api/templates/2/versions/3/submit');
  await signIn(page, base, 'lead');
  await call(page, base, 'POST', '/api/templates/2/versions/2/approve', { comment: 'Same layout; checked against v1.' });
  await signIn(page, base, 'reviewer');
  await call(page, base, 'POST', '/api/templates/2/versions/3/request-changes', { comment: 'Name the second rail pair on the sheet and check stop 2 faces out.' });
}

async function main() {
  buildClientIfStale();
  mkdirSync(outDir, { recursive: true });
  const dataDir = mkdtempSync(path.join(os.tmpdir(), 'gridset-screens-'));
  const profile = mkdtempSync(path.join(os.tmpdir(), 'gridset-screens-chromium-'));
  const db = openDb(path.join(dataDir, 'screens.sqlite'));
  await migrate(db);
  await seedDemoDataIfEmpty(db);
  const app = createApp({ db, sessionSecret: 'screens', dataDir, clientDir });
  const server: Server = await new Promise((resolve) => { const s = app.listen(0, '127.0.0.1', () => resolve(s)); });
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', headless: true,
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--no-first-run'],
  });
  let saved = 0;
  try {
    const page = await context.newPage();
    page.setDefaultTimeout(20_000);
    await addReviewWork(page, base);
    for (const role of roles) {
      await signIn(page, base, role);
      for (const screen of SCREENS) {
        if (screen.roles && !screen.roles.includes(role)) continue;
        if (only && !only.has(screen.name)) continue;
        for (const vp of VIEWPORTS) {
          await page.setViewportSize({ width: vp.width, height: vp.height });
          await page.goto(`${base}${screen.url}`, { waitUntil: 'networkidle' });
          // Lists show "Loading…" until their answer is in; wait until none is left.
          await page.waitForFunction(() => !document.body.innerText.includes('Loading'), undefined, { timeout: 10_000 }).catch(() => undefined);
          const file = path.join(outDir, `${role}-${screen.name}-${vp.name}.png`);
          await page.screenshot({ path: file, fullPage: true });
          saved++;
        }
      }
    }
  } finally {
    await context.close();
    await new Promise((resolve) => server.close(resolve));
    await app.locals.close();
    await db.destroy();
    rmSync(dataDir, { recursive: true, force: true });
    rmSync(profile, { recursive: true, force: true });
  }
  console.log(`${saved} screenshots in ${outDir}`);
}

await main();
