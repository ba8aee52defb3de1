import ExcelJS from 'exceljs';
import { describe, expect, it } from 'vitest';
import { catalogWorkbook } from '../../server/manifest/write-manifest';
import { readManifest, readManifestCsv } from '../../server/manifest/read-manifest';
import { changedFields, planManifest, type ComponentChange } from '../../server/manifest/plan-manifest';
import type { Component, ComponentFields } from '../../shared/schemas/catalog';
import { DEMO_CONVENTION } from '../../shared/naming/conventions';
import { HEADERS, sampleComponents, sampleLayers } from './manifest-helpers';

const summary = (changes: readonly { action: string; code: string; fields: readonly string[] }[]) => changes.map((c) => `${c.action} ${c.code}${c.fields.length ? ` [${c.fields.join(', ')}]` : ''}`);

/** Values that do not survive as short decimals: thirds, sevenths, 0.1 + 0.2, inch values in mm. */
function awkwardCatalog(n: number): Component[] {
  const stamp = { outline: null, outlineFile: null, seatHeight: 0, jawTop: null, usedBy: 0, createdAt: '', updatedAt: '' };
  return Array.from({ length: n }, (_, i) => {
    const unit = i % 2 ? 'mm' : 'in';
    const k = unit === 'mm' ? 25.4 : 1;
    return {
      ...stamp, id: i + 1, code: `P-${i}`, kind: 'jaw-rail', name: `Rail ${i}`, unit, layer: '',
      dowels: [{ x: 0, y: 0 }, { x: ((i + 1) / 7) * k, y: (0.1 + 0.2) * k }],
      stops: [{ x: (i / 3) * k, y: -(1 / 3) * k, z: (2 / 3) * k, angle: i / 7, face: 0 }],
      jawFaces: [{ x: (1 / 9) * k, y: (i / 11) * k, normal: 90 + i / 3 }],
      clamp: i % 3 ? null : { acceptBelow: 0.03 * k, acceptAbove: (1 / 30) * k, topHeight: 0.16 * k, topSlope: 1 / 3, gripLow: 0.04 * k, gripHigh: 0.16 * k, gripSlope: 2 / 7, slotSlop: 0.015 * k },
      notes: i % 4 ? '' : `note ${i}`,
    } satisfies Component;
  });
}

async function editCells(buffer: Buffer, edit: (ws: ExcelJS.Worksheet) => void): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.load(buffer as unknown as Parameters<typeof wb.xlsx.load>[0]);
  edit(wb.getWorksheet('Components')!);
  return Buffer.from(await wb.xlsx.writeBuffer());
}

describe('round trip: export → readManifest → planManifest', () => {
  it('plans every row of the sample catalog "same", layers included, with no errors (demo convention)', async () => {
    const catalog = sampleComponents();
    const read = await readManifest(await catalogWorkbook({ components: catalog, layers: sampleLayers() }), { convention: DEMO_CONVENTION });
    const plan = planManifest(catalog, read, { layers: sampleLayers() });
    expect(plan.errors).toEqual([]);
    expect(summary(plan.changes)).toEqual(['same CR-8', 'same JR-1.000', 'same CR-M-200', 'same FX-CR-8', 'same FX-JR-1000', 'same FX-CRM-200']);
    expect(plan.counts).toEqual({ add: 0, change: 0, same: 6 });
  });

  it('plans "same" for values with no short decimal form, in both units (written 2 decimals past display, compared at half a display step)', async () => {
    const catalog = awkwardCatalog(60);
    const read = await readManifest(await catalogWorkbook({ components: catalog, layers: [] }));
    expect(read.errors).toEqual([]);
    const plan = planManifest(catalog, read);
    expect(plan.counts).toEqual({ add: 0, change: 0, same: 60 });
  });

  it('a manifest read into an empty catalog plans every row "add", carrying the fields to insert', async () => {
    const read = await readManifest(await catalogWorkbook({ components: sampleComponents(), layers: sampleLayers() }));
    const plan = planManifest([], read);
    expect(summary(plan.changes)).toEqual(['add CR-8', 'add JR-1.000', 'add CR-M-200']);
    const first = plan.changes[0] as ComponentChange;
    expect(first).toMatchObject({ sheet: 'Components', row: 2, id: null });
    const { id: _id, usedBy: _u, createdAt: _c, updatedAt: _up, outlineFile: _f, ...fields } = sampleComponents()[0]!;
    expect(first.input).toEqual(fields);
  });

  it('edits made in a spreadsheet program (here exceljs) are planned by field; differences below display precision are not', async () => {
    const catalog = sampleComponents();
    const edited = await editCells(await catalogWorkbook({ components: catalog, layers: sampleLayers() }), (ws) => {
      ws.getCell('C2').value = 'Center rail, 8 stops, ground';
      ws.getCell('F3').value = '0,0; 6.0001,0'; // 0.0001 in: one display step
      ws.getCell('J3').value = 0.03504; // 0.00004 in: below half a step
      ws.getCell('F4').value = '0,0; 150.0004,9.525'; // 0.0004 mm: below half of 0.001 mm
      ws.getCell('P4').value = 0.41; // slotSlop 0.4 → 0.41 mm
      ws.addRow(['VS-6', 'vise', 'Vise, 6 in jaws', 'in', 'FX-CR-8', '0,0; 4,0']);
    });
    const plan = planManifest(catalog, await readManifest(edited));
    expect(plan.errors).toEqual([]);
    expect(summary(plan.changes)).toEqual(['change CR-8 [name]', 'change JR-1.000 [dowels]', 'change CR-M-200 [clamp]', 'add VS-6']);
    expect(plan.changes.map((c) => c.row)).toEqual([2, 3, 4, 5]);
  });
});

