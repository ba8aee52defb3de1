import { readFile } from 'node:fs/promises';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { startE2E, type E2E } from './browser';

/**
 * The draft mark as a user meets it in Chromium: the setup sheet opens with it (on screen and in the
 * print media), and the G-code a draft's version page downloads carries it as its first comment. The
 * state and hash compared are the version's own, as GET /api/templates/:id/versions/:n answers them.
 */
let e2e: E2E;
beforeAll(async () => { e2e = await startE2E(); });
afterAll(async () => { await e2e?.close(); });

/** A JSON call with the page's own session and CSRF token; the answer's body. */
async function call(page: Page, method: 'GET' | 'POST', url: string, data?: object) {
  const token = (await (await page.request.get(`${e2e.baseUrl}/api/auth/csrf`)).json()).token as string;
  const res = await page.request.fetch(`${e2e.baseUrl}${url}`, { method, data, headers: { 'X-CSRF-Token': token } });
  expect(res.ok(), `${method} ${url}: ${await res.text()}`).toBe(true);
  return res.json();
}

/** What the sheet shows: the banner's text (null when it has none or it is not displayed) and where it and the heading start. */
const sheetTop = (page: Page) => page.evaluate(() => {
  const banner = document.querySelector('body > .draft-mark');
  const shown = banner && getComputedStyle(banner).display !== 'none' && getComputedStyle(banner).visibility !== 'hidden';
  return {
    banner: shown ? (banner.textContent ?? '').replace(/\s+/g, ' ').trim() : null,
    bannerTop: banner?.getBoundingClientRect().top ?? null,
    headingTop: document.querySelector('h1')!.getBoundingClientRect().top,
    firstChild: document.body.firstElementChild?.className ?? '',
    text: document.body.textContent ?? '',
  };
});

describe('draft marks in a real browser', () => {
  it('a job\'s setup sheet has no mark while its version is released, and opens with the mark once the version is retired, in print too', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'programmer');
    const job = await call(page, 'POST', '/api/jobs', {
      name: 'Sheet in a browser', partNumber: 'BR-2001', partRevision: 'A', templateId: 1, version: 1,
      stock: { width: 1, thickness: 0.5, length: 2.75, material: '6061-T6' }, carrier: 0.25, clearance: 0.03, minBite: 0.06, cycleMinutes: 13, loadMinutes: 10,
    });
    const sheet = `${e2e.baseUrl}/api/jobs/${job.id}/setup-sheet.html`;
    await page.goto(sheet);
    const released = await sheetTop(page);
    expect(released.banner).toBeNull();
    expect(released.text).not.toMatch(/NOT RELEASED/);

    await e2e.signIn(page, 'lead');
    await call(page, 'POST', '/api/templates/1/versions/1/retire', {});
    const v = await call(page, 'GET', '/api/templates/1/versions/1');
    expect(v.state).toBe('retired');
    for (const media of ['screen', 'print'] as const) {
      await page.emulateMedia({ media });
      await page.goto(sheet);
      const top = await sheetTop(page);
      expect(top.firstChild, media).toBe('draft-mark');
      expect(top.banner, media).toMatch(/^NOT RELEASED/);
      expect(top.banner, media).toContain(v.state.toUpperCase());
      expect(top.banner, media).toContain(v.contentHash);
      // Above the sheet's heading: the first thing read on screen and on paper.
      expect(top.bannerTop!, media).toBeLessThan(top.headingTop);
      await page.getByRole('note').filter({ hasText: v.contentHash }).first().waitFor({ state: 'visible' });
    }
    await page.emulateMedia({ media: 'screen' });
    await page.close();
  });

  it('the G-code a draft\'s version page downloads starts its comments with the mark', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'programmer');
    const draft = await call(page, 'POST', '/api/templates/2/versions', { from: 1 });
    expect(draft.state).toBe('draft');
    const v = await call(page, 'GET', `/api/templates/2/versions/${draft.version}`);
    await page.goto(`${e2e.baseUrl}/templates/2/versions/${draft.version}`);
    await page.getByText(`Version ${draft.version} is draft, not released`).waitFor();
    await page.getByLabel('Control family').selectOption('ngc-g52');
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'offsets.nc' }).click()]);
    const body = await readFile((await download.path())!, 'utf8');
    // RS274/NGC comments are in parentheses (NISTIR 6556, "Comments and Messages"): the first one is the mark.
    const first = body.split(/\r?\n/).find((l) => l.startsWith('('));
    expect(first).toMatch(/^\(NOT RELEASED - DRAFT - /);
    expect(first).toContain(`VERSION ${v.version}`);
    expect(first).toContain(v.contentHash);
    await page.close();
  });
});
