import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import { ManifestAnswerSchema } from '../../shared/schemas/manifest';
import { makeTestApp, tableCounts, type Agent, type TestApp, bodyBytes } from './test-app';

let t: TestApp;
let lead: Agent;
// Each test starts from a fresh demo shop (9 components): the counts below hold in any order.
beforeEach(async () => { t = await makeTestApp(); lead = await t.agent('lead'); });
afterEach(async () => { await t.close(); });

const upload = (url: string, body: Buffer, name = 'manifest.xlsx') => lead.http.post(url).set('X-CSRF-Token', lead.token).attach('file', body, name);

describe('manifest routes', () => {
  it('round trip: exporting the catalog and previewing the file unchanged reports every row as "same"', async () => {
    const file = (await bodyBytes(lead.get('/api/manifest.xlsx')).expect(200)).body as Buffer;
    const preview = await upload('/api/manifest/preview', file).expect(200);
    expect(preview.body.errors).toEqual([]);
    const rows = preview.body.changes.filter((c: { sheet: string }) => c.sheet === 'Components');
    expect(rows).toHaveLength(9);
    expect(rows.every((c: { action: string }) => c.action === 'same')).toBe(true);
  });

  it('previews a changed and an added row (read back and edited with exceljs, a second writer) and commits them in one transaction', async () => {
    const file = (await bodyBytes(lead.get('/api/manifest.xlsx')).expect(200)).body as Buffer;
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(file as never);
    const ws = wb.getWorksheet('Components')!;
    const header = (ws.getRow(1).values as unknown[]).map((v) => String(v ?? '').toLowerCase());
    const col = (name: string) => header.indexOf(name);
    // Row 2 is the first component by code (CR-8): rename it; then add a new rail under a conforming code.
    ws.getRow(2).getCell(col('name')).value = 'Center rail, eight stops (renamed)';
    const added = ws.addRow([]);
    ws.getRow(2).eachCell({ includeEmpty: true }, (cell, n) => { added.getCell(n).value = cell.value; });
    added.getCell(col('code')).value = 'CR-10';
    added.getCell(col('layer')).value = 'FX-CR-10';
    // A component's layer must be on the Layers sheet too.
    wb.getWorksheet('Layers')!.addRow(['FX-CR-10', 'outline of CR-10', 5]);
    const edited = Buffer.from(await wb.xlsx.writeBuffer());
    const preview = (await upload('/api/manifest/preview', edited).expect(200)).body;
    // The answer is what the shared schema the client parses with describes, field for field.
    expect(ManifestAnswerSchema.parse(preview)).toEqual(preview);
    expect(preview.counts).toEqual({ add: 1, change: 1, same: 8 });
    const byCode = Object.fromEntries(preview.changes.map((c: { code: string }) => [c.code, c]));
    expect(byCode['CR-8']).toMatchObject({ action: 'change', fields: ['name'] });
    expect(byCode['CR-10']).toMatchObject({ action: 'add' });
    expect(await tableCounts(t.db, ['components'])).toEqual({ components: 9 }); // preview writes nothing
    await upload('/api/manifest/commit', edited).expect(200);
    expect(await tableCounts(t.db, ['components'])).toEqual({ components: 10 });
    expect((await t.db('components').where({ code: 'CR-8' }).first()).name).toBe('Center rail, eight stops (renamed)');
  });

  it('refuses a manifest with errors at their cells and writes nothing', async () => {
    const file = (await bodyBytes(lead.get('/api/manifest.xlsx')).expect(200)).body as Buffer;
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(file as never);
    const ws = wb.getWorksheet('Components')!;
    const header = (ws.getRow(1).values as unknown[]).map((v) => String(v ?? '').toLowerCase());
    ws.getRow(3).getCell(header.indexOf('code')).value = 'BAD CODE';
    ws.getRow(4).getCell(header.indexOf('name')).value = 'renamed, but the file has an error elsewhere';
    const bad = Buffer.from(await wb.xlsx.writeBuffer());
    const before = await t.db('components').select('code', 'name').orderBy('id');
    const res = await upload('/api/manifest/commit', bad);
    expect(res.status).toBe(400);
    expect(ManifestAnswerSchema.pick({ errors: true, changes: true }).parse(res.body.error.details)).toEqual(res.body.error.details);
    const err = res.body.error.details.errors.find((e: { row: number }) => e.row === 3);
    expect(err).toMatchObject({ sheet: 'Components', row: 3, column: 'A' });
    expect(await t.db('components').select('code', 'name').orderBy('id')).toEqual(before);
    const notXlsx = await upload('/api/manifest/preview', Buffer.from([0, 1, 2, 3, 4, 5]), 'x.xlsx');
    expect(notXlsx.status).toBe(400);
  });

  it('adds a Stations sheet for a template version', async () => {
    const file = (await bodyBytes(lead.get('/api/templates/1/versions/1/manifest.xlsx')).expect(200)).body as Buffer;
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(file as never);
    expect(wb.worksheets.map((w) => w.name)).toEqual(expect.arrayContaining(['Components', 'Layers', 'Stations']));
    expect(wb.getWorksheet('Stations')!.rowCount).toBe(21);
  });
});
