import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import ExcelJS from 'exceljs';
import { apiJson, elementsWiderThanScreen, startE2E, type E2E } from './browser';

let e2e: E2E;
beforeAll(async () => { e2e = await startE2E(); });
afterAll(async () => { await e2e?.close(); });

/** A JSON call with the page's own session and CSRF token; the answer's body. */
const call = (page: Page, method: 'GET' | 'POST' | 'PUT', url: string, data?: object) => apiJson(page, e2e.baseUrl, method, url, data);

/** Elements whose box is wider than the viewport or reaches past its right edge (the page would scroll sideways). */

// Rail set B of the demo template moved one grid hole in +X: every one of its stations' X grows by the
// plate pitch (grid hole (i, j) sits at (i·pitch, j·pitch), PRODUCT.md) and nothing else changes.
describe('home, comparison and sign-off in a real browser', () => {
  it('lists a version waiting for the reviewer, opens its comparison with every station value before → after, and a change request reaches the author\'s home', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'programmer');
    const v1 = await call(page, 'GET', '/api/templates/1/versions/1');
    const draft = await call(page, 'POST', '/api/templates/1/versions', { from: 1 });
    const placements = draft.placements.map((p: { id: string; hole: { col: number; row: number } }) => (p.id === 'B-CR' || p.id === 'B-JR' ? { ...p, hole: { ...p.hole, col: p.hole.col + 1 } } : p));
    await call(page, 'PUT', `/api/templates/1/versions/${draft.version}`, { revision: draft.revision, placements, sharedOffset: draft.sharedOffset, numbering: draft.numbering });
    await call(page, 'POST', `/api/templates/1/versions/${draft.version}/submit`);
    const n = draft.version as number;

    // The author sees the comparison but no sign-off: the author may not approve (README, Roles).
    await page.goto(`${e2e.baseUrl}/templates/1/compare?from=1&to=${n}`);
    await page.getByRole('heading', { name: `Sign off v${n}` }).waitFor();
    expect(await page.getByRole('button', { name: 'Approve and release' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Request changes' }).count()).toBe(0);

    await e2e.signIn(page, 'reviewer');
    const waiting = page.getByRole('region', { name: /Waiting for your review/ });
    const link = waiting.getByRole('link', { name: `Compare Bracket 1 in bar, 20 up v1 → v${n}` });
    await link.waitFor();
    await link.click();
    await page.waitForURL(`**/templates/1/compare?from=1&to=${n}`);

    // Before → after of every moved station, worked out here from v1's stations and the plate pitch (4 decimals in inches).
    const railB = (v1.stations as { id: string; number: number; x: number; placement: string }[]).filter((s) => s.placement === 'B-CR');
    const pitch = v1.plate.pitch as number;
    const lines = page.getByTestId('station-value');
    await lines.first().waitFor();
    const texts = (await lines.allInnerTexts()).map((t) => t.replace(/\s+/g, ' ').trim());
    expect(texts).toEqual(railB.map((s) => `X ${s.x.toFixed(4)} in ${(s.x + pitch).toFixed(4)} in at station ${s.number} ${s.id}`));

    // Sign-off on the comparison itself: request changes with a comment.
    const comment = 'Rail B moved one hole; put it back or explain why.';
    await page.getByLabel('Comment').fill(comment);
    await page.getByRole('button', { name: 'Request changes' }).click();
    await page.getByText('sent back with changes requested').waitFor();
    expect((await e2e.db('template_versions').where({ template_id: 1, number: n }).first()).state).toBe('draft');
    // The comparison now says so too, in words and with its own mark.
    await page.getByRole('status', { name: `Changes requested on v${n}` }).waitFor();

    await e2e.signIn(page, 'programmer');
    const drafts = page.getByRole('region', { name: /Your drafts/ });
    await drafts.getByText(comment).waitFor();
    const mark = drafts.locator('[data-status="changes-requested"]');
    expect(await mark.innerText()).toBe('changes requested');
    expect(await mark.locator('svg').count()).toBe(1);
    expect(await drafts.getByRole('link', { name: `Bracket 1 in bar, 20 up v${n}` }).getAttribute('href')).toBe(`/templates/1/versions/${n}`);
    // The Reviews page and the version page show the same mark, never a plain draft.
    await page.goto(`${e2e.baseUrl}/reviews`);
    await page.getByRole('region', { name: /Sent back with changes requested/ }).getByText(comment).waitFor();
    await page.goto(`${e2e.baseUrl}/templates/1/versions/${n}`);
    await page.getByRole('status', { name: `Changes requested on v${n}` }).getByText(comment).waitFor();
    expect(await page.locator('main [data-status="changes-requested"]').count()).toBeGreaterThan(0);
    await page.close();
  });

  it('keeps home and comparison within a 390 × 844 phone screen', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'reviewer');
    await page.setViewportSize({ width: 390, height: 844 });
    const n = (await e2e.db('template_versions').where({ template_id: 1 }).max({ n: 'number' }).first())!.n as number;
    for (const [role, url] of [['reviewer', '/'], ['reviewer', `/templates/1/compare?from=1&to=${n}`], ['programmer', '/'], ['lead', '/']] as const) {
      await e2e.signIn(page, role);
      await page.goto(`${e2e.baseUrl}${url}`, { waitUntil: 'networkidle' });
      await page.getByRole('heading', { level: 1 }).waitFor();
      expect(await elementsWiderThanScreen(page), `${role} ${url}`).toEqual([]);
    }
    await page.close();
  });

  it('asks before changing a role, changes nothing on cancel, and says saved after', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'admin');
    await page.goto(`${e2e.baseUrl}/admin/users`);
    const select = page.getByLabel('Role of operator@gridset.test');
    await select.selectOption('reviewer');
    const dialog = page.getByRole('dialog', { name: /Change the role of/ });
    await dialog.waitFor();
    expect((await e2e.db('users').where({ email: 'operator@gridset.test' }).first()).role).toBe('operator');
    await dialog.getByRole('button', { name: 'Cancel' }).click();
    await dialog.waitFor({ state: 'hidden' });
    expect(await select.inputValue()).toBe('operator');
    expect((await e2e.db('users').where({ email: 'operator@gridset.test' }).first()).role).toBe('operator');

    await select.selectOption('reviewer');
    await dialog.getByRole('button', { name: 'Make reviewer' }).click();
    await page.getByRole('status').filter({ hasText: /Saved: .* is now reviewer\./ }).waitFor();
    expect((await e2e.db('users').where({ email: 'operator@gridset.test' }).first()).role).toBe('reviewer');
    await page.close();
  });

  it('setup sheet on screen: sign-off lines to fill in, and the footer after the tables, never over them', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'operator');
    await page.goto(`${e2e.baseUrl}/api/jobs/1/setup-sheet.html`);
    const signOff = page.getByRole('table', { name: 'Sign-off' });
    for (const who of ['Prepared by', 'Checked by']) await signOff.getByRole('rowheader', { name: who }).waitFor();
    expect(await signOff.getByRole('rowheader', { name: 'Date' }).count()).toBe(2);
    // A footer pinned to the window would sit over whatever table scrolls under it; it must come after the last one.
    const below = await page.evaluate(() => {
      const f = document.querySelector('footer')!.getBoundingClientRect();
      return Array.from(document.querySelectorAll('table')).every((t) => t.getBoundingClientRect().bottom <= f.top);
    });
    expect(below).toBe(true);
    await page.close();
  });

  it('manifest preview says old → new for a changed cell, and after the import the preview and its button leave', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'lead');
    // The catalog's own workbook, edited with exceljs (a second writer): one component renamed.
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load((await (await page.request.get(`${e2e.baseUrl}/api/manifest.xlsx`)).body()) as never);
    const ws = wb.getWorksheet('Components')!;
    const header = (ws.getRow(1).values as unknown[]).map((v) => String(v ?? '').toLowerCase());
    const nameCell = ws.getRow(2).getCell(header.indexOf('name'));
    const code = String(ws.getRow(2).getCell(header.indexOf('code')).value);
    const before = String(nameCell.value);
    nameCell.value = `${before} (relabelled)`;
    const edited = Buffer.from(await wb.xlsx.writeBuffer());

    await page.goto(`${e2e.baseUrl}/catalog/components`);
    await page.getByLabel(/Bring back an edited manifest/).setInputFiles({ name: 'manifest.xlsx', mimeType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet', buffer: edited });
    const preview = page.getByRole('table', { name: 'What the import will do' });
    const row = preview.getByRole('row').filter({ hasText: code });
    await row.waitFor();
    expect((await row.innerText()).replace(/\s+/g, ' ')).toContain(`name ${before} ${before} (relabelled)`);
    await page.getByRole('button', { name: 'Import 1 change' }).click();
    await page.getByText(/Imported 1 change from manifest\.xlsx/).waitFor();
    expect(await preview.count()).toBe(0);
    expect(await page.getByRole('button', { name: /^Import \d+ change/ }).count()).toBe(0);
    expect((await e2e.db('components').where({ code }).first()).name).toBe(`${before} (relabelled)`);
    await page.close();
  });
});
