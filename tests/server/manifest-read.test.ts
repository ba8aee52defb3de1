import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import JSZip from 'jszip';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { readManifest, readManifestCsv, readWorkbookGrids } from '../../server/manifest/read-manifest';
import { catalogWorkbook } from '../../server/manifest/write-manifest';
import type { ManifestError, ManifestRead } from '../../server/manifest/manifest-types';
import { checkName } from '../../shared/naming/check-name';
import { DEFAULT_CONVENTION, DEMO_CONVENTION } from '../../shared/naming/conventions';
import { HEADERS, componentRow, handXlsx, sampleComponents, sampleLayers, type HandRow } from './manifest-helpers';

const FIXTURES = join(import.meta.dirname, '../fixtures');
const facts = JSON.parse(readFileSync(join(FIXTURES, 'facts.json'), 'utf8')) as Record<string, { note: string; rows: (string | number)[][] }>;

const where = (errors: readonly ManifestError[]) => errors.map((e) => `${e.sheet}!${e.column ?? '-'}${e.row ?? '-'} ${e.code}`);
const only = (r: ManifestRead) => {
  expect(r.errors).toHaveLength(1);
  return r.errors[0]!;
};

const GOOD = { code: 'CR-8', kind: 'center-rail', name: 'Center rail', unit: 'in', layer: 'FX-CR-8', dowels: '0,0; 8,0', stops: '0.5,0.375@0' } as const;
const components = (...rows: HandRow[]) => handXlsx([{ name: 'Components', rows: [HEADERS, ...rows] }]);

afterEach(() => { vi.restoreAllMocks(); });

// ---------- outside references ----------

describe('workbooks written by openpyxl and LibreOffice (tests/fixtures/xlsx, facts from an independent reader in facts.json)', () => {
  it.each(['xlsx/components-openpyxl.xlsx', 'xlsx/components-libreoffice.xlsx'])('%s: the cell values read equal facts.json', async (file) => {
    const r = await readWorkbookGrids(readFileSync(join(FIXTURES, file)));
    if (!r.ok) throw new Error(r.error.message);
    const grid = r.grids[0]!;
    const rows = facts[file]!.rows.map((_, i) =>
      [1, 2, 3, 4, 5, 6].map((c) => {
        const v = grid.rows.get(i + 1)?.get(c);
        return v?.t === 'text' ? v.text : v?.t === 'number' ? v.value : null;
      }),
    );
    expect(rows).toEqual(facts[file]!.rows);
  });

  it('openpyxl: formulas without saved values in G, the merged A6:C6, and the columns its layout lacks, each at its cell', async () => {
    // facts.json: "column G holds formulas with NO cached values (openpyxl writes none); A6:C6 merged";
    // its columns are code, kind, name, unit, layer, pitch (+ "pitch x 2"), so F and G sit where dowels and stops belong.
    const r = await readManifest(readFileSync(join(FIXTURES, 'xlsx/components-openpyxl.xlsx')));
    expect(where(r.errors)).toEqual([
      'Components!F1 header', 'Components!G1 header',
      ...['H', 'I', 'J', 'K', 'L', 'M', 'N', 'O', 'P', 'Q'].map((c) => `Components!${c}1 header`),
      'Components!G2 formula', 'Components!G3 formula', 'Components!G4 formula',
      'Components!A6 merged',
    ]);
    const msg = (ref: string) => r.errors.find((e) => `${e.column}${e.row}` === ref)!.message;
    expect(msg('F1')).toBe('Header F1 reads "pitch"; expected "dowels". Correct the header (case and spaces do not matter).');
    expect(msg('G1')).toBe('Header G1 reads "pitch x 2"; expected "stops". Correct the header (case and spaces do not matter).');
    expect(msg('H1')).toBe('Header H1 is empty; expected "jaw faces". Add the "jaw faces" column.');
    expect(msg('G3')).toBe('G3 holds the formula =F3*2 but no saved value (the program that wrote the file did not calculate it); replace the formula with its value.');
    expect(msg('A6')).toContain('Cells A6:C6 are merged');
    expect(r.components).toEqual([]);
    expect(r.columns.components).toEqual({ code: 'A', kind: 'B', name: 'C', unit: 'D', layer: 'E' });
  });

  it('LibreOffice: plain rows; the sheet named "components" is found regardless of case, and only the missing columns are reported', async () => {
    const r = await readManifest(readFileSync(join(FIXTURES, 'xlsx/components-libreoffice.xlsx')));
    expect(r.sheets.components).toBe('components');
    expect(where(r.errors)).toEqual(['components!F1 header', ...['G', 'H', 'I', 'J', 'K', 'L', 'M', 'N', 'O', 'P', 'Q'].map((c) => `components!${c}1 header`)]);
  });

  it('the fixtures under the demo convention: each naming problem is one error carrying checkName\'s message', async () => {
    const r = await readManifest(readFileSync(join(FIXTURES, 'xlsx/components-libreoffice.xlsx')), { convention: DEMO_CONVENTION });
    const naming = r.errors.filter((e) => e.code === 'naming');
    // Reference: checkName on the same names (shared/naming, tests/shared/naming-check.test.ts).
    const expected = [
      ['A', 3, 'JR-1', 'component'], ['E', 3, 'FX-JR-1', 'layer'], ['A', 4, 'SP-300', 'component'], ['E', 4, 'FX-SP-300', 'layer'],
    ] as const;
    const want = expected.flatMap(([col, row, name, target]) =>
      checkName(DEMO_CONVENTION[target], name, target).problems.map((p) => ({ column: col, row, tail: p.message })),
    );
    expect(want.length).toBeGreaterThan(4);
    expect(naming.map((e) => ({ column: e.column, row: e.row, tail: e.message.slice(e.message.indexOf('): ') + 3) }))).toEqual(want);
    expect(naming[0]!.message).toMatch(/^A3: the code breaks the naming convention \(version 1\): /);
  });
});

