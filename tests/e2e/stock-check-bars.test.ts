import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { request, type Page } from 'playwright-core';
import { DEMO_PASSWORD } from '../../server/db/seed-demo';
import { startE2E, type E2E } from './browser';

/**
 * The operator's bar entry for a job, on a phone (390 × 844 CSS px, a common phone viewport) and at
 * a desk (1440 × 900): cells pasted from a spreadsheet, the server draft across a reload, and a
 * layout that never scrolls sideways. Chromium itself is the reference for layout (its
 * getBoundingClientRect) and for the clipboard (a ClipboardEvent carrying a DataTransfer, as the
 * Clipboard API and events spec defines the paste event).
 */
let e2e: E2E;
beforeAll(async () => { e2e = await startE2E(); });
afterAll(async () => { await e2e?.close(); });

const VIEWPORTS = [
  { name: 'phone', width: 390, height: 844 },
  { name: 'desk', width: 1440, height: 900 },
] as const;

/** A job of its own for each test, made through the API as a programmer (operators do not create jobs). */
async function newJob(name: string): Promise<number> {
  const ctx = await request.newContext({ baseURL: e2e.baseUrl });
  try {
    const csrf = (await (await ctx.get('/api/auth/csrf')).json()).token as string;
    const login = await ctx.post('/api/auth/login', { data: { email: 'programmer@gridset.test', password: DEMO_PASSWORD }, headers: { 'X-CSRF-Token': csrf } });
    const token = (await login.json()).csrfToken as string;
    const res = await ctx.post('/api/jobs', {
      headers: { 'X-CSRF-Token': token },
      data: { name, partNumber: 'E2E-7', partRevision: 'A', templateId: 1, version: 1, stock: { width: 1, thickness: 0.5, length: 2.75, material: '6061-T6' }, carrier: 0.25, clearance: 0.03, minBite: 0.06, cycleMinutes: 13, loadMinutes: 10 },
    });
    expect(res.status()).toBe(201);
    return (await res.json()).id as number;
  } finally {
    await ctx.dispose();
  }
}

async function openJob(page: Page, id: number) {
  await page.goto(`${e2e.baseUrl}/stock-check?job=${id}`);
  await page.getByRole('heading', { name: /Measured bars/ }).waitFor();
}

/** Pastes text into the focused cell the way a browser delivers a paste: a cancelable ClipboardEvent with a DataTransfer. */
async function pasteInto(page: Page, label: string, text: string) {
  await page.getByLabel(label, { exact: true }).focus();
  await page.evaluate((t) => {
    const dt = new DataTransfer();
    dt.setData('text/plain', t);
    document.activeElement!.dispatchEvent(new ClipboardEvent('paste', { clipboardData: dt, bubbles: true, cancelable: true }));
  }, text);
}

/** Every element whose right edge is past the viewport, and the page's own sideways scroll. */
async function overflow(page: Page) {
  return page.evaluate(() => ({
    innerWidth,
    scrollWidth: document.documentElement.scrollWidth,
    wide: [...document.querySelectorAll('body *')]
      .map((el) => ({ el, r: el.getBoundingClientRect() }))
      .filter(({ r }) => r.width > 0 && r.right > innerWidth + 0.5)
      .map(({ el, r }) => `${el.tagName.toLowerCase()}.${String(el.getAttribute('class') ?? '').slice(0, 60)} right=${r.right}`),
  }));
}

const FIELDS = ['id', 'width', 'thickness', 'corner radius'] as const;
const cellsOf = (page: Page, row: number) => Promise.all(FIELDS.map((f) => page.getByLabel(`Row ${row} ${f}`, { exact: true }).inputValue()));

