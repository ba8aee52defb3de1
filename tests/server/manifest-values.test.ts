import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import { ManifestAnswerSchema } from '../../shared/schemas/manifest';
import { makeTestApp, type Agent, type TestApp, bodyBytes } from './test-app';

let t: TestApp;
let lead: Agent;
beforeAll(async () => { t = await makeTestApp(); lead = await t.agent('lead'); });
afterAll(async () => { await t.close(); });

const upload = (url: string, body: Buffer) => lead.http.post(url).set('X-CSRF-Token', lead.token).attach('file', body, 'manifest.xlsx');

describe('manifest preview: old → new for every changed field', () => {
  it('says each changed cell as the workbook held it before and as it holds it now (edited with exceljs, a second writer)', async () => {
    const file = (await bodyBytes(lead.get('/api/manifest.xlsx')).expect(200)).body as Buffer;
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(file as never);
    const ws = wb.getWorksheet('Components')!;
    const header = (ws.getRow(1).values as unknown[]).map((v) => String(v ?? '').toLowerCase());
    const cell = (row: number, name: string) => ws.getRow(row).getCell(header.indexOf(name));
    // Find a row with a clamp model (an acceptAbove cell) to change one of its numbers too.
    let clampRow = 0;
    for (let r = 2; r <= ws.rowCount && !clampRow; r++) if (typeof cell(r, 'acceptabove').value === 'number') clampRow = r;
    expect(clampRow).toBeGreaterThan(0);
    const code = String(cell(clampRow, 'code').value);
    const oldName = String(cell(clampRow, 'name').value);
    const oldAbove = cell(clampRow, 'acceptabove').value as number;
    const oldNotes = String(cell(clampRow, 'notes').value ?? '');
    cell(clampRow, 'name').value = `${oldName} (edited)`;
    cell(clampRow, 'acceptabove').value = oldAbove + 0.01;
    cell(clampRow, 'notes').value = 'Checked on the surface plate.';
    const edited = Buffer.from(await wb.xlsx.writeBuffer());

    const preview = ManifestAnswerSchema.parse((await upload('/api/manifest/preview', edited).expect(200)).body);
    const row = preview.changes.find((c) => c.code === code)!;
    expect(row.action).toBe('change');
    expect(row.values).toEqual([
      { field: 'name', from: oldName, to: `${oldName} (edited)` },
      { field: 'clamp acceptAbove', from: String(oldAbove), to: String(oldAbove + 0.01) },
      { field: 'notes', from: oldNotes, to: 'Checked on the surface plate.' },
    ]);
    // Rows that did not change carry no values.
    expect(preview.changes.filter((c) => c.action === 'same').every((c) => c.values.length === 0)).toBe(true);
  });
});