// ---------- a workbook written by hand ----------

describe('a minimal XLSX written by hand (jszip; inline strings, no styles, no shared strings)', () => {
  it('reads every column into catalog fields', async () => {
    const r = await readManifest(
      await components(
        componentRow({
          ...GOOD, stops: '0.5,0.375@0; 1.5,0.375,0.25@90#2', jawFaces: '0,0.375@90; 0,-0.375@270',
          acceptBelow: 0.03, acceptAbove: 0.03, topHeight: 0.16, topSlope: 0.5, gripLow: 0.04, gripHigh: 0.16, gripSlope: 0.5, slotSlop: 0.015, notes: 'hand made',
        }),
        componentRow({ code: 'ST-0.5', kind: ' Stop ', name: 'Dowel stop', unit: 'MM', dowels: '0,0' }),
      ),
    );
    expect(r.errors).toEqual([]);
    expect(r.components).toEqual([
      {
        row: 2,
        fields: {
          code: 'CR-8', kind: 'center-rail', name: 'Center rail', unit: 'in', layer: 'FX-CR-8',
          dowels: [{ x: 0, y: 0 }, { x: 8, y: 0 }],
          stops: [{ x: 0.5, y: 0.375, angle: 0 }, { x: 1.5, y: 0.375, z: 0.25, angle: 90, face: 1 }],
          jawFaces: [{ x: 0, y: 0.375, normal: 90 }, { x: 0, y: -0.375, normal: 270 }],
          clamp: { acceptBelow: 0.03, acceptAbove: 0.03, topHeight: 0.16, topSlope: 0.5, gripLow: 0.04, gripHigh: 0.16, gripSlope: 0.5, slotSlop: 0.015 },
          // No manifest column for these yet: the schema's defaults.
          outline: null, notes: 'hand made', seatHeight: 0, jawTop: null,
        },
      },
      // kind and unit are fixed values, read regardless of case and surrounding spaces.
      { row: 3, fields: { code: 'ST-0.5', kind: 'stop', name: 'Dowel stop', unit: 'mm', layer: '', dowels: [{ x: 0, y: 0 }], stops: [], jawFaces: [], clamp: null, outline: null, notes: '', seatHeight: 0, jawTop: null } },
    ]);
  });

  it('takes a formula\'s saved result (ECMA-376 Part 1, §18.3.1.96: <v> caches the value of <f>)', async () => {
    const r = await readManifest(await components(componentRow({ ...GOOD, name: { formula: '"Center "&"rail"', cached: 'Center rail' }, acceptBelow: { formula: '0.01*3', cached: 0.03 }, acceptAbove: 0.03, topHeight: 0.16, topSlope: 0.5, gripLow: 0.04, gripHigh: 0.16, gripSlope: 0.5, slotSlop: 0.015 })));
    expect(r.errors).toEqual([]);
    expect(r.components[0]!.fields.name).toBe('Center rail');
    expect(r.components[0]!.fields.clamp!.acceptBelow).toBe(0.03);
  });

  it('finds columns by header, regardless of case, spaces, "_" and "-", and ignores columns of its own', async () => {
    const header = { A: ' CODE ', B: 'Kind', C: 'Name', D: 'unit', E: 'Layer', F: 'Dowels', G: 'Stops', H: 'Jaw_Faces', I: 'accept below', J: 'ACCEPTABOVE', K: 'top height', L: 'topSlope', M: 'gripLow', N: 'grip-high', O: 'gripSlope', P: 'slotSlop', Q: 'our own column', R: 'notes' };
    const r = await readManifest(await handXlsx([{ name: 'Components', rows: [header, { A: 'CR-8', B: 'center-rail', C: 'Rail', D: 'in', F: '0,0', Q: 'ignored', R: 'a note' }] }]));
    expect(r.errors).toEqual([]);
    expect(r.components[0]!.fields.notes).toBe('a note');
    expect(r.columns.components).toMatchObject({ jawFaces: 'H', gripHigh: 'N', notes: 'R' });
  });
});

