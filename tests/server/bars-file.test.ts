import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import { parseBarsPaste } from '../../app/features/stock-check/parse-bars';
import { makeTestApp, type Agent, type TestApp } from './test-app';

let t: TestApp;
let operator: Agent;
beforeAll(async () => { t = await makeTestApp(); operator = await t.agent('operator'); });
afterAll(async () => { await t.close(); });

const send = (body: Buffer, name: string) => operator.http.post('/api/stock-check/bars-file').set('X-CSRF-Token', operator.token).attach('file', body, name);

describe('POST /api/stock-check/bars-file', () => {
  it('turns the first sheet of an XLSX (written here with exceljs) into text the paste reader takes, formulas by their cached value', async () => {
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet('Bars');
    ws.addRow(['id', 'width (in)', 'thickness (in)', 'corner radius (in)']);
    ws.addRow(['B1', 1.002, 0.5, 0.02]);
    ws.addRow(['B2', { formula: 'B2+0.04', result: 1.042 }, 0.498, 0.045]);
    const res = await send(Buffer.from(await wb.xlsx.writeBuffer()), 'bars.xlsx').expect(200);
    expect(res.body.sheet).toBe('Bars');
    const read = parseBarsPaste(res.body.text, 'in');
    expect(read.ok).toBe(true);
    if (read.ok) expect(read.rows.map((r) => [r.bar.id, r.bar.width, r.bar.thickness, r.bar.cornerRadius])).toEqual([['B1', 1.002, 0.5, 0.02], ['B2', 1.042, 0.498, 0.045]]);
  });

  it('passes CSV through, and names the row and column of a bad cell', async () => {
    const res = await send(Buffer.from('id,width,thickness,corner radius\nB1,1.0,0.5,0.02\nB2,1.0,abc,0.02\n'), 'bars.csv').expect(200);
    const read = parseBarsPaste(res.body.text, 'in');
    expect(read.ok).toBe(false);
    if (!read.ok) expect(read.problems[0]!.message).toMatch(/row 3, column C/);
    expect((await send(Buffer.from([0, 1, 2, 3]), 'x.bin')).status).toBe(400);
  });
});
