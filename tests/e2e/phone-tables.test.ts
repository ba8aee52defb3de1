// Lists on a 390 × 844 phone: every table of the shared DataTable turns its rows into cards of
// label–value lines, so no value is cut off inside a sideways scroller and nothing reaches past the
// screen's edge. The width rule is WCAG 2.2, 1.4.10 Reflow (content at 320 CSS px wide without
// scrolling in two directions); 390 px is a common phone width (common practice).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { elementsWiderThanScreen, startE2E, type E2E } from './browser';

let e2e: E2E;
beforeAll(async () => { e2e = await startE2E(); }, 60_000);
afterAll(async () => { await e2e.close(); });

describe('lists and header on a phone', () => {
  it('users, components, plates, templates, a version, jobs and the audit log fit a 390 px screen, each row readable with its labels', async () => {
    const page = await e2e.newPage();
    await page.setViewportSize({ width: 390, height: 844 });
    for (const [role, url, heading] of [
      ['admin', '/admin/users', 'Users'],
      ['lead', '/catalog/components', 'Components'],
      ['lead', '/catalog/plates', 'Plates'],
      ['programmer', '/templates', 'Templates'],
      ['lead', '/audit', 'Audit'],
      ['lead', '/jobs', 'Jobs'],
      ['programmer', '/templates/1/versions/1', 'version 1'],
    ] as const) {
      await e2e.signIn(page, role);
      await page.goto(`${e2e.baseUrl}${url}`, { waitUntil: 'networkidle' });
      await page.getByRole('heading', { level: 1, name: heading }).waitFor();
      await page.locator('main tbody tr').first().waitFor();
      expect(await elementsWiderThanScreen(page), `${role} ${url}`).toEqual([]);
    }
    // The users card still carries each value with its label, and the role can still be changed.
    await e2e.signIn(page, 'admin');
    await page.goto(`${e2e.baseUrl}/admin/users`, { waitUntil: 'networkidle' });
    const row = page.locator('main tbody tr').filter({ hasText: 'operator@gridset.test' });
    // Each value's label is drawn before it (CSS generated content from the column's header).
    expect(await row.locator('td').first().evaluate((td) => getComputedStyle(td, '::before').content)).toMatch(/^"E-mail"/);
    const select = page.getByLabel('Role of operator@gridset.test');
    const box = (await select.boundingBox())!;
    expect(box.x + box.width).toBeLessThanOrEqual(390);
    // WCAG 2.2, 2.5.8 Target Size (Minimum): at least 24 × 24 CSS px; Gridset keeps 44 px (DESIGN.md).
    expect(box.height).toBeGreaterThanOrEqual(24);
    await page.close();
  });

  it('a component\'s dowels, stops and faces fit a phone with no number clipped inside its box', async () => {
    const page = await e2e.newPage();
    await page.setViewportSize({ width: 390, height: 844 });
    await e2e.signIn(page, 'lead');
    await page.goto(`${e2e.baseUrl}/catalog/components/1`, { waitUntil: 'networkidle' });
    await page.getByLabel('Stop positions 1 X').waitFor();
    expect(await elementsWiderThanScreen(page)).toEqual([]);
    // An input whose text is wider than its box shows only part of the number (scrollWidth > clientWidth).
    const clipped = await page.evaluate(() => Array.from(document.querySelectorAll('main input:not([type=file])')).filter((el) => el.scrollWidth > el.clientWidth + 1).map((el) => el.getAttribute('aria-label') ?? (el as HTMLInputElement).name));
    expect(clipped).toEqual([]);
    await page.close();
  });

  it('the header is one row on a phone; the menu opens the sections and closes when one is followed', async () => {
    const page = await e2e.newPage();
    await page.setViewportSize({ width: 390, height: 844 });
    await e2e.signIn(page, 'operator');
    await page.goto(`${e2e.baseUrl}/`, { waitUntil: 'networkidle' });
    const menu = page.getByRole('button', { name: 'Menu' });
    const nav = page.getByRole('navigation', { name: 'Main' });
    expect(await nav.isVisible()).toBe(false);
    // The page's own heading starts in the top fifth of the screen (the header is one row of 44 px
    // targets; with the whole menu open on every page it started at about 350 px).
    const h1 = (await page.getByRole('heading', { level: 1 }).boundingBox())!;
    expect(h1.y).toBeLessThan(844 / 5);
    await menu.click();
    expect(await menu.getAttribute('aria-expanded')).toBe('true');
    await nav.getByRole('link', { name: 'Jobs' }).click();
    await page.waitForURL(`${e2e.baseUrl}/jobs`);
    expect(await nav.isVisible()).toBe(false);
    expect(await menu.getAttribute('aria-expanded')).toBe('false');
    // Sign out is in the menu too.
    await menu.click();
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in/);
    await page.close();
  });

  it('at 1440 × 900 the same lists stay tables with their header row', async () => {
    const page = await e2e.newPage();
    await page.setViewportSize({ width: 1440, height: 900 });
    await e2e.signIn(page, 'admin');
    await page.goto(`${e2e.baseUrl}/admin/users`, { waitUntil: 'networkidle' });
    const header = page.locator('main thead th').first();
    const cell = page.locator('main tbody tr').first().locator('td').first();
    // A header cell sits above the first body cell in the same column, as in any table.
    const [h, c] = [(await header.boundingBox())!, (await cell.boundingBox())!];
    expect(c.y).toBeGreaterThan(h.y);
    expect(Math.abs(c.x - h.x)).toBeLessThan(1);
    // The card labels are hidden at this width.
    expect(await page.locator('main tbody tr').first().locator('td').first().evaluate((td) => getComputedStyle(td, '::before').content)).toBe('none');
    await page.close();
  });
});