// ---------- refusals before exceljs ----------

describe('files refused before exceljs sees them', () => {
  const exceljsUntouched = () => vi.spyOn(ExcelJS.Workbook.prototype, 'xlsx', 'get');

  it.each([
    ['text (a CSV uploaded as XLSX)', Buffer.from('code,kind,name\nCR-8,center-rail,Rail\n'), /text \(it looks like CSV\)/],
    ['an Excel 97–2003 file (OLE2 signature D0 CF 11 E0 A1 B1 1A E1, MS-CFB §2.2)', Buffer.from('d0cf11e0a1b11ae1000000000000000000000000', 'hex'), /Excel 97–2003 workbook \(\.xls\)/],
    ['random bytes', Buffer.from([0x00, 0x01, 0x02, 0x03, 0xff, 0xfe]), /not an XLSX workbook \(an XLSX file is a ZIP archive starting with "PK"\)/],
    ['an empty file', Buffer.alloc(0), /not an XLSX workbook/],
  ])('%s: no ZIP signature "PK\\x03\\x04" (PKWARE APPNOTE §4.3.7)', async (_, bytes, message) => {
    const spy = exceljsUntouched();
    const e = only(await readManifest(bytes));
    expect(e).toMatchObject({ sheet: null, row: null, column: null, code: 'not-xlsx' });
    expect(e.message).toMatch(message);
    expect(spy).not.toHaveBeenCalled();
  });

  it('a ZIP archive without xl/workbook.xml, and an OpenDocument spreadsheet, say what they are', async () => {
    const plain = new JSZip();
    plain.file('hello.txt', 'not a workbook');
    const ods = new JSZip();
    ods.file('mimetype', 'application/vnd.oasis.opendocument.spreadsheet', { compression: 'STORE' });
    ods.file('content.xml', '<office:document-content/>');
    const spy = exceljsUntouched();
    expect(only(await readManifest(await plain.generateAsync({ type: 'nodebuffer' }))).message).toMatch(/ZIP archive without xl\/workbook\.xml/);
    expect(only(await readManifest(await ods.generateAsync({ type: 'nodebuffer' }))).message).toMatch(/OpenDocument spreadsheet \(\.ods\)/);
    expect(spy).not.toHaveBeenCalled();
  });

  it('a zip bomb by ratio: an entry declaring 8 MB that packs to a few KB (central directory sizes, APPNOTE §4.3.12)', async () => {
    const bomb = await components(componentRow(GOOD)).then((b) => JSZip.loadAsync(b));
    bomb.file('xl/media/padding.bin', Buffer.alloc(8 * 1024 * 1024));
    const spy = exceljsUntouched();
    const e = only(await readManifest(await bomb.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE' })));
    expect(e.code).toBe('zip-bomb');
    expect(e.message).toMatch(/^The entry xl\/media\/padding\.bin claims to unpack \d+ times its packed size \(8 MB\), past the 200× a spreadsheet reaches/);
    expect(spy).not.toHaveBeenCalled();
  });

  it('a zip bomb by total size: entries declaring more than the limit unpacked', async () => {
    const buf = await catalogWorkbook({ components: sampleComponents(), layers: sampleLayers() });
    const spy = exceljsUntouched();
    const e = only(await readManifest(buf, { limits: { maxUncompressedBytes: 20_000 } }));
    expect(e.code).toBe('zip-bomb');
    expect(e.message).toMatch(/^The workbook unpacks to [\d.]+ MB, more than the 0 MB a manifest may take/);
    expect(spy).not.toHaveBeenCalled();
    // The same file under the default limits reaches exceljs: the spy does see it when it is used.
    expect((await readManifest(buf)).errors).toEqual([]);
    expect(spy).toHaveBeenCalled();
  });

  it('a central directory that under-declares an entry: refused when the entry inflates past its declared size', async () => {
    const buf = await components(componentRow(GOOD), componentRow({ ...GOOD, code: 'CR-9' }));
    // Patch the uncompressed size (offset 24 of the central directory header, APPNOTE §4.3.12) of the sheet to 100 bytes.
    const name = Buffer.from('xl/worksheets/sheet1.xml');
    let at = buf.length - 22;
    while (buf.readUInt32LE(at) !== 0x06054b50) at--;
    let p = buf.readUInt32LE(at + 16);
    while (!buf.subarray(p + 46, p + 46 + name.length).equals(name)) p += 46 + buf.readUInt16LE(p + 28) + buf.readUInt16LE(p + 30) + buf.readUInt16LE(p + 32);
    buf.writeUInt32LE(100, p + 24);
    const spy = exceljsUntouched();
    const e = only(await readManifest(buf));
    expect(e.code).toBe('zip-bomb');
    expect(e.message).toBe('The file is refused: the entry xl/worksheets/sheet1.xml inflates past the 100 bytes it declares, as a crafted or damaged file does.');
    expect(spy).not.toHaveBeenCalled();
  });

  it('a sheet of a million rows, counted in the sheet XML (<row>, ECMA-376 Part 1, §18.3.1.73) before loading', async () => {
    const zip = await components(componentRow(GOOD)).then((b) => JSZip.loadAsync(b));
    // Rows and cells without r attributes are valid (r is optional, §18.3.1.73 and §18.3.1.4). A
    // million alike rows also deflate like a bomb, so the ratio limit is lifted to test the row count alone.
    zip.file('xl/worksheets/sheet1.xml', `<worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>${'<row><c><v>1</v></c></row>'.repeat(1_000_000)}</sheetData></worksheet>`);
    const packed = await zip.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE' });
    const spy = exceljsUntouched();
    const e = only(await readManifest(packed, { limits: { maxCompressionRatio: Infinity } }));
    expect(e).toMatchObject({ sheet: 'Components', row: null, column: null, code: 'too-many-rows' });
    expect(e.message).toBe('The sheet "Components" has more than 20,000 rows below the header, the most a manifest takes. Split it into several files, or delete the empty rows that carry formatting.');
    expect(spy).not.toHaveBeenCalled();
  });

  it('the row limit is a limit: 3 data rows pass a limit of 3, 4 do not', async () => {
    const row = (code: string) => componentRow({ ...GOOD, code });
    const three = await components(row('CR-1'), row('CR-2'), row('CR-3'));
    const four = await components(row('CR-1'), row('CR-2'), row('CR-3'), row('CR-4'));
    expect((await readManifest(three, { limits: { maxDataRows: 3 } })).components).toHaveLength(3);
    expect(only(await readManifest(four, { limits: { maxDataRows: 3 } })).code).toBe('too-many-rows');
  });

  it('too many cells, and too large a file', async () => {
    const buf = await components(componentRow(GOOD));
    // 17 headers and the 7 filled cells of GOOD: 24 cells, counted as <c> elements (§18.3.1.4).
    expect(only(await readManifest(buf, { limits: { maxCells: 23 } })).message).toBe('The workbook has more than 23 cells, the most a manifest takes. Remove sheets and columns the import does not need.');
    expect((await readManifest(buf, { limits: { maxCells: 24 } })).errors).toEqual([]);
    expect(only(await readManifest(buf, { limits: { maxFileBytes: 100 } })).code).toBe('too-large');
  });

  it('a damaged archive (cut short) is refused, not thrown', async () => {
    const buf = await components(componentRow(GOOD));
    expect(only(await readManifest(buf.subarray(0, buf.length - 30))).code).toBe('damaged');
  });
});

// ---------- sheet and header problems ----------

describe('sheets and headers', () => {
  it('a missing Components sheet names the sheets the workbook has', async () => {
    const e = only(await readManifest(await handXlsx([{ name: 'Sheet1', rows: [HEADERS] }, { name: 'Notes', rows: [['x']] }])));
    expect(e).toEqual({ sheet: 'Components', row: null, column: null, code: 'missing-sheet', message: 'The workbook has no sheet named "Components" (its sheets: "Sheet1", "Notes"); rename the sheet that lists the components to "Components".' });
  });

  it('a differently spelled header is named with what it reads and what was expected', async () => {
    const headers = [...HEADERS];
    headers[2] = 'Nmae';
    const r = await readManifest(await handXlsx([{ name: 'Components', rows: [headers, componentRow(GOOD)] }]));
    expect(only(r)).toEqual({ sheet: 'Components', row: 1, column: 'C', code: 'header', message: 'Header C1 reads "Nmae"; expected "name". Correct the header (case and spaces do not matter).' });
    expect(r.components).toEqual([]);
  });

  it('a misspelled header away from its place is found by its closeness; a repeated header is named twice', async () => {
    const headers: (string | null)[] = HEADERS.filter((h) => h !== 'name');
    headers.push('nmae', 'code');
    const r = await readManifest(await handXlsx([{ name: 'Components', rows: [headers] }]));
    expect(r.errors.map((e) => e.message)).toEqual([
      'Header Q1 reads "nmae"; expected "name". Correct the header (case and spaces do not matter).',
      'Header R1 repeats "code", already the header of A1; each column may appear once, so delete or rename one of them.',
    ]);
  });

  it('an empty Components sheet', async () => {
    expect(only(await readManifest(await handXlsx([{ name: 'Components', rows: [] }]))).code).toBe('empty-sheet');
  });
});

// ---------- cell problems ----------

describe('cell problems, each at its cell', () => {
  const clamp = { acceptBelow: 0.03, acceptAbove: 0.03, topHeight: 0.16, topSlope: 0.5, gripLow: 0.04, gripHigh: 0.16, gripSlope: 0.5, slotSlop: 0.015 };

  it('text where a number belongs, and a numeral stored as text', async () => {
    const r = await readManifest(await components(componentRow({ ...GOOD, ...clamp, acceptBelow: 'abc', topHeight: '0.16' })));
    expect(r.errors).toEqual([
      { sheet: 'Components', row: 2, column: 'I', code: 'not-a-number', message: 'I2 holds the text "abc", but acceptBelow must be a number; enter the number alone, e.g. 0.0300.' },
      { sheet: 'Components', row: 2, column: 'K', code: 'not-a-number', message: 'K2 holds 0.16 as text, but topHeight must be a number; clear the cell\'s text format and enter the number again.' },
    ]);
    expect(r.components).toEqual([]);
  });

  it('a formula without a saved value, and an error value', async () => {
    const r = await readManifest(await components(componentRow({ ...GOOD, ...clamp, gripLow: { formula: 'K2/4' }, gripHigh: { error: '#DIV/0!' } })));
    expect(r.errors).toEqual([
      { sheet: 'Components', row: 2, column: 'M', code: 'formula', message: 'M2 holds the formula =K2/4 but no saved value (the program that wrote the file did not calculate it); replace the formula with its value.' },
      { sheet: 'Components', row: 2, column: 'N', code: 'cell-error', message: 'N2 shows the error #DIV/0!; correct the formula or type the value in its place.' },
    ]);
  });

  it('merged cells over data are refused, naming the range, and the rows under it are not read further', async () => {
    const r = await readManifest(await handXlsx([{ name: 'Components', rows: [HEADERS, componentRow(GOOD), componentRow({ code: 'CR-9', kind: 'center-rail' })], merges: ['B3:D3'] }]));
    expect(only(r)).toEqual({ sheet: 'Components', row: 3, column: 'B', code: 'merged', message: 'Cells B3:D3 are merged; unmerge them and give each cell its own value (a merged range keeps only the first cell\'s value).' });
    expect(r.components.map((c) => c.row)).toEqual([2]);
  });

  it('duplicate codes, regardless of case as the catalog keeps them, name both rows', async () => {
    const r = await readManifest(await components(componentRow(GOOD), componentRow({ ...GOOD, code: 'CR-9' }), componentRow({ ...GOOD, code: 'cr-8' })));
    expect(only(r)).toEqual({ sheet: 'Components', row: 4, column: 'A', code: 'duplicate', message: 'A4: the code "cr-8" is already on row 2 (A2); each code may appear once, so delete one of the two rows or give it another code.' });
  });

  it('the schema\'s issues land on their columns (ComponentInputSchema, shared/schemas/catalog.ts)', async () => {
    // zod runs a schema's refinements (the primary dowel, stop faces) only once its fields parse,
    // so the kind error is on a row of its own here.
    const r = await readManifest(
      await components(
        componentRow({ ...GOOD, kind: 'rail' }),
        componentRow({ ...GOOD, code: 'CR-11', dowels: '1,0; 8,0', stops: '0.5,0.375@0#3', jawFaces: '0,0@90' }),
        componentRow({ ...GOOD, code: 'CR-9', ...clamp, gripLow: 0.2, gripHigh: 0.1, slotSlop: -0.01 }),
        componentRow({ ...GOOD, code: 'CR-10', acceptBelow: 0.03, topSlope: 0.5 }),
      ),
    );
    expect(r.errors.map((e) => `${e.column}${e.row}: ${e.message.slice(e.message.indexOf(' ') + 1)}`)).toEqual([
      'B2: Kind must be one of center-rail, jaw-rail, short-rail, vise, stop, subplate, other.',
      'F3: The first dowel is the primary dowel and must sit at the local origin (0, 0).',
      'G3: Stop 1 names jaw face 3, but the component has 1.',
      'N4: gripHigh must be at or above gripLow.',
      'P4: slotSlop must be zero or more.',
      ...['J', 'K', 'M', 'N', 'O', 'P'].map((c) => `${c}5: ${{ J: 'acceptAbove', K: 'topHeight', M: 'gripLow', N: 'gripHigh', O: 'gripSlope', P: 'slotSlop' }[c]} is empty, but this row's clamp model has other values; fill all eight clamp columns (acceptBelow to slotSlop) or clear them all for a component without a clamp.`),
    ]);
  });

  it('point lists that do not parse say what is wrong and how to write them', async () => {
    const r = await readManifest(await components(componentRow({ ...GOOD, dowels: '0,0; 8' }), componentRow({ ...GOOD, code: 'CR-9', dowels: 8 }), componentRow({ ...GOOD, code: 'CR-10', jawFaces: '0,0' })));
    expect(r.errors.map((e) => e.message)).toEqual([
      'F2: Dowel 2 "8" needs x and y separated by ","; write it like 0,0; 8,0.',
      'F3 holds the number 8, but dowels are written as text, e.g. 0,0; 8,0.',
      'H4: Jaw face 1 "0,0" needs a point and the direction of its normal after "@"; write jaw faces like 0,0.375@90.',
    ]);
  });

  it('column letters in the addresses follow ECMA-376 Part 1 §18.17.2.3.1: 1 = A, 26 = Z, 27 = AA, 702 = ZZ, 703 = AAA', async () => {
    // Columns are found by header, so the required ones can sit at A, Z, AA, ZZ and AAA.
    const header: Record<string, string> = { A: 'code', Z: 'kind', AA: 'name', ZZ: 'unit', AAA: 'layer' };
    HEADERS.slice(5).forEach((h, i) => { header[`AB${String.fromCharCode(65 + i)}`] = h; });
    const data = { A: null, Z: 'rail', AA: null, ZZ: 'cm', AAA: 'fx cr 8', ABA: '0,0' };
    const r = await readManifest(await handXlsx([{ name: 'Components', rows: [header, data] }]), { convention: DEMO_CONVENTION });
    expect(r.errors.map((e) => `${e.column}${e.row} ${e.code}`)).toEqual(['A2 invalid', 'Z2 invalid', 'AA2 invalid', 'ZZ2 invalid', ...checkName(DEMO_CONVENTION.layer, 'fx cr 8', 'layer').problems.map(() => 'AAA2 naming')]);
    expect(r.errors[0]!.message).toBe('A2: Code is required.');
    expect(r.errors[3]!.message).toBe('ZZ2: Unit must be "in" or "mm".');
  });
});

// ---------- layers ----------

describe('the Layers sheet', () => {
  const withLayers = (layerRows: HandRow[], componentRows: HandRow[] = [componentRow(GOOD)]) =>
    handXlsx([{ name: 'Components', rows: [HEADERS, ...componentRows] }, { name: 'Layers', rows: [['layer', 'holds', 'color'], ...layerRows] }]);

  it('reads layers, and checks that each component layer is listed there', async () => {
    const r = await readManifest(await withLayers([['FX-CR-8', 'center rails', 1]], [componentRow(GOOD), componentRow({ ...GOOD, code: 'CR-9', layer: 'FX-CR-9' })]));
    expect(r.layers).toEqual([{ row: 2, fields: { name: 'FX-CR-8', holds: 'center rails', color: 1 } }]);
    expect(only(r)).toEqual({ sheet: 'Components', row: 3, column: 'E', code: 'unknown-layer', message: 'E3: the layer "FX-CR-9" is not on the Layers sheet; add it there, or correct the layer name.' });
    expect(r.components.map((c) => c.row)).toEqual([2]);
  });

  it('a Layers sheet with only its header lists no layers, so component layers are not held to it', async () => {
    const r = await readManifest(await withLayers([]));
    expect(r.errors).toEqual([]);
    expect(r.sheets.layers).toBe('Layers');
  });

  it('color is a DXF color number 1–255 (group code 62); layer names are unique regardless of case', async () => {
    const r = await readManifest(await withLayers([['FX-CR-8', 'a', 0], ['FX-CR-9', 'b', 256], ['FX-CR-10', 'c', 3.5], ['fx-cr-8', 'd', 7], ['FX-CR-11', 'e', 'red']]));
    expect(r.errors.map((e) => `${e.column}${e.row} ${e.code}`)).toEqual(['C2 invalid', 'C3 invalid', 'C4 invalid', 'A5 duplicate', 'C6 not-a-number']);
    expect(r.errors[0]!.message).toBe('C2: Color must be a DXF color number from 1 to 255.');
    expect(r.errors[3]!.message).toBe('A5: the layer "fx-cr-8" is already on row 2 (A2); list each layer once (layer names do not differ by case alone).');
  });

  it('layer names are held to the layer rule of the convention', async () => {
    const r = await readManifest(await withLayers([['FX-CR-8', 'ok', 1], ['PART-a.b', 'bad', 2]], []), { convention: DEMO_CONVENTION });
    expect(r.errors.map((e) => e.message.replace(/^A3: the layer name breaks the naming convention \(version 1\): /, ''))).toEqual(checkName(DEMO_CONVENTION.layer, 'PART-a.b', 'layer').problems.map((p) => p.message));
  });
});

// ---------- CSV ----------

describe('CSV of the Components sheet (csv-parse, RFC 4180)', () => {
  const header = HEADERS.join(',');

  it('reads numerals as numbers, quoted point lists, and numbers rows as a spreadsheet opening the file does', () => {
    const text = `\uFEFF${header}\r\nCR-8,center-rail,"Rail, 8 stops",in,FX-CR-8,"0,0; 8,0","0.5,0.375@0",,0.03,0.03,0.16,0.5,0.04,0.16,0.5,0.015,"say ""hi"""\r\n\r\nCR-9,center-rail,Rail,in,,"0,0",,,x,,,,,,,,\r\n`;
    const r = readManifestCsv(text);
    expect(r.components).toHaveLength(1);
    expect(r.components[0]!.fields).toMatchObject({ name: 'Rail, 8 stops', notes: 'say "hi"', clamp: { acceptBelow: 0.03, slotSlop: 0.015 } });
    // Row 3 is empty and skipped; row 4 is the fourth line, as a spreadsheet numbers it.
    expect(r.errors.map((e) => `${e.sheet}!${e.column}${e.row} ${e.code}`)).toEqual(['Components!I4 not-a-number']);
  });

  it('refuses a number in exponent form with its own hint: the one decimal grammar has none (shared/units/decimal.ts, RS274/NGC numbers)', () => {
    const text = `${header}\nCR-8,center-rail,Rail,in,,"0,0",,,1E-05,0.03,0.16,0.5,0.04,0.16,0.5,0.015,\n`;
    expect(only(readManifestCsv(text))).toEqual({
      sheet: 'Components', row: 2, column: 'I', code: 'not-a-number',
      message: 'I2 holds 1E-05 in exponent form, but acceptBelow must be a plain decimal; write it with digits and one ".", e.g. 0.0300.',
    });
  });

  it('takes ";" between fields when the header line has no ","', () => {
    const r = readManifestCsv(`${HEADERS.join(';')}\nCR-8;center-rail;Rail;in;FX-CR-8;"0,0; 8,0";;;;;;;;;;;\n`);
    expect(r.errors).toEqual([]);
    expect(r.components[0]!.fields.dowels).toEqual([{ x: 0, y: 0 }, { x: 8, y: 0 }]);
  });

  it('an unclosed quote is reported with its line', () => {
    const e = only(readManifestCsv(`${header}\nCR-8,"center-rail\n`));
    expect(e.code).toBe('damaged');
    expect(e.message).toMatch(/^The CSV file could not be read at line \d+ /);
  });

  it('too many rows', () => {
    const rows = Array.from({ length: 4 }, (_, i) => `CR-${i + 1},center-rail,Rail,in,,"0,0",,,,,,,,,,,`);
    expect(only(readManifestCsv([header, ...rows].join('\n'), { limits: { maxDataRows: 3 } })).code).toBe('too-many-rows');
    expect(readManifestCsv([header, ...rows].join('\n'), { limits: { maxDataRows: 4 } }).components).toHaveLength(4);
  });

  it('uses the default convention when none is given, and the given one otherwise', () => {
    const text = `${header}\ncr-8,center-rail,Rail,in,,"0,0",,,,,,,,,,,\n`;
    expect(readManifestCsv(text).errors).toEqual([]);
    expect(readManifestCsv(text, { convention: DEFAULT_CONVENTION }).errors).toEqual([]);
    expect(readManifestCsv(text, { convention: DEMO_CONVENTION }).errors.map((e) => e.message)).toEqual(['A2: the code breaks the naming convention (version 1): A component code must be written in capitals: "CR-8", not "cr-8".']);
  });
});
