import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { apiStatus, startE2E, type E2E } from './browser';

/**
 * The lead's naming-rules form in Chromium. The demo convention (shared/naming/conventions.ts) has a
 * layer rule in capitals whose first token, kind, lists CR, SR and VS.
 */

let e2e: E2E;
beforeAll(async () => { e2e = await startE2E(); });
afterAll(async () => { await e2e?.close(); });

async function openForm(page: Page) {
  await page.goto(`${e2e.baseUrl}/naming`);
  await page.getByRole('button', { name: 'Edit the rules' }).click();
  await page.getByRole('heading', { name: /Edit the rules/ }).waitFor();
}

/** The convention as the API answers it, read apart from the screen. */
async function apiConvention(page: Page) {
  return (await (await page.request.get(`${e2e.baseUrl}/api/naming/convention`)).json()) as { version: number; layer: { tokens: { name: string; values?: string[] }[] } };
}

/** Elements whose box reaches past the viewport's right edge (DESIGN.md, "At the machine": nothing scrolled sideways). */
const tooWide = (page: Page) => page.evaluate(() => {
  const w = document.documentElement.clientWidth;
  const out: string[] = [];
  for (const el of document.querySelectorAll('body *')) {
    const r = el.getBoundingClientRect();
    // A visually hidden element (the 1 px skip link) is not something anyone scrolls to.
    if (r.width > 1 && (r.right > w + 0.5 || r.left < -0.5)) out.push(`${el.tagName.toLowerCase()}#${el.id}.${el.className} ${Math.round(r.left)}–${Math.round(r.right)} of ${w}`);
  }
  return { out, scroll: document.documentElement.scrollWidth, w };
});

describe('naming rules as a form', () => {
  it('the lead changes a token value in the form and saves; a reload shows it, and the API holds it', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'lead');
    await openForm(page);
    const value = page.getByLabel('Value 3 of token {kind}', { exact: true }).first();
    expect(await value.inputValue()).toBe('VS');
    await value.fill('VX');
    // VX alone is now used by no layer, which the rules allow; the form sends the version it started from.
    const put = page.waitForRequest((r) => r.url().endsWith('/api/naming/convention') && r.method() === 'PUT');
    await page.getByRole('button', { name: 'Save as version 2' }).click();
    expect((await put).postDataJSON()).toMatchObject({ revision: 1 });
    await page.getByText(/Version\s*2\s*is in force/).waitFor();
    await page.reload();
    await page.getByText(/Version\s*2\s*is in force/).waitFor();
    const layerRule = page.locator('section').filter({ has: page.getByRole('heading', { name: 'Layer names', exact: true }) }).first();
    expect(await layerRule.textContent()).toContain('one of CR, SR, VX');
    const saved = await apiConvention(page);
    expect(saved.version).toBe(2);
    expect(saved.layer.tokens.find((t) => t.name === 'kind')?.values).toEqual(['CR', 'SR', 'VX']);
    await page.close();
  });

  it('a bad value is said in a sentence on its own field, and nothing is sent', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'lead');
    await openForm(page);
    const before = (await apiConvention(page)).version;
    let puts = 0;
    page.on('request', (r) => { if (r.method() === 'PUT' && r.url().endsWith('/api/naming/convention')) puts += 1; });
    const value = page.getByLabel('Value 1 of token {kind}', { exact: true }).first();
    await value.fill('cr');
    await page.getByRole('button', { name: /^Save as version/ }).click();
    // The layer rule asks for capitals (case "upper"), so a lower-case value cannot match any name.
    await expect.poll(() => value.getAttribute('aria-invalid')).toBe('true');
    const describedBy = (await value.getAttribute('aria-describedby'))!;
    const said = await page.locator(`[id="${describedBy.split(' ')[0]}"]`).textContent();
    expect(said).toMatch(/capitals/);
    expect(said).toMatch(/"CR"/);
    expect(said).not.toMatch(/tokens\.\d|values\.\d/); // no JSON path in the sentence
    expect(await page.evaluate(() => document.activeElement?.getAttribute('aria-label'))).toBe('Value 1 of token {kind}');
    // The summary names the place in words and links to the field.
    await page.getByRole('link', { name: 'Layer names, token kind, value 1' }).waitFor();
    expect(puts).toBe(0);
    // Fixing it clears the sentence as it is typed.
    await value.fill('CR');
    await expect.poll(() => value.getAttribute('aria-invalid')).toBe('false');
    expect((await apiConvention(page)).version).toBe(before);
    await page.close();
  });

  it('a save made while someone else saved a newer version is refused, and the edits stay on screen', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'lead');
    await openForm(page);
    const opened = (await apiConvention(page)).version;
    await page.getByLabel('Value 2 of token {kind}', { exact: true }).first().fill('SX');
    // Another lead saves the rules as they are, through the API, while this form is open.
    const { version: _v, ...rules } = (await apiConvention(page)) as unknown as Record<string, unknown>;
    expect(await apiStatus(page, e2e.baseUrl, 'put', '/api/naming/convention', { ...rules, revision: opened })).toBe(200);
    await page.getByRole('button', { name: `Save as version ${opened + 1}` }).click();
    await page.getByText(`Someone saved naming convention version ${opened + 1} after you opened version ${opened}`).waitFor();
    expect(await page.getByLabel('Value 2 of token {kind}', { exact: true }).first().inputValue()).toBe('SX');
    expect((await apiConvention(page)).layer.tokens.find((t) => t.name === 'kind')?.values).not.toContain('SX');
    await page.close();
  });

  it('at 390 × 844 nothing in the open form is wider than the screen', async () => {
    const page = await e2e.newPage();
    await page.setViewportSize({ width: 390, height: 844 });
    await e2e.signIn(page, 'lead');
    await openForm(page);
    await page.getByText('The rules as JSON (import and export)').click();
    await page.getByLabel('JSON of the two rules, as the API takes them').waitFor();
    // A token of each type shown: the demo's layer rule has list, number and regex tokens.
    await page.getByLabel('Regular expression').first().waitFor();
    const { out, scroll, w } = await tooWide(page);
    expect(out).toEqual([]);
    expect(scroll).toBeLessThanOrEqual(w);
    await page.close();
  });
});
