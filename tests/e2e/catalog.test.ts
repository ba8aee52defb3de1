import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { apiStatus, startE2E, type E2E } from './browser';

let e2e: E2E;
beforeAll(async () => { e2e = await startE2E(); });
afterAll(async () => { await e2e?.close(); });

describe('catalog in a real browser', () => {
  it('a programmer adds a component and sees it in the table', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'programmer');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Components' }).click();
    await page.getByRole('link', { name: 'Add component' }).click();
    await page.getByLabel('Code').fill('JR-2.000');
    await page.getByLabel('Kind').selectOption('jaw-rail');
    await page.getByLabel('Name').fill('Jaw rail, holds 2.000 in');
    await page.getByRole('button', { name: 'Add', exact: true }).first().click(); // a second dowel
    await page.getByLabel('Locating dowels 2 X').fill('8');
    await page.getByRole('button', { name: 'Add component' }).click();
    await page.waitForURL('**/catalog/components');
    const row = page.getByRole('row', { name: /JR-2\.000/ });
    await row.waitFor();
    expect(await row.textContent()).toContain('8.0000 in');
    expect(await e2e.db('components').where({ code: 'JR-2.000' }).first()).toMatchObject({ kind: 'jaw-rail' });
    await page.close();
  });

  it('shows inline errors from the shared schema before anything is sent', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'lead');
    await page.goto(`${e2e.baseUrl}/catalog/plates/new`);
    await page.getByLabel('Code').fill('');
    await page.getByLabel('Grid pitch').fill('-1');
    await page.getByRole('button', { name: 'Add plate' }).click();
    await expect.poll(() => page.getByText('Code is required.').count()).toBe(1);
    await expect.poll(() => page.getByText('Pitch must be greater than zero.').count()).toBe(1);
    await page.close();
  });

  // The edit controls, found by role and accessible name. Each selector is first shown to find its
  // control for a lead (so renaming a control fails here rather than passing the operator's check),
  // then to find nothing for an operator, whose writes the API refuses as well (403).
  const addComponent = (page: Page) => page.getByRole('link', { name: 'Add component' });
  const componentEdits = (page: Page) => page.getByRole('button', { name: /Save|Delete|Add/ });
  const addPlate = (page: Page) => page.getByRole('link', { name: 'Add plate' });

  async function catalogControls(page: Page) {
    await page.goto(`${e2e.baseUrl}/catalog/components`);
    await page.getByRole('row', { name: /CR-8/ }).waitFor();
    const add = await addComponent(page).count();
    await page.getByRole('link', { name: 'CR-8', exact: true }).click();
    await page.getByRole('heading', { name: 'Component CR-8' }).waitFor();
    const edits = await componentEdits(page).count();
    const codeDisabled = await page.getByLabel('Code').isDisabled();
    await page.goto(`${e2e.baseUrl}/catalog/plates`);
    await page.getByRole('row', { name: /GP-IN-12x8/ }).waitFor();
    return { add, edits, codeDisabled, addPlate: await addPlate(page).count() };
  }

  it('a lead finds the edit controls the operator must not: the same selectors find them', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'lead');
    const c = await catalogControls(page);
    expect(c.add).toBe(1);
    expect(c.edits).toBeGreaterThan(0);
    expect(c.codeDisabled).toBe(false);
    expect(c.addPlate).toBe(1);
    await page.close();
  });

  it('an operator finds no edit control, and the API refuses the writes they would send', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'operator');
    const c = await catalogControls(page);
    expect(c).toEqual({ add: 0, edits: 0, codeDisabled: true, addPlate: 0 });
    // README Roles: "catalog: create and edit" and "catalog: delete" are not the operator's.
    const cr8 = (await (await page.request.get(`${e2e.baseUrl}/api/components`)).json()).items.find((x: { code: string }) => x.code === 'CR-8');
    expect(await apiStatus(page, e2e.baseUrl, 'post', '/api/components', { code: 'X-1' })).toBe(403);
    expect(await apiStatus(page, e2e.baseUrl, 'put', `/api/components/${cr8.id}`, {})).toBe(403);
    expect(await apiStatus(page, e2e.baseUrl, 'delete', `/api/components/${cr8.id}`)).toBe(403);
    expect(await apiStatus(page, e2e.baseUrl, 'post', '/api/plates', { code: 'X-1' })).toBe(403);
    await page.close();
  });
});
