import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { projectRoot } from '../../scripts/build-client';
import type { Outline } from '../../shared/schemas/geometry';
import { startE2E, type E2E } from './browser';

// samples/jaw-rail-inch.dxf (scripts/make-samples.ts): Ø0.500 in dowel holes at (1, 0.75) and
// (11, 0.75), four Ø0.531 in bolt holes, layers "fx jr 1000", DOWELS, BOLTS and a text on NOTES.
const SAMPLE = path.join(projectRoot, 'samples', 'jaw-rail-inch.dxf');

let e2e: E2E;
beforeAll(async () => { e2e = await startE2E(); });
afterAll(async () => { await e2e?.close(); });

async function storedComponent(code: string) {
  const row = await e2e.db('components').where({ code }).first();
  return { outline: row.outline ? (JSON.parse(row.outline) as Outline) : null, outlineFile: row.outline_file ? JSON.parse(row.outline_file) : null, dowels: JSON.parse(row.dowels) as { x: number; y: number }[] };
}

describe('outline from a drawing, in a real browser', () => {
  it('a lead reads the jaw rail drawing, picks the primary dowel, maps the layers and stores the outline', async () => {
    const before = await storedComponent('JR-1.000');
    expect(before.outlineFile).toBeNull(); // the demo seed enters this outline by hand
    const { id } = await e2e.db('components').where({ code: 'JR-1.000' }).first('id');

    const page = await e2e.newPage();
    await e2e.signIn(page, 'lead');
    await page.goto(`${e2e.baseUrl}/catalog/components/${id}`);
    await page.getByRole('heading', { name: 'Outline from a drawing' }).waitFor();
    // Every request that carries a body, to see the drawing leave the browser once.
    const sent: { url: string; type: string; bytes: number; json: unknown }[] = [];
    page.on('request', (r) => {
      if (r.method() !== 'POST') return;
      const type = r.headers()['content-type'] ?? '';
      sent.push({ url: new URL(r.url()).pathname, type, bytes: r.postDataBuffer()?.length ?? 0, json: type.startsWith('application/json') ? r.postDataJSON() : null });
    });
    await page.getByLabel('Choose a DXF file').setInputFiles(SAMPLE);

    // The preview, the unit the file says, and every layer with a show/hide checkbox.
    await page.getByRole('img', { name: 'Preview of jaw-rail-inch.dxf, seen from above' }).waitFor();
    expect(await page.getByText('the file says').textContent()).toContain('the file says inches (in) ($INSUNITS 1)');
    for (const layer of ['fx jr 1000', 'DOWELS', 'BOLTS', 'NOTES']) expect(await page.getByLabel(`Show layer ${layer}`).isChecked()).toBe(true);
    const preview = page.getByRole('img', { name: /^Preview of/ });
    expect(await preview.locator('path[data-layer="BOLTS"]').count()).toBe(1);
    await page.getByLabel('Show layer BOLTS').uncheck();
    await expect.poll(() => preview.locator('path[data-layer="BOLTS"]').count()).toBe(0);
    await page.getByLabel('Show layer BOLTS').check();

    // Two Ø0.5000 in circles, the plate's dowel-hole size, offered as the dowels.
    const dowel1 = page.getByRole('checkbox', { name: 'Dowel at (1.0000 in, 0.7500 in)', exact: true });
    const dowel11 = page.getByRole('checkbox', { name: 'Dowel at (11.0000 in, 0.7500 in)', exact: true });
    expect(await dowel1.isChecked()).toBe(true);
    expect(await dowel11.isChecked()).toBe(true);
    expect(await page.getByRole('checkbox', { name: /^Dowel at/ }).count()).toBe(2);
    expect(await page.getByRole('checkbox', { name: /^Stop at/ }).count()).toBe(4); // the bolt holes

    // The other dowel's local position follows the primary: −10 from x = 11, +10 from x = 1.
    await page.getByRole('radio', { name: 'Primary dowel at (11.0000 in, 0.7500 in)' }).check();
    await expect.poll(() => page.getByTestId('circle-0').textContent()).toContain('-10.0000 in');
    await page.getByRole('radio', { name: 'Primary dowel at (1.0000 in, 0.7500 in)' }).check();
    await expect.poll(() => page.getByTestId('circle-1').textContent()).toContain('10.0000 in');
    expect(await page.getByTestId('circle-1').textContent()).not.toContain('-10.0000 in');

    // The server proposed a conforming name for "fx jr 1000"; the other two need one typed.
    expect(await page.getByLabel('Conforming name for layer fx jr 1000').inputValue()).toBe('FX-JR-1000');
    await page.getByLabel('Conforming name for layer DOWELS').fill('jaw dowels');
    await page.getByLabel('Conforming name for layer BOLTS').fill('FX-JR-1000');
    await page.getByRole('button', { name: 'Use this outline' }).click();
    // Refused where the user typed it, and nothing was stored.
    const refusal = page.getByRole('row', { name: /DOWELS/ }).getByRole('alert');
    await refusal.waitFor();
    expect(await refusal.textContent()).toContain('must be written in capitals');
    expect((await storedComponent('JR-1.000')).outlineFile).toBeNull();

    await page.getByLabel('Conforming name for layer DOWELS').fill('FX-JR-1000');
    await page.getByRole('button', { name: 'Use this outline' }).click();
    await page.getByText('Outline of JR-1.000 stored from jaw-rail-inch.dxf').waitFor();

    const after = await storedComponent('JR-1.000');
    const sha256 = createHash('sha256').update(readFileSync(SAMPLE)).digest('hex');
    // The file went up once, to be read; both attempts to store named it by its SHA-256 in a small JSON body.
    const uploads = sent.filter((r) => r.type.startsWith('multipart/form-data'));
    expect(uploads.map((r) => r.url)).toEqual(['/api/dxf/inspect']);
    const stores = sent.filter((r) => r.url === `/api/components/${id}/outline/from-inspection`);
    expect(stores).toHaveLength(2);
    for (const r of stores) {
      expect(r.json).toMatchObject({ sha256, name: 'jaw-rail-inch.dxf', datumX: 1, datumY: 0.75 });
      expect(r.bytes).toBeLessThan(readFileSync(SAMPLE).length);
    }
    expect(after.outlineFile).toMatchObject({ name: 'jaw-rail-inch.dxf', sha256, unit: 'in' });
    // Origin at the primary dowel: the dowel holes (r 0.25 in) at (0, 0) and (10, 0).
    const dowelHoles = after.outline!.circles.filter((c) => Math.abs(c.r - 0.25) < 1e-9);
    expect(dowelHoles).toHaveLength(2);
    expect(Math.abs(dowelHoles[0]!.x)).toBeLessThan(1e-9);
    expect(Math.abs(dowelHoles[0]!.y)).toBeLessThan(1e-9);
    expect(dowelHoles[1]!.x).toBeCloseTo(10, 9);
    expect(dowelHoles[1]!.y).toBeCloseTo(0, 9);
    expect(new Set([...after.outline!.paths, ...after.outline!.circles].map((x) => x.layer))).toEqual(new Set(['FX-JR-1000']));
    // The stored outline and its file are on the page.
    await expect.poll(() => page.getByTestId('outline-file').textContent()).toContain(sha256);
    // The file as uploaded comes back from the file store, byte for byte (SHA-256, FIPS 180-4, by node:crypto).
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download the file' }).click()]);
    expect(createHash('sha256').update(readFileSync((await download.path())!)).digest('hex')).toBe(sha256);

    // The outline route leaves the dowels alone (the seed has them 8.000 apart) until asked.
    expect(after.dowels).toEqual([{ x: 0, y: 0 }, { x: 8, y: 0 }]);
    await page.getByRole('button', { name: 'Also set the dowels to the ticked circles' }).click();
    await page.getByText('Dowels set').waitFor();
    expect((await storedComponent('JR-1.000')).dowels).toEqual([{ x: 0, y: 0 }, { x: 10, y: 0 }]);
    // The form above reloaded from the stored component, so saving it keeps the new dowels.
    expect(await page.getByLabel('Locating dowels 2 X').inputValue()).toBe('10');
    await page.close();
  });

  it('an operator sees the outline but no import', async () => {
    const { id } = await e2e.db('components').where({ code: 'CR-8' }).first('id');
    const page = await e2e.newPage();
    await e2e.signIn(page, 'operator');
    await page.goto(`${e2e.baseUrl}/catalog/components/${id}`);
    await page.getByRole('img', { name: /Outline of CR-8/ }).waitFor();
    expect(await page.getByRole('heading', { name: 'Outline from a drawing' }).count()).toBe(0);
    expect(await page.getByLabel('Choose a DXF file').count()).toBe(0);
    await page.close();
  });
});
