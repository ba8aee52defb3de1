import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startE2E, type E2E } from './browser';

/**
 * The shared file picker (app/components/ui/file-picker.tsx) on the template import: reached with Tab,
 * opened with Space (the key that activates a button, WAI-ARIA Authoring Practices, "Button" pattern),
 * a target of at least 44 × 44 CSS px (WCAG 2.2, 2.5.5 Target Size), the chosen file's name shown.
 */
let e2e: E2E;
beforeAll(async () => { e2e = await startE2E(); });
afterAll(async () => { await e2e?.close(); });

describe('the file picker', () => {
  it('is reached and opened from the keyboard, is a 44 px target with a visible focus ring, and names the file chosen', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'programmer');
    await page.goto(`${e2e.baseUrl}/templates`);
    const picker = page.getByLabel('template.json file');
    await picker.waitFor({ state: 'attached' });
    // The control before it in the tab order, then one Tab.
    await page.getByRole('button', { name: 'Create draft' }).focus();
    await page.keyboard.press('Tab');
    expect(await picker.evaluate((el) => el === document.activeElement)).toBe(true);
    // The button-like box around the input: its size, and its outline while the input has the keyboard's focus.
    const box = picker.locator('xpath=..');
    const size = (await box.boundingBox())!;
    expect(size.height).toBeGreaterThanOrEqual(44);
    expect(size.width).toBeGreaterThanOrEqual(44);
    expect(await box.evaluate((el) => getComputedStyle(el).outlineStyle)).toBe('solid');
    expect(await page.getByText('No file chosen').count()).toBeGreaterThan(0);
    const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.keyboard.press('Space')]);
    await chooser.setFiles({ name: 'not-a-template.json', mimeType: 'application/json', buffer: Buffer.from('{ not json') });
    await page.getByText('not-a-template.json is not a JSON file; choose a template.json exported from Gridset.').waitFor();
    expect(await page.getByText('not-a-template.json', { exact: true }).count()).toBe(1);
    await page.close();
  });
});