describe.each(VIEWPORTS)('bar entry for a job at $width × $height ($name)', ({ name, width, height }) => {
  it('a 3-row block pasted from a spreadsheet into row 2 fills exactly rows 2–4 from that cell on', async () => {
    const id = await newJob(`Paste ${name}`);
    const page = await e2e.newPage();
    await page.setViewportSize({ width, height });
    await e2e.signIn(page, 'operator');
    await openJob(page, id);
    // Three rows of width, thickness, corner radius as a spreadsheet copies them: tab-separated, CRLF line ends,
    // a line break after the last row, and one cell quoted (RFC 4180 §2 quoting, which spreadsheets use on the clipboard).
    const block = [['1.002', '0.501', '0.020'], ['0.998', '0.499', '0.030'], ['1.010', '0.500', '0']];
    const quote = (cell: string, i: number) => (i === 1 ? `"${cell}"` : cell);
    const text = block.map((row) => row.map(quote).join('\t')).join('\r\n') + '\r\n';
    await pasteInto(page, 'Row 2 width', text);

    const rows = page.getByTestId('bar-row');
    expect(await rows.count()).toBe(4); // the table's three rows, one added
    // Row 1 untouched; rows 2–4 hold the block, each under the column it was pasted into; row 4 got the table's next id.
    expect(await cellsOf(page, 1)).toEqual(['B1', '', '', '']);
    for (let r = 0; r < block.length; r++) expect(await cellsOf(page, r + 2)).toEqual([`B${r + 2}`, ...block[r]!]);
    const filled = await Promise.all([1, 2, 3, 4].map(async (r) => (await page.getByLabel(`Row ${r} width`, { exact: true }).inputValue()) !== ''));
    expect(filled.filter(Boolean)).toHaveLength(block.length);
    expect(await page.getByTestId('cell-paste-note').textContent()).toBe(`Pasted ${block.length} rows into rows 2–${block.length + 1}, width, thickness, corner radius (1 row added).`);
    await page.close();
  });

  it('typed bars are kept as a draft on the server and come back after a reload', async () => {
    const id = await newJob(`Draft ${name}`);
    const page = await e2e.newPage();
    await page.setViewportSize({ width, height });
    await e2e.signIn(page, 'operator');
    await openJob(page, id);
    const typed = [['B1', '1.0005', '0.4980', '0.025'], ['lot 9', '0.9990', '0.5010', '0.03']];
    for (let r = 0; r < typed.length; r++) {
      for (let f = 0; f < FIELDS.length; f++) await page.getByLabel(`Row ${r + 1} ${FIELDS[f]}`, { exact: true }).fill(typed[r]![f]!);
    }
    const saved = page.waitForResponse((res) => res.url().endsWith(`/api/jobs/${id}/bars-draft`) && res.request().method() === 'PUT' && res.status() === 200);
    await saved;
    await page.locator('[data-testid="draft-status"][data-state="saved"]').waitFor();
    expect(await page.getByTestId('draft-status').textContent()).toMatch(/^Saved as draft · \d\d:\d\d, by /);

    await page.reload();
    await page.getByRole('heading', { name: /Measured bars/ }).waitFor();
    for (let r = 0; r < typed.length; r++) expect(await cellsOf(page, r + 1)).toEqual(typed[r]);
    expect(await page.getByTestId('draft-status').getAttribute('data-state')).toBe('saved');
    // The same draft as the API answers it, cell for cell.
    const job = await (await page.request.get(`${e2e.baseUrl}/api/jobs/${id}`)).json();
    expect(job.barsDraft.rows.slice(0, typed.length).map((x: Record<string, string>) => [x.id, x.width, x.thickness, x.cornerRadius])).toEqual(typed);
    await page.close();
  });

  it('nothing is wider than the viewport, before and after a check; on a phone every control is at least 44 px', async () => {
    const id = await newJob(`Layout ${name}`);
    const page = await e2e.newPage();
    await page.setViewportSize({ width, height });
    await e2e.signIn(page, 'operator');
    await openJob(page, id);
    await pasteInto(page, 'Row 1 id', 'B1\t1.000\t0.5\t0.02\nB2\t1.045\t0.5\t0.02\nB3\t1.2\t0.5\t0.02\n');
    let o = await overflow(page);
    expect(o.wide).toEqual([]);
    expect(o.scrollWidth).toBeLessThanOrEqual(o.innerWidth);

    // Size cells open a decimal keypad (HTML inputmode="decimal"); ids take text.
    expect(await page.getByLabel('Row 1 width', { exact: true }).getAttribute('inputmode')).toBe('decimal');
    expect(await page.getByLabel('Row 1 corner radius', { exact: true }).getAttribute('inputmode')).toBe('decimal');
    expect(await page.getByLabel('Row 1 id', { exact: true }).getAttribute('inputmode')).toBe('text');

    const table = page.getByRole('table', { name: /Measured bars/ });
    const display = await table.evaluate((el) => getComputedStyle(el).display);
    if (width < 640) {
      expect(display).toBe('block'); // stacked into one card per bar
      // WCAG 2.2 SC 2.5.5 (Target Size, Enhanced): 44 × 44 CSS px for every control the operator touches.
      const small = await page.locator('main').evaluate((main) => [...main.querySelectorAll('input, select, button, summary, textarea')]
        .map((el) => ({ el, r: el.getBoundingClientRect() }))
        .filter(({ r }) => r.width > 0 && (r.height < 44 || r.width < 44))
        .map(({ el, r }) => `${el.tagName.toLowerCase()} "${el.getAttribute('aria-label') ?? el.textContent?.trim().slice(0, 30)}" ${r.width}×${r.height}`));
      expect(small).toEqual([]);
    } else {
      expect(display).toBe('table'); // the desk keeps the table with its header row
      expect(await table.locator('thead th').first().isVisible()).toBe(true);
    }

    await page.getByRole('button', { name: /Check the bars/ }).click();
    await page.getByRole('heading', { name: 'Which bars go on which setting' }).waitFor();
    await page.getByTestId('job-setting-line').first().waitFor();
    o = await overflow(page);
    expect(o.wide).toEqual([]);
    expect(o.scrollWidth).toBeLessThanOrEqual(o.innerWidth);
    // The check cleared the draft in its transaction.
    const job = await (await page.request.get(`${e2e.baseUrl}/api/jobs/${id}`)).json();
    expect(job.barsDraft).toBeNull();
    expect(job.stockChecks).toHaveLength(1);
    await page.close();
  });
});

