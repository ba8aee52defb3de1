/**
 * Every spreadsheet route behind one guard (server/manifest/xlsx-guard.ts): workbooks that
 * openpyxl, LibreOffice and exceljs wrote all read (comment parts included), and crafted ones are
 * a 400 with a sentence. Expected values come from facts.json (read by openpyxl, an independent
 * reader) or are computed here from the cell reference grammar of ECMA-376 Part 1, §18.3.1.55.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import JSZip from 'jszip';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseBarsPaste } from '../../app/features/stock-check/parse-bars';
import { readWorkbookGrids } from '../../server/manifest/read-manifest';
import { makeTestApp, tableCounts, type Agent, type TestApp } from './test-app';

const FIXTURES = join(import.meta.dirname, '../fixtures');
const facts = JSON.parse(readFileSync(join(FIXTURES, 'facts.json'), 'utf8')) as Record<string, { rows: (string | number)[][]; comments?: Record<string, string> }>;
const fixture = (f: string) => readFileSync(join(FIXTURES, f));

let t: TestApp;
let lead: Agent;
beforeAll(async () => { t = await makeTestApp(); lead = await t.agent('lead'); });
afterAll(async () => { await t.close(); });

const upload = (url: string, body: Buffer, name = 'file.xlsx') => lead.http.post(url).set('X-CSRF-Token', lead.token).attach('file', body, name);

/** A workbook with one sheet XML edit, re-packed with jszip. */
async function withSheet(buf: Buffer, edit: (xml: string) => string): Promise<Buffer> {
  const zip = await JSZip.loadAsync(buf);
  const name = Object.keys(zip.files).find((n) => /^xl\/worksheets\/sheet1\.xml$/.test(n))!;
  zip.file(name, edit(await zip.file(name)!.async('string')));
  return zip.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE' });
}

describe('workbooks other programs wrote', () => {
  it('openpyxl with cell comments: the rows read equal what openpyxl reads (facts.json), the comment parts left out', async () => {
    const file = 'xlsx/components-openpyxl-comments.xlsx';
    // The file holds the parts exceljs 4.4 cannot read (facts.json note): check they are there.
    const zip = await JSZip.loadAsync(fixture(file));
    expect(Object.keys(zip.files)).toEqual(expect.arrayContaining(['xl/comments/comment1.xml', 'xl/drawings/commentsDrawing1.vml']));
    const r = await readWorkbookGrids(fixture(file));
    if (!r.ok) throw new Error(r.error.message);
    const grid = r.grids[0]!;
    const rows = facts[file]!.rows.map((_, i) => [1, 2, 3, 4, 5, 6].map((c) => {
      const v = grid.rows.get(i + 1)?.get(c);
      return v?.t === 'text' ? v.text : v?.t === 'number' ? v.value : null;
    }));
    expect(rows).toEqual(facts[file]!.rows);
  });

  it('openpyxl with cell comments on the manifest preview route: an answer, not a library message', async () => {
    const res = await upload('/api/manifest/preview', fixture('xlsx/components-openpyxl-comments.xlsx'));
    expect(res.status).toBe(200);
    expect(JSON.stringify(res.body)).not.toMatch(/reading 'comments'/);
  });

  it('openpyxl bars with a comment, on the bars-file route: the bars openpyxl reads (facts.json)', async () => {
    const file = 'xlsx/bars-openpyxl-comments.xlsx';
    const res = await upload('/api/stock-check/bars-file', fixture(file)).expect(200);
    const read = parseBarsPaste(res.body.text, 'in');
    if (!read.ok) throw new Error(JSON.stringify(read.problems));
    expect(read.rows.map((r) => [r.bar.id, r.bar.width, r.bar.thickness, r.bar.cornerRadius])).toEqual(facts[file]!.rows.slice(1));
  });

  it('LibreOffice Calc 7.4 and exceljs (with a note, written as a legacy comment, and a picture) both read', async () => {
    const lo = await upload('/api/manifest/preview', fixture('xlsx/components-libreoffice.xlsx'));
    expect(lo.status).toBe(200);
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet('Bars');
    ws.addRow(['id', 'width', 'thickness', 'corner radius']);
    ws.addRow(['B7', 0.75, 0.5, 0.01]);
    ws.getCell('A2').note = 'from the saw';
    // A 1 × 1 PNG (PNG spec, ISO/IEC 15948: signature, IHDR, IDAT, IEND), placed as a picture.
    const png = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==', 'base64');
    ws.addImage(wb.addImage({ buffer: png as never, extension: 'png' }), 'F2:G4');
    const buf = Buffer.from(await wb.xlsx.writeBuffer());
    const parts = Object.keys((await JSZip.loadAsync(buf)).files);
    expect(parts.some((n) => /comments/.test(n))).toBe(true);
    expect(parts.some((n) => /^xl\/drawings\/drawing\d+\.xml$/.test(n))).toBe(true);
    const res = await upload('/api/stock-check/bars-file', buf).expect(200);
    expect(res.body.text.split('\n')[1]).toBe('B7\t0.75\t0.5\t0.01');
  });
});

