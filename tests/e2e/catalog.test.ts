import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startE2E, type E2E } from './browser';

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

  it('an operator finds no edit control', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'operator');
    await page.goto(`${e2e.baseUrl}/catalog/components`);
    await page.getByRole('row', { name: /CR-8/ }).waitFor();
    expect(await page.getByRole('link', { name: 'Add component' }).count()).toBe(0);
    await page.getByRole('link', { name: 'CR-8', exact: true }).click();
    await page.getByRole('heading', { name: 'Component CR-8' }).waitFor();
    expect(await page.getByRole('button', { name: /Save|Delete|Add/ }).count()).toBe(0);
    expect(await page.getByLabel('Code').isDisabled()).toBe(true);
    await page.goto(`${e2e.baseUrl}/catalog/plates`);
    await page.getByRole('row', { name: /GP-IN-12x8/ }).waitFor();
    expect(await page.getByRole('link', { name: 'Add plate' }).count()).toBe(0);
    await page.close();
  });
});