describe('two screens on one job', () => {
  it('the second screen is told its save came too late (409), keeps nothing unseen, and loads what the first saved', async () => {
    const id = await newJob('Two screens');
    const desk = await e2e.newPage();
    await e2e.signIn(desk, 'operator');
    const phone = await e2e.newPage();
    await phone.setViewportSize({ width: 390, height: 844 });
    // Both open the job before either types: neither has seen a draft.
    await openJob(desk, id);
    await openJob(phone, id);

    await desk.getByLabel('Row 1 width', { exact: true }).fill('1.0040');
    await desk.locator('[data-testid="draft-status"][data-state="saved"]').waitFor();

    const refused = phone.waitForResponse((res) => res.url().endsWith(`/api/jobs/${id}/bars-draft`) && res.request().method() === 'PUT');
    await phone.getByLabel('Row 1 width', { exact: true }).fill('0.9960');
    expect((await refused).status()).toBe(409);
    await phone.locator('[data-testid="draft-status"][data-state="failed"]').waitFor();
    expect(await phone.getByTestId('draft-status').textContent()).toMatch(/^Not saved — Another screen saved these bars after this one loaded them/);
    // The server still holds the desk's bars.
    const held = await (await desk.request.get(`${e2e.baseUrl}/api/jobs/${id}`)).json();
    expect(held.barsDraft.rows[0].width).toBe('1.0040');

    await phone.getByRole('button', { name: 'Load the bars the server holds' }).click();
    await phone.locator('[data-testid="draft-status"][data-state="saved"]').waitFor();
    expect(await phone.getByLabel('Row 1 width', { exact: true }).inputValue()).toBe('1.0040');
    // From the revision it loaded, the phone's next change is kept.
    const kept = phone.waitForResponse((res) => res.url().endsWith(`/api/jobs/${id}/bars-draft`) && res.request().method() === 'PUT');
    await phone.getByLabel('Row 1 thickness', { exact: true }).fill('0.5010');
    expect((await kept).status()).toBe(200);
    const after = await (await desk.request.get(`${e2e.baseUrl}/api/jobs/${id}`)).json();
    expect(after.barsDraft.rows[0]).toMatchObject({ width: '1.0040', thickness: '0.5010' });
    await desk.close();
    await phone.close();
  });
});