describe('crafted workbooks are a 400 with a sentence, and write nothing', () => {
  const counts = () => tableCounts(t.db, ['components', 'plates', 'audit']);

  it('a merge of A1:XFD1048576 (1,544 bytes) on the manifest routes and the bars-file route', async () => {
    const merged = await withSheet(fixture('xlsx/components-libreoffice.xlsx'), (x) => x.replace(/<\/sheetData>/, '</sheetData><mergeCells count="1"><mergeCell ref="A1:XFD1048576"/></mergeCells>'));
    // Columns A..XFD are 1..16,384 and rows 1..1,048,576 (ECMA-376 Part 1, §18.3.1.55 ref; Excel's sheet size).
    const area = 16_384 * 1_048_576;
    expect(area).toBeGreaterThan(100_000);
    const before = await counts();
    // The preview lists a file's problems in its answer (server/manifest/FORMAT.md); commit and bars-file refuse.
    const preview = await upload('/api/manifest/preview', merged).expect(200);
    expect(preview.body.errors[0]).toMatchObject({ code: 'too-many-merged', message: expect.stringMatching(/Merged ranges cover more than 100,000 cells/) });
    for (const url of ['/api/manifest/commit', '/api/stock-check/bars-file']) {
      const res = await upload(url, merged);
      expect(res.status, url).toBe(400);
      expect(res.body.error.message, url).toMatch(/Merged ranges cover more than 100,000 cells/);
    }
    expect(await counts()).toEqual(before);
  });

  it('more merged ranges than a sheet may have', async () => {
    const many = await withSheet(fixture('xlsx/components-libreoffice.xlsx'), (x) => x.replace(/<\/sheetData>/, `</sheetData><mergeCells count="1001">${Array.from({ length: 1001 }, (_, i) => `<mergeCell ref="H${i + 10}:I${i + 10}"/>`).join('')}</mergeCells>`));
    const res = await upload('/api/stock-check/bars-file', many);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/more than 1,000 merged ranges/);
  });

  it('a central directory that points past the end of the file (APPNOTE §4.3.16 offset field): a sentence, not a RangeError', async () => {
    const b = Buffer.from(fixture('xlsx/components-libreoffice.xlsx'));
    // End of central directory: the offset of the directory is at bytes 16..19 of the 22-byte record.
    b.writeUInt32LE(0x7fffffff, b.length - 22 + 16);
    const preview = await upload('/api/manifest/preview', b).expect(200);
    expect(preview.body.errors[0].code).toBe('damaged');
    for (const url of ['/api/manifest/commit', '/api/stock-check/bars-file']) {
      const res = await upload(url, b);
      expect(res.status, url).toBe(400);
      expect(res.body.error.message, url).toMatch(/The file is damaged: .+ save it again as .xlsx/);
      expect(JSON.stringify(res.body)).not.toMatch(/RangeError|out of range/);
    }
  });

  it('a bars workbook of more rows than a stock check takes', async () => {
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet('Bars');
    ws.addRow(['id', 'width', 'thickness', 'corner radius']);
    for (let i = 0; i < 10_001; i++) ws.addRow([`B${i}`, 1, 0.5, 0.01]);
    const res = await upload('/api/stock-check/bars-file', Buffer.from(await wb.xlsx.writeBuffer()));
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/10,000/);
  });
});
