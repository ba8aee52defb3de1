import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startE2E, type E2E } from './browser';

let e2e: E2E;
beforeAll(async () => { e2e = await startE2E(); });
afterAll(async () => { await e2e?.close(); });

describe('review of a moved rail in a real browser', () => {
  it('programmer submits, the review notice reaches the outbox, the reviewer sees the station deltas and approves', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'programmer');
    await page.goto(`${e2e.baseUrl}/templates/1/versions/1`);
    await page.getByRole('button', { name: 'New draft from v1' }).click();
    await page.waitForURL('**/versions/2');
    // Move rail set B (center rail and its jaw rail) one hole in +X: 2.000 in on this plate.
    for (const id of ['B-CR', 'B-JR']) {
      await page.getByRole('button', { name: new RegExp(`^${id}`) }).click();
      await page.getByRole('button', { name: 'Move one hole right (+X)' }).click();
    }
    await page.getByRole('button', { name: 'Save draft' }).click();
    await page.getByText(/Saved · revision/).waitFor();
    await page.getByRole('button', { name: 'Submit for review' }).click();
    await page.getByText('submitted for review').waitFor();

    // The local outbox holds the notice to the reviewer (the admin reads the outbox).
    await e2e.signIn(page, 'admin');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Outbox' }).click();
    const mail = page.getByRole('article', { name: /Review requested: Bracket 1 in bar, 20 up v2/ });
    await mail.waitFor();
    expect(await mail.textContent()).toContain('reviewer@gridset.test');

    await e2e.signIn(page, 'reviewer');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Reviews' }).click();
    await page.getByRole('link', { name: /Compare v1 → v2/ }).click();
    await page.getByText('2 placements moved').first().waitFor();
    // Each of rail B's 8 stations moves by exactly the pitch in X.
    const changed = page.getByRole('row', { name: /B-CR:\d offset changed/ });
    expect(await changed.count()).toBe(8);
    expect(await changed.first().textContent()).toContain('+2.0000 in');
    await page.getByRole('link', { name: 'Open v2' }).click();
    await page.getByLabel('Comment').fill('Rail B moved one hole; stations 13–20 checked.');
    await page.getByRole('button', { name: 'Approve and release' }).click();
    await page.getByText('approved').waitFor();
    expect((await e2e.db('template_versions').where({ template_id: 1, number: 2 }).first()).state).toBe('released');
    await page.close();
  });
});
