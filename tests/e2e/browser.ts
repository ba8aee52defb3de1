import { mkdtempSync, rmSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { createApp } from '../../server/app';
import { openDb, migrate, type Db } from '../../server/db/knex';
import { seedDemoDataIfEmpty, DEMO_PASSWORD } from '../../server/db/seed-demo';
import { clientDir } from '../../scripts/build-client';
import type { Role } from '../../shared/schemas/auth';

/** Debian's chromium, never a downloaded browser; flags keep it off this machine's closed network. */
export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
export const CHROMIUM_ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--no-first-run'];

export interface E2E {
  baseUrl: string;
  db: Db;
  context: BrowserContext;
  newPage(): Promise<Page>;
  signIn(page: Page, role: Role): Promise<void>;
  close(): Promise<void>;
}

/**
 * A real server on a free port over a fresh SQLite file, and a fresh Chromium profile. With `host`,
 * Chromium resolves that name to the server (as a shop's DNS would) and every page is opened
 * through it, so the browser treats the site as any other plain-HTTP origin, not as localhost.
 */
export async function startE2E(options: { host?: string } = {}): Promise<E2E> {
  const dataDir = mkdtempSync(path.join(os.tmpdir(), 'gridset-e2e-'));
  const db = openDb(path.join(dataDir, 'e2e.sqlite'));
  await migrate(db);
  await seedDemoDataIfEmpty(db);
  const app = createApp({ db, sessionSecret: 'e2e-secret', dataDir, clientDir });
  const server: Server = await new Promise((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const baseUrl = `http://${options.host ?? '127.0.0.1'}:${(server.address() as AddressInfo).port}`;
  const profile = mkdtempSync(path.join(os.tmpdir(), 'gridset-chromium-'));
  const args = options.host ? [...CHROMIUM_ARGS, `--host-resolver-rules=MAP ${options.host} 127.0.0.1`] : CHROMIUM_ARGS;
  const context = await chromium.launchPersistentContext(profile, { executablePath: CHROMIUM_PATH, headless: true, args, viewport: { width: 1280, height: 900 } });
  return {
    baseUrl, db, context,
    async newPage() {
      const page = await context.newPage();
      page.setDefaultTimeout(10_000);
      return page;
    },
    async signIn(page, role) {
      // One persistent profile per run: drop the last test's session so the sign-in form shows.
      await context.clearCookies();
      await page.goto(`${baseUrl}/sign-in`);
      await page.getByLabel('E-mail address').fill(`${role}@gridset.test`);
      await page.getByLabel('Password').fill(DEMO_PASSWORD);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.getByTestId('signed-in-user').waitFor();
    },
    async close() {
      await context.close();
      await new Promise((resolve) => server.close(resolve));
      await db.destroy();
      rmSync(dataDir, { recursive: true, force: true });
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/**
 * The status the API answers a write sent with the page's own session (its cookies) and the CSRF
 * token that session is given: what the server does for that user, apart from what the screen shows.
 */
export async function apiStatus(page: Page, baseUrl: string, method: 'post' | 'put' | 'delete', url: string, data: object = {}): Promise<number> {
  const token = (await (await page.request.get(`${baseUrl}/api/auth/csrf`)).json()).token as string;
  const res = await page.request.fetch(`${baseUrl}${url}`, { method: method.toUpperCase(), data, headers: { 'X-CSRF-Token': token } });
  return res.status();
}

/** A JSON call with the page's own session and CSRF token; the answer's body (a non-2xx answer throws with its text). */
export async function apiJson(page: Page, baseUrl: string, method: 'GET' | 'POST' | 'PUT', url: string, data?: object) {
  const token = (await (await page.request.get(`${baseUrl}/api/auth/csrf`)).json()).token as string;
  const res = await page.request.fetch(`${baseUrl}${url}`, { method, data, headers: { 'X-CSRF-Token': token } });
  if (!res.ok()) throw new Error(`${method} ${url} answered ${res.status()}: ${await res.text()}`);
  return res.json();
}

/**
 * Every element that reaches past the right edge of the screen (or the page scrolling sideways),
 * named by tag, id and first classes: empty when a page fits a phone. Elements inside a scroller
 * count too, since their content is cut off there.
 */
export async function elementsWiderThanScreen(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const w = document.documentElement.clientWidth;
    const out: string[] = [];
    if (document.documentElement.scrollWidth > w) out.push(`page scrolls sideways: ${document.documentElement.scrollWidth} > ${w}`);
    for (const el of Array.from(document.body.querySelectorAll('*'))) {
      const r = el.getBoundingClientRect();
      if (r.width === 0 && r.height === 0) continue;
      if (r.width > w + 0.5 || r.right > w + 0.5) out.push(`${el.tagName.toLowerCase()}${el.id ? `#${el.id}` : ''}.${(el.getAttribute('class') ?? '').split(' ').slice(0, 3).join('.')} ${Math.round(r.left)}…${Math.round(r.right)}`);
    }
    return out;
  });
}
