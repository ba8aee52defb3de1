// The job page at the machine, in a real Chromium at a 390 × 844 phone and a 1440 × 900 desk: nothing
// reaches past the screen's edge (WCAG 2.2, 1.4.10 Reflow: no scrolling in two directions; 390 px is a
// common phone width, common practice), the load list holds every bar of the latest check once (one
// bar per station and each bar once: common practice, a bar in two vises is a setup error), a tick
// survives a reload (kept on the server), and printing shows the load list without the site's
// navigation (CSS Media Queries Level 4, the `print` media type, emulated by the browser).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { apiJson, elementsWiderThanScreen, startE2E, type E2E } from './browser';

let e2e: E2E;
beforeAll(async () => { e2e = await startE2E(); }, 60_000);
afterAll(async () => { await e2e?.close(); });

/** A JSON call with the page's own session and CSRF token; the answer's body. */
const call = (page: Page, method: 'GET' | 'POST' | 'PUT', url: string, data?: object) => apiJson(page, e2e.baseUrl, method, url, data);

type Setting = { bars: string[] };
type CheckAnswer = { rails: { jawPlacement: string; result: { settings: Setting[] } }[] };

describe('the job page at the machine', () => {
  for (const [width, height] of [[390, 844], [1440, 900]] as const) {
    it(`at ${width} × ${height}: fits the screen, lists every bar of the latest check once, keeps ticks, prints the load list alone`, async () => {
      const page = await e2e.newPage();
      await page.setViewportSize({ width, height });
      await e2e.signIn(page, 'operator');
      const jobs = await call(page, 'GET', '/api/jobs');
      const job = jobs.items.find((j: { name: string }) => j.name.startsWith('Bracket BR-1001')) ?? jobs.items[0];
      const detail = await call(page, 'GET', `/api/jobs/${job.id}`);
      // Bars a few thou either side of the 1.0000 in nominal opening of the demo rails, fewer than the
      // stations the job uses, so each can have a station of its own.
      const count = Math.min(10, detail.stationsUsed.length);
      const bars = Array.from({ length: count }, (_, i) => ({ id: `M${width}-${i + 1}`, width: 0.996 + i * 0.001, thickness: 0.5, cornerRadius: 0.02 }));
      const answer: CheckAnswer = await call(page, 'POST', `/api/jobs/${job.id}/stock-check`, { bars });
      // The bars the check says a rail setting holds: every one goes into the load list, once.
      const expected = new Set(answer.rails.flatMap((r) => r.result.settings.flatMap((s) => s.bars)));
      expect(expected.size).toBeGreaterThan(0);

      await page.goto(`${e2e.baseUrl}/jobs/${job.id}`);
      await page.getByRole('heading', { name: job.name, level: 1 }).waitFor();
      const panel = page.locator('#load-list');
      await panel.getByRole('heading', { name: 'Load list for this cycle' }).waitFor();
      const listed = (await panel.getByTestId('load-list-station').evaluateAll((els) => els.map((e) => e.getAttribute('data-bar') ?? ''))).filter(Boolean);
      expect(listed.length).toBe(new Set(listed).size); // each bar once
      expect(new Set(listed)).toEqual(expected);

      // The jump list near the top reaches the load list in one tap.
      const jump = page.getByRole('navigation', { name: 'On this page' });
      expect(await jump.getByRole('link', { name: 'Load list' }).getAttribute('href')).toBe('#load-list');

      // Nothing wider than the screen: the whole page, with the load list, the stock check and its
      // measured-bars entry (one card per bar on a phone) shown.
      await page.locator('form[aria-labelledby="job-bars-title"]').waitFor();
      expect(await elementsWiderThanScreen(page)).toEqual([]);

      // A station ticked loaded, then clamped, is still ticked after a reload.
      const first = [...expected].sort()[0]!;
      const row = panel.locator(`[data-testid="load-list-station"][data-bar="${first}"]`);
      const station = Number(await row.getAttribute('data-station'));
      const loaded = page.getByRole('checkbox', { name: `Station ${station} loaded` });
      const clamped = page.getByRole('checkbox', { name: `Station ${station} clamped` });
      expect(await clamped.isDisabled()).toBe(true); // clamped comes after loaded
      // Each tick target is at least 44 × 44 px (WCAG 2.2, 2.5.5 Target Size).
      const box = await row.getByTestId('tick-loaded').boundingBox();
      expect(box!.width).toBeGreaterThanOrEqual(44);
      expect(box!.height).toBeGreaterThanOrEqual(44);
      await loaded.check();
      await page.waitForFunction((n) => document.querySelector('[data-testid="load-list-tick-count"]')?.textContent?.startsWith('1 of') && !(document.querySelector(`input[aria-label="Station ${n} clamped"]`) as HTMLInputElement | null)?.disabled, station);
      await clamped.check();
      await page.getByTestId('load-list-tick-count').filter({ hasText: /1 of \d+ clamped/ }).waitFor();
      await page.reload();
      await page.getByRole('checkbox', { name: `Station ${station} clamped` }).waitFor();
      expect(await page.getByRole('checkbox', { name: `Station ${station} loaded` }).isChecked()).toBe(true);
      expect(await page.getByRole('checkbox', { name: `Station ${station} clamped` }).isChecked()).toBe(true);
      const kept = await call(page, 'GET', `/api/jobs/${job.id}/load-list`);
      expect(kept.ticks.stations).toEqual([{ station, loaded: true, clamped: true }]);

      // Printed: the load list alone, with the advice line and the bar of every station; no navigation,
      // header, footer or buttons.
      await page.emulateMedia({ media: 'print' });
      expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false);
      expect(await page.getByRole('navigation', { name: 'On this page' }).isVisible()).toBe(false);
      expect(await page.locator('body > div header, footer').evaluateAll((els) => els.filter((e) => (e as HTMLElement).offsetParent !== null || getComputedStyle(e).display !== 'none').length)).toBe(0);
      expect(await page.getByRole('button').evaluateAll((els) => els.filter((e) => getComputedStyle(e).display !== 'none' && (e as HTMLElement).offsetParent !== null).length)).toBe(0);
      expect(await page.locator('#stock-check').isVisible()).toBe(false);
      const printed = page.getByTestId('load-list-print');
      expect(await printed.isVisible()).toBe(true);
      const text = (await printed.textContent()) ?? '';
      expect(text).toContain(job.name);
      expect(text).toContain(`version ${detail.version}`);
      expect(text).toMatch(/operator checks every clamp before cycle start/);
      expect(text).toMatch(/machine builder’s instructions/);
      const printedBars = (await printed.getByTestId('load-list-print-row').evaluateAll((rows) => rows.map((r) => r.children[1]?.textContent ?? ''))).filter((b) => !b.startsWith('empty'));
      expect(new Set(printedBars)).toEqual(expected);
      expect(printedBars.length).toBe(expected.size);
      await page.emulateMedia({ media: 'screen' });
      await page.close();
    }, 60_000);
  }
});