describe('a save that does not reach the server', () => {
  it('says "Not saved" with the reason, keeps the bars on screen and sends them again', async () => {
    const id = await newJob('Lost connection');
    const page = await e2e.newPage();
    await e2e.signIn(page, 'operator');
    await openJob(page, id);
    // The connection drops for the first save (playwright-core's request routing aborts it as a failed network request).
    let dropped = 0;
    await page.route(`**/api/jobs/${id}/bars-draft`, async (route) => {
      if (dropped++ === 0) await route.abort('internetdisconnected');
      else await route.continue();
    });
    await page.getByLabel('Row 1 width', { exact: true }).fill('1.0020');
    await page.locator('[data-testid="draft-status"][data-state="failed"]').waitFor();
    expect(await page.getByTestId('draft-status').textContent()).toBe('Not saved — the server cannot be reached; the bars stay on this screen and are sent again in a few seconds');
    expect(await page.getByLabel('Row 1 width', { exact: true }).inputValue()).toBe('1.0020');
    // Sent again by itself, unchanged.
    await page.locator('[data-testid="draft-status"][data-state="saved"]').waitFor({ timeout: 30_000 });
    const job = await (await page.request.get(`${e2e.baseUrl}/api/jobs/${id}`)).json();
    expect(job.barsDraft.rows[0].width).toBe('1.0020');
    expect(dropped).toBe(2);
    await page.close();
  });
});

describe('the stock check without a job, on a phone', () => {
  it('after a check nothing is wider than 390 px: the bar-by-bar table stacks and the chart fits its box', async () => {
    const page = await e2e.newPage();
    await page.setViewportSize({ width: 390, height: 844 });
    await e2e.signIn(page, 'operator');
    await page.goto(`${e2e.baseUrl}/stock-check`);
    const option = page.getByLabel('Jaw rail').locator('option', { hasText: 'JR-1.000 —' });
    await page.getByLabel('Jaw rail').selectOption((await option.getAttribute('value'))!);
    await page.getByLabel('Carrier thickness').fill('0.25');
    await page.getByLabel('Tool clearance').fill('0.03');
    await page.getByLabel('Minimum bite').fill('0.06');
    await page.getByLabel('Nominal stock width').fill('1');
    // A long id and a far over-size bar are what widen a table or a chart.
    await pasteInto(page, 'Row 1 id', 'B1\t1.000\t0.5\t0.02\nB2\t1.045\t0.5\t0.02\nB3\t1.2\t0.5\t0.02\nLONG-BAR-ID-1234567890\t0.95\t0.5\t0.02\n');
    await page.getByRole('button', { name: 'Check the bars' }).click();
    await page.getByRole('list', { name: 'Sorting list' }).waitFor();
    const o = await overflow(page);
    expect(o.wide).toEqual([]);
    expect(o.scrollWidth).toBeLessThanOrEqual(o.innerWidth);
    const results = page.getByRole('table', { name: 'Stock check, bar by bar' });
    expect(await results.evaluate((el) => getComputedStyle(el).display)).toBe('block');
    // Every bar is still there, each line labelled by its column.
    expect(await results.locator('tbody tr').count()).toBe(4);
    // The labels are CSS generated content from each cell's data-label (not part of its text).
    const labels = await results.locator('tbody tr').first().locator('td').evaluateAll((tds) => tds.map((td) => getComputedStyle(td, '::before').content));
    expect(labels.some((l) => l.startsWith('"Verdict at shift 0"'))).toBe(true);
    await page.close();
  });
});
