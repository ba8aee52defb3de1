import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startE2E, type E2E } from './browser';

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
    await page.close();
  });

  it('an operator reads the released layout and finds no edit control', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'operator');
    await page.goto(`${e2e.baseUrl}/templates/1/versions/1`);
    await page.getByRole('row', { name: /^20 / }).waitFor();
    expect(await page.getByRole('button', { name: /Save draft|New draft|Release|Add placement/ }).count()).toBe(0);
    await page.close();
  });
});
