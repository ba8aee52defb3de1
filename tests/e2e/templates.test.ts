import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { apiStatus, startE2E, type E2E } from './browser';

let e2e: E2E;
beforeAll(async () => { e2e = await startE2E(); });
afterAll(async () => { await e2e?.close(); });

describe('template editor in a real browser', () => {
  it('a programmer starts a draft, adds a stop on a free hole, sees station 21 at once, and saves it', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'programmer');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Templates' }).click();
    await page.getByRole('link', { name: 'Bracket 1 in bar, 20 up' }).click();
    await page.getByRole('heading', { name: 'Bracket 1 in bar, 20 up · version 1' }).waitFor();
    await page.getByRole('button', { name: 'New draft from v1' }).click();
    await page.waitForURL('**/versions/2');
    await page.getByLabel('Component').selectOption('ST-0.5');
    await page.getByLabel('Hole column').fill('11');
    await page.getByLabel('Hole row').fill('7');
    await page.getByRole('button', { name: 'Add placement' }).click();
    // The dowel stop's stop point is 0.25 in in +X of its dowel: hole (11, 7) = (22, 14); minus G54 on hole (1, 1) = (2, 2) → (20.25, 12).
    const row = page.getByRole('row', { name: /^21 / });
    await row.waitFor();
    expect(await row.textContent()).toContain('20.2500 in');
    expect(await row.textContent()).toContain('12.0000 in');
    await page.getByRole('button', { name: 'Save draft' }).click();
    await page.getByText(/Saved · revision/).waitFor();
    const stored = await e2e.db('template_versions').where({ template_id: 1, number: 2 }).first();
    expect(JSON.parse(stored.content).placements).toHaveLength(7);
    await page.reload();
    await page.getByRole('row', { name: /^21 / }).waitFor();
    // The files of a draft say so at their top; the page says it beside them.
    await page.getByText('Version 2 is draft, not released').waitFor();
    const csv = await page.request.get(`${e2e.baseUrl}/api/templates/1/versions/2/stations.csv`);
    expect(csv.ok()).toBe(true);
    expect((await csv.text()).split('\r\n')[0]).toMatch(/^NOT RELEASED - DRAFT - VERSION 2 - CONTENT HASH [0-9a-f]{64}/);
    await page.close();
  });

  it('an operator reads the released layout and finds no edit control', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'operator');
    await page.goto(`${e2e.baseUrl}/templates/1/versions/1`);
    await page.getByRole('row', { name: /^20 / }).waitFor();
    expect(await page.getByRole('button', { name: /Save draft|New draft|Release|Add placement/ }).count()).toBe(0);
    expect(await page.getByText(/not released/).count()).toBe(0);
    await page.close();
  });

  // The same selectors, by role and accessible name, shown to find each control for a lead on a draft
  // (so a renamed control fails here) and to find none for an operator on that draft, whose writes
  // the API refuses as well (README Roles: templates are edited by a lead or programmer, released by a lead).
  const controls = {
    save: (page: Page) => page.getByRole('button', { name: 'Save draft' }),
    add: (page: Page) => page.getByRole('button', { name: 'Add placement' }),
    newDraft: (page: Page, n: number) => page.getByRole('button', { name: `New draft from v${n}` }),
    release: (page: Page, n: number) => page.getByRole('button', { name: `Release v${n}` }),
  };
  const counts = async (page: Page, n: number) => ({
    save: await controls.save(page).count(), add: await controls.add(page).count(),
    newDraft: await controls.newDraft(page, n).count(), release: await controls.release(page, n).count(),
  });

  it('on a draft a lead finds save, add placement, new draft and release; an operator finds none, and the API refuses each', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'lead');
    const token = (await (await page.request.get(`${e2e.baseUrl}/api/auth/csrf`)).json()).token as string;
    const draft = await (await page.request.post(`${e2e.baseUrl}/api/templates/1/versions`, { data: { from: 1 }, headers: { 'X-CSRF-Token': token } })).json();
    const n = draft.version as number;
    await page.goto(`${e2e.baseUrl}/templates/1/versions/${n}`);
    await page.getByRole('row', { name: /^20 / }).waitFor();
    expect(await counts(page, n)).toEqual({ save: 1, add: 1, newDraft: 1, release: 1 });

    await e2e.signIn(page, 'operator');
    await page.goto(`${e2e.baseUrl}/templates/1/versions/${n}`);
    await page.getByRole('row', { name: /^20 / }).waitFor();
    expect(await counts(page, n)).toEqual({ save: 0, add: 0, newDraft: 0, release: 0 });
    expect(await apiStatus(page, e2e.baseUrl, 'put', `/api/templates/1/versions/${n}`, { ...draft })).toBe(403);
    expect(await apiStatus(page, e2e.baseUrl, 'post', '/api/templates/1/versions', { from: n })).toBe(403);
    expect(await apiStatus(page, e2e.baseUrl, 'post', `/api/templates/1/versions/${n}/release`)).toBe(403);
    expect((await e2e.db('template_versions').where({ template_id: 1, number: n }).first()).state).toBe('draft');
    await page.close();
  });
});
