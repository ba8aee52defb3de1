import ExcelJS from 'exceljs';
import { beforeAll, describe, expect, it } from 'vitest';
import { catalogWorkbook } from '../../server/manifest/write-manifest';
import { COMPONENT_KINDS } from '../../shared/schemas/catalog';
import type { Station } from '../../shared/schemas/template';
import { HEADERS, readRawWorkbook, sampleComponents, sampleLayers, type RawSheet, type RawWorkbook } from './manifest-helpers';

const stations: Station[] = [
  { id: 'p1:0', number: 1, placement: 'p1', stop: 0, x: -7.5, y: 2.25, z: 0, c: 90, nominalWidth: 1 },
  { id: 'p1:1', number: 2, placement: 'p1', stop: 1, x: -6.5, y: 2.25, z: 0, c: 90, nominalWidth: null },
];

let buffer: Buffer;
let raw: RawWorkbook;
const sheet = (name: string): RawSheet => raw.sheets.find((s) => s.name === name)!;
const value = (s: RawSheet, ref: string) => s.cells.get(ref)?.value ?? null;

beforeAll(async () => {
  buffer = await catalogWorkbook({ components: sampleComponents(), layers: sampleLayers(), stations: { unit: 'in', rows: stations } });
  raw = await readRawWorkbook(buffer);
});

describe('the exported workbook read by a second reader: the raw OOXML through jszip', () => {
  it('is a ZIP package (local file header "PK\\x03\\x04", PKWARE APPNOTE §4.3.7) with the three sheets in order (ECMA-376 Part 1, §18.2.20 sheets)', () => {
    expect(buffer.subarray(0, 4).toString('latin1')).toBe('PK\x03\x04');
    expect(raw.sheets.map((s) => s.name)).toEqual(['Components', 'Layers', 'Stations']);
  });

  it('leaves the Stations sheet out when no stations are given', async () => {
    const without = await readRawWorkbook(await catalogWorkbook({ components: sampleComponents(), layers: sampleLayers() }));
    expect(without.sheets.map((s) => s.name)).toEqual(['Components', 'Layers']);
  });

  it('writes the header row as shared strings: <c t="s"><v>n</v> indexes xl/sharedStrings.xml (ECMA-376 Part 1, §18.4.9)', () => {
    const c = sheet('Components');
    expect(c.cells.get('A1')!.type).toBe('s');
    const headers = HEADERS.map((_, i) => value(c, `${String.fromCharCode(65 + i)}1`));
    expect(headers).toEqual([
      'code', 'kind', 'name', 'unit', 'layer', 'dowels', 'stops', 'jaw faces',
      'acceptBelow', 'acceptAbove', 'topHeight', 'topSlope', 'gripLow', 'gripHigh', 'gripSlope', 'slotSlop', 'notes',
    ]);
  });

  it('writes the point lists as text in the documented encoding (server/manifest/FORMAT.md)', () => {
    const c = sheet('Components');
    expect(value(c, 'F2')).toBe('0,0; 8,0');
    expect(value(c, 'G2')).toBe('0.5,0.375@0; 1.5,-0.375,0.25@180#2');
    expect(value(c, 'H2')).toBe('0,0.375@90; 0,-0.375@270');
    // 25.4 × 0.375 is 9.524999999999999 in binary; written two decimals past the 0.001 mm shown.
    expect(value(c, 'F4')).toBe('0,0; 150,9.525');
    expect(value(c, 'Q2')).toBe('Fixed jaw on both sides; "hardened" dowels');
    expect(value(c, 'Q4')).toBe('métrique');
  });

  it('stores clamp values as numbers: no t attribute (type n, ECMA-376 Part 1, §18.18.11) and the value in <v>', () => {
    const c = sheet('Components');
    const clamp = sampleComponents()[1]!.clamp!;
    const cells = ['I3', 'J3', 'K3', 'L3', 'M3', 'N3', 'O3', 'P3'].map((ref) => c.cells.get(ref)!);
    expect(cells.map((x) => x.type)).toEqual(Array(8).fill('n'));
    expect(cells.map((x) => x.value)).toEqual([clamp.acceptBelow, clamp.acceptAbove, clamp.topHeight, clamp.topSlope, clamp.gripLow, clamp.gripHigh, clamp.gripSlope, clamp.slotSlop]);
  });

  it('leaves the clamp cells of a component without a clamp model empty (no <v>)', () => {
    const c = sheet('Components');
    for (const ref of ['I2', 'J2', 'K2', 'L2', 'M2', 'N2', 'O2', 'P2']) expect(value(c, ref)).toBeNull();
  });

  it('formats lengths per cell by the row\'s unit: 0.0000 for in, 0.000 for mm; slopes 0.0000 (cellXfs → numFmt, ECMA-376 Part 1, §18.8.30)', () => {
    const c = sheet('Components');
    const format = (ref: string) => raw.formatOfStyle(c.cells.get(ref)!.style);
    expect(['I3', 'K3', 'M3', 'N3', 'P3'].map(format)).toEqual(Array(5).fill('0.0000'));
    expect(['I4', 'K4', 'M4', 'N4', 'P4'].map(format)).toEqual(Array(5).fill('0.000'));
    expect([format('L4'), format('O4'), format('L3')]).toEqual(['0.0000', '0.0000', '0.0000']);
  });

  it('freezes the header row: <pane ySplit="1" state="frozen"> (ECMA-376 Part 1, §18.3.1.66)', () => {
    for (const name of ['Components', 'Layers', 'Stations']) {
      expect(sheet(name).xml).toMatch(/<pane\b(?=[^>]*\bySplit="1")(?=[^>]*\bstate="frozen")[^>]*\/>/);
    }
  });

  it('offers drop-down lists for kind (B) and unit (D): <dataValidation type="list"> with the values in quotes (ECMA-376 Part 1, §18.3.1.32)', () => {
    const xml = sheet('Components').xml;
    const lists = [...xml.matchAll(/<dataValidation\b([^>]*)>\s*<formula1>([^<]*)<\/formula1>/g)].map((m) => ({
      sqref: /sqref="([^"]*)"/.exec(m[1]!)![1],
      type: /type="([^"]*)"/.exec(m[1]!)![1],
      formula: m[2]!.replace(/&quot;/g, '"'),
    }));
    expect(lists).toEqual([
      { sqref: 'B2:B20001', type: 'list', formula: `"${COMPONENT_KINDS.join(',')}"` },
      { sqref: 'D2:D20001', type: 'list', formula: '"in,mm"' },
    ]);
  });

  it('writes the Layers sheet with color numbers as numbers and a 1–255 whole-number rule (DXF group code 62)', () => {
    const l = sheet('Layers');
    expect([value(l, 'A1'), value(l, 'B1'), value(l, 'C1')]).toEqual(['layer', 'holds', 'color']);
    expect([1, 2, 3].map((i) => [value(l, `A${i + 1}`), value(l, `B${i + 1}`), value(l, `C${i + 1}`)])).toEqual(sampleLayers().map((x) => [x.name, x.holds, x.color]));
    expect(l.cells.get('C4')!.type).toBe('n');
    expect(l.xml).toMatch(/<dataValidation\b[^>]*type="whole"[^>]*sqref="C2:C20001"[^>]*>\s*<formula1>1<\/formula1>\s*<formula2>255<\/formula2>/);
  });

  it('writes the station table with the unit in the length headers and stops counted from 1', () => {
    const s = sheet('Stations');
    expect(['A1', 'B1', 'F1', 'H1'].map((r) => value(s, r))).toEqual(['station', 'x (in)', 'nominal width (in)', 'stop']);
    expect(['A2', 'B2', 'C2', 'E2', 'F2', 'H2', 'I2'].map((r) => value(s, r))).toEqual([1, -7.5, 2.25, 90, 1, 1, 'p1:0']);
    expect(value(s, 'F3')).toBeNull();
    expect(value(s, 'H3')).toBe(2);
  });
});

