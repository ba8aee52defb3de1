import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { startE2E, type E2E } from './browser';

let e2e: E2E;
beforeAll(async () => { e2e = await startE2E(); });
afterAll(async () => { await e2e?.close(); });

/** Open Stock check from the navigation and choose the demo rail JR-1.000 (its clamp model is in server/db/seed-demo.ts). */
async function openWithRail(page: Page) {
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Stock check' }).click();
  await page.getByRole('heading', { name: 'Stock check', level: 1 }).waitFor();
  const option = page.getByLabel('Jaw rail').locator('option', { hasText: 'JR-1.000 —' });
  await page.getByLabel('Jaw rail').selectOption((await option.getAttribute('value'))!);
  await page.getByRole('heading', { name: /Clamp model of JR-1\.000/ }).waitFor();
}

describe('stock check in a real browser', () => {
  it('an operator pastes three bars and reads the verdicts, the sorting list and the caution', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'operator');
    await openWithRail(page);
    // The clamp model is shown read only beside the job's numbers: JR-1.000 slips ±0.015 in its slots.
    expect(await page.getByRole('region', { name: /Clamp model of JR-1\.000/ }).textContent()).toContain('0.0150 in');
    expect(await page.getByLabel('Nominal opening').inputValue()).toBe('1.0000');
    await page.getByLabel('Carrier thickness').fill('0.25');
    await page.getByLabel('Tool clearance').fill('0.03');
    await page.getByLabel('Minimum bite').fill('0.06');

    // A paste with one bad cell is refused whole, naming the cell, and the table is left as it was.
    const paste = page.getByLabel('Paste from a spreadsheet');
    await paste.fill('id\twidth\tthickness\tcorner radius\nB1\t1.000\t0.5\t0.02\nB2\t1.045\tabc\t0.02');
    await page.getByRole('button', { name: 'Replace the table with these rows' }).click();
    await page.getByText('row 3, column C (thickness): "abc" is not a number').waitFor();
    expect(await page.getByLabel('Row 1 width').inputValue()).toBe('');

    await paste.fill([
      'id\twidth\tthickness\tcorner radius',
      'B1\t1.000\t0.5\t0.02',
      'B2\t1.045\t0.5\t0.02',
      'B3\t1.2\t0.5\t0.02',
    ].join('\n'));
    await page.getByRole('button', { name: 'Replace the table with these rows' }).click();
    expect(await page.getByLabel('Row 3 width').inputValue()).toBe('1.2');

    // A rail set exactly where asked (accuracy 0): B2's one-point range can then be served. With the
    // default ±0.002 in it could not (its range is narrower than the accuracy), as the API tests show.
    await page.getByLabel('Rail setting accuracy (±)').fill('0');
    const posted = page.waitForRequest((r) => r.url().endsWith('/api/stock-check') && r.method() === 'POST');
    await page.getByRole('button', { name: 'Check the bars' }).click();
    // What leaves the browser is the job as typed and the catalog's clamp model, unchanged.
    expect((await posted).postDataJSON()).toMatchObject({
      unit: 'in', nominalOpening: 1, carrier: 0.25, clearance: 0.03, minBite: 0.06, settingAccuracy: 0,
      clamp: { acceptBelow: 0.03, acceptAbove: 0.03, topHeight: 0.16, topSlope: 0.5, gripLow: 0.04, gripHigh: 0.16, gripSlope: 0.5, slotSlop: 0.015 },
      bars: [{ id: 'B1', width: 1 }, { id: 'B2', width: 1.045 }, { id: 'B3', width: 1.2 }],
    });
    await page.getByRole('list', { name: 'Sorting list' }).waitFor();

    // The arithmetic (the server's checkStock is the reference; shared/clamps/clamp-window.ts):
    // face = [r, min(carrier, T − r)] = [0.02, min(0.25, 0.48)] = [0.02, 0.25]; top limit = carrier − clearance = 0.22.
    // B1: d = 1.000 − 1.000 = 0 → fits (−0.03 ≤ 0 ≤ 0.03); top 0.16 ≤ 0.22; band [0.04, 0.16] on the face bites 0.12 ≥ 0.06 → accepted.
    //     Accepted while −0.03 ≤ d ≤ 0.03 (top and bite allow more), so shifts s = 0 − d in [−0.03, 0.03] ∩ slop [−0.015, 0.015].
    // B2: d = 1.045 − 1.000 = 0.045 > 0.03 → too wide at shift 0 (top 0.16 + 0.5·0.045 = 0.1825 clears; bite still 0.12).
    //     It needs d ≤ 0.03, so s ≥ 0.045 − 0.03 = +0.015: exactly the slot slop, shift range [+0.015, +0.015].
    // B3: d = 0.2 → too wide; top 0.16 + 0.5·0.2 = 0.26 > 0.22 → clamp above carrier too. Needs s ≥ 0.17 > 0.015 → cannot be used.
    // Fewest settings: one shift, +0.015 in, serves B1 and B2 (both ranges hold it; opening 1.015 in).
    const settings = await page.getByTestId('setting-line').allTextContents();
    expect(settings).toEqual(['Setting 1: shift +0.0150 in — bars B1, B2']);
    // Target opening = nominal + shift = 1.0150 in; no room beyond it, since B2 holds only at +0.015.
    expect(await page.getByRole('list', { name: 'Sorting list' }).textContent()).toContain('target opening 1.0150 in ± 0.0000 in');

    const table = page.getByRole('table', { name: 'Stock check, bar by bar' });
    const b1 = await table.getByRole('row', { name: /^B1 / }).textContent();
    expect(b1).toContain('accepted');
    expect(b1).toContain('-0.0150 to +0.0150 in');
    expect(b1).toContain('Setting 1');
    const b2 = await table.getByRole('row', { name: /^B2 / }).textContent();
    expect(b2).toContain('too wide');
    expect(b2).not.toContain('accepted');
    expect(b2).toContain('+0.0150 in only');
    const b3 = await table.getByRole('row', { name: /^B3 / }).textContent();
    expect(b3).toContain('too wide');
    expect(b3).toContain('clamp above carrier — collision risk');
    expect(b3).toContain('cannot be used on this rail');
    expect(b3).toContain('none within ±0.0150 in');

    const unusable = await page.getByRole('list', { name: 'Bars that cannot be used on this rail' }).textContent();
    expect(unusable).toContain('B3');
    expect(unusable).not.toContain('B1');

    // The caution, with the inputs it was worked out from.
    const caution = page.getByRole('status').filter({ hasText: 'Advice, not a go-ahead' });
    const cautionText = await caution.textContent();
    expect(cautionText).toContain('Check every clamp by hand before cycle start');
    expect(cautionText).toContain("follow the machine builder's instructions");
    expect(cautionText).toContain('carrier 0.2500 in');

    // The chart says the same in its description (the marks carry labels as well as colors).
    const chart = page.getByRole('img', { name: /Measured bar widths against the window of each rail setting/ });
    expect(await chart.locator('desc').textContent()).toContain('Setting 1 (shift +0.0150 in, window 0.9850 to 1.0450 in): B1 1.0000 in, B2 1.0450 in.');

    // Changing an input marks the answer as out of date (the summary and the bar table both) rather than leaving it looking current.
    expect(await page.getByText('The inputs changed after this check').count()).toBe(0);
    await page.getByLabel('Minimum bite').fill('0.2');
    await page.getByText('The inputs changed after this check').first().waitFor();
    expect(await page.getByText('The inputs changed after this check').count()).toBe(2);
    await page.close();
  });

  it('bars typed by keyboard: Enter moves down a row and adds one at the end', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'operator');
    await openWithRail(page);
    await page.getByLabel('Carrier thickness').fill('0.25');
    await page.getByLabel('Tool clearance').fill('0.03');
    await page.getByLabel('Minimum bite').fill('0.06');
    await page.getByLabel('Row 1 width').fill('1.010');
    await page.keyboard.press('Enter');
    expect(await page.evaluate(() => document.activeElement?.getAttribute('aria-label'))).toBe('Row 2 width');
    await page.keyboard.type('0.990');
    // Row 3 exists already; Enter from it makes row 4 and lands in its width cell.
    await page.getByLabel('Row 3 width').focus();
    await page.keyboard.press('Enter');
    expect(await page.evaluate(() => document.activeElement?.getAttribute('aria-label'))).toBe('Row 4 width');
    expect(await page.getByLabel('Row 4 id').inputValue()).toBe('B4');
    for (const row of [1, 2]) {
      await page.getByLabel(`Row ${row} thickness`).fill('0.5');
      await page.getByLabel(`Row ${row} corner radius`).fill('0.02');
    }
    // Rows 3 and 4 hold no sizes and their ids are the table's own, so they are not bars.
    await page.getByRole('button', { name: 'Check the bars' }).click();
    await page.getByRole('list', { name: 'Sorting list' }).waitFor();
    // d = +0.010 and −0.010: both within ±0.03, so both accepted at shift 0 and served by one setting.
    const table = page.getByRole('table', { name: 'Stock check, bar by bar' });
    expect(await table.getByRole('row').count()).toBe(3); // header + B1 + B2
    expect(await table.getByRole('row', { name: /^B1 / }).textContent()).toContain('accepted');
    expect(await table.getByRole('row', { name: /^B2 / }).textContent()).toContain('accepted');
    expect(await page.getByTestId('setting-line').count()).toBe(1);
    await page.close();
  });
});