describe('planManifest', () => {
  const base = sampleComponents()[0]!;
  const fieldsOf = (c: Component): ComponentFields => {
    const { id: _id, usedBy: _u, createdAt: _c, updatedAt: _up, outlineFile: _f, ...f } = c;
    return f;
  };

  it.each([
    // what, edit, expected fields; tolerance: half the display step of shared/units DISPLAY_DECIMALS (4 in, 3 mm)
    ['nothing', (f: ComponentFields) => f, []],
    ['a dowel 0.00004 in off', (f: ComponentFields) => ({ ...f, dowels: [f.dowels[0]!, { x: 8.00004, y: 0 }] }), []],
    ['a dowel 0.0001 in off', (f: ComponentFields) => ({ ...f, dowels: [f.dowels[0]!, { x: 8.0001, y: 0 }] }), ['dowels']],
    ['a stop angle 0.0004° off', (f: ComponentFields) => ({ ...f, stops: [{ ...f.stops[0]!, angle: 0.0004 }, f.stops[1]!] }), []],
    ['a stop angle 0.001° off', (f: ComponentFields) => ({ ...f, stops: [{ ...f.stops[0]!, angle: 0.001 }, f.stops[1]!] }), ['stops']],
    ['"@0" left out (a stop without an angle is at 0°)', (f: ComponentFields) => ({ ...f, stops: [{ x: 0.5, y: 0.375 }, f.stops[1]!] }), []],
    ['a stop against another face', (f: ComponentFields) => ({ ...f, stops: [f.stops[0]!, { ...f.stops[1]!, face: 0 }] }), ['stops']],
    ['one stop fewer', (f: ComponentFields) => ({ ...f, stops: [f.stops[0]!] }), ['stops']],
    ['a clamp model added', (f: ComponentFields) => ({ ...f, clamp: sampleComponents()[1]!.clamp }), ['clamp']],
    ['a jaw face normal turned', (f: ComponentFields) => ({ ...f, jawFaces: [{ ...f.jawFaces[0]!, normal: 91 }, f.jawFaces[1]!] }), ['jawFaces']],
    ['the code in other case, kind, name, unit, layer and notes', (f: ComponentFields) => ({ ...f, code: 'cr-8', kind: 'short-rail' as const, name: 'x', unit: 'mm' as const, layer: 'L', notes: 'n' }), ['code', 'kind', 'name', 'unit', 'layer', 'notes']],
  ])('%s', (_, edit, expected) => {
    expect(changedFields(base, edit(fieldsOf(base)))).toEqual(expected);
  });

  it('compares millimetre rows at 0.0005 mm', () => {
    const mm = sampleComponents()[2]!;
    const f = fieldsOf(mm);
    expect(changedFields(mm, { ...f, dowels: [f.dowels[0]!, { x: 150.0004, y: 9.525 }] })).toEqual([]);
    expect(changedFields(mm, { ...f, dowels: [f.dowels[0]!, { x: 150.001, y: 9.525 }] })).toEqual(['dowels']);
  });

  it('refuses to change the code of a component templates use, at the code cell; matches codes regardless of case', async () => {
    const used = { ...base, usedBy: 2 };
    const read = readManifestCsv(`${HEADERS.join(',')}\ncr-8,center-rail,Center rail,in,FX-CR-8,"0,0; 8,0",,,,,,,,,,,\n`);
    const plan = planManifest([used], read);
    expect(summary(plan.changes)).toEqual(['change cr-8 [code, name, stops, jawFaces, notes]']);
    expect(plan.errors).toEqual([{ sheet: 'Components', row: 2, column: 'A', code: 'code-in-use', message: 'A2: CR-8 is used by 2 template version(s), so its code cannot change to "cr-8"; write it as CR-8.' }]);
  });

  it('keeps the catalog component\'s outline, which a manifest does not carry', async () => {
    const outline = { paths: [{ closed: true, points: [{ x: 0, y: 0 }, { x: 8, y: 0 }, { x: 8, y: 1 }] }], circles: [] };
    const withOutline = { ...base, outline };
    const read = await readManifest(await catalogWorkbook({ components: [withOutline], layers: [] }));
    const change = planManifest([withOutline], read).changes[0] as ComponentChange;
    expect(change).toMatchObject({ action: 'same', id: 1 });
    expect(change.input.outline).toEqual(outline);
  });

  it('passes the reader\'s errors on and plans only the rows that read cleanly', async () => {
    const read = readManifestCsv(`${HEADERS.join(',')}\nCR-8,center-rail,Rail,in,,"0,0",,,,,,,,,,,\nCR-9,rail,Rail,in,,"0,0",,,,,,,,,,,\n`);
    const plan = planManifest([], read);
    expect(plan.errors.map((e) => `${e.column}${e.row}`)).toEqual(['B3']);
    expect(summary(plan.changes)).toEqual(['add CR-8']);
  });

  it('plans the Layers sheet against the shop\'s layers when given them', async () => {
    const read = await readManifest(await catalogWorkbook({ components: sampleComponents(), layers: [...sampleLayers(), { name: 'GRID-PLATE', holds: 'plate', color: 8 }] }));
    const shop = sampleLayers().map((l) => (l.name === 'FX-JR-1000' ? { ...l, color: 4 } : l));
    const plan = planManifest(sampleComponents(), read, { layers: shop });
    expect(summary(plan.changes.filter((c) => c.sheet === 'Layers'))).toEqual(['same FX-CR-8', 'change FX-JR-1000 [color]', 'same FX-CRM-200', 'add GRID-PLATE']);
    expect(summary(planManifest(sampleComponents(), read).changes.filter((c) => c.sheet === 'Layers'))).toEqual([]);
  });
});