describe('the exported workbook read by exceljs', () => {
  let wb: ExcelJS.Workbook;
  beforeAll(async () => {
    wb = new ExcelJS.Workbook();
    await wb.xlsx.load(buffer as unknown as Parameters<typeof wb.xlsx.load>[0]);
  });

  it('reads the same values and number formats', () => {
    const ws = wb.getWorksheet('Components')!;
    expect(ws.getCell('A3').value).toBe('JR-1.000');
    expect(ws.getCell('J3').value).toBe(0.035);
    expect(ws.getCell('J3').numFmt).toBe('0.0000');
    expect(ws.getCell('J4').numFmt).toBe('0.000');
    expect(ws.getCell('G2').value).toBe('0.5,0.375@0; 1.5,-0.375,0.25@180#2');
    expect(ws.views[0]).toMatchObject({ state: 'frozen', ySplit: 1 });
  });

  it('carries the encodings as notes on the header cells', () => {
    const ws = wb.getWorksheet('Components')!;
    const note = (ref: string) => {
      const n = ws.getCell(ref).note;
      return typeof n === 'string' ? n : (n?.texts ?? []).map((t) => t.text).join('');
    };
    expect(note('F1')).toContain('0,0; 8,0');
    expect(note('G1')).toContain('x,y[,z][@angle][#face]');
    expect(note('H1')).toContain('x,y@normal');
    expect(note('I1')).toContain('all eight');
  });
});
