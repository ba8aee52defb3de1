import ExcelJS from 'exceljs';
import { COMPONENT_KINDS, type Component } from '../../shared/schemas/catalog';
import type { Unit } from '../../shared/schemas/common';
import type { Station } from '../../shared/schemas/template';
import { columnLetter } from '../../shared/sheets/cell-address';
import {
  CLAMP_FIELDS,
  COMPONENT_COLUMNS,
  COMPONENTS_SHEET,
  LAYER_COLUMNS,
  LAYERS_SHEET,
  STATIONS_SHEET,
  type ColumnSpec,
  type ManifestLayer,
} from './manifest-columns';
import { formatDowels, formatJawFaces, formatStops } from './point-lists';
import { DEFAULT_MANIFEST_LIMITS } from './manifest-types';

export interface CatalogWorkbookInput {
  components: readonly Component[];
  layers: readonly ManifestLayer[];
  /** A template version's station table, written as a third sheet; the reader ignores it (stations are derived). */
  stations?: { unit: Unit; rows: readonly Station[] };
}

/** Display precision per unit (0.0001 in, 0.001 mm), as the station table writes lengths. */
const LENGTH_FORMAT: Readonly<Record<Unit, string>> = { in: '0.0000', mm: '0.000' };
const SLOPE_FORMAT = '0.0000';

/**
 * Data validation reaches as far as the reader takes rows, so rows a shop adds get the same
 * drop-down lists as the rows written here.
 */
const VALIDATED_LAST_ROW = DEFAULT_MANIFEST_LIMITS.maxDataRows + 1;

// exceljs keeps sheet-level validations on an untyped member; add(address, rule) stores a
// range and its XML writer emits it as one <dataValidation sqref="B2:B20001"> (ECMA-376 Part 1, §18.3.1.32).
type SheetValidations = { dataValidations: { add(address: string, rule: ExcelJS.DataValidation): void } };

function listValidation(ws: ExcelJS.Worksheet, col: number, values: readonly string[], what: string) {
  const address = `${columnLetter(col)}2:${columnLetter(col)}${VALIDATED_LAST_ROW}`;
  (ws as unknown as SheetValidations).dataValidations.add(address, {
    type: 'list',
    allowBlank: false,
    // A literal list is written in quotes, comma-separated (ECMA-376 Part 1, §18.3.1.32, formula1).
    formulae: [`"${values.join(',')}"`],
    showErrorMessage: true,
    errorTitle: `Unknown ${what}`,
    error: `${what[0]!.toUpperCase()}${what.slice(1)} must be one of ${values.join(', ')}.`,
  });
}

function header(ws: ExcelJS.Worksheet, columns: readonly ColumnSpec<string>[]) {
  ws.columns = columns.map((c) => ({ header: c.header, key: c.key, width: c.width }));
  const row = ws.getRow(1);
  row.font = { bold: true };
  columns.forEach((c, i) => {
    if (c.note) row.getCell(i + 1).note = c.note;
  });
  ws.autoFilter = `A1:${columnLetter(columns.length)}1`;
}

/** No text is no cell, as a spreadsheet leaves a cell nobody typed in, rather than a cell holding "". */
const orEmpty = (text: string) => (text === '' ? null : text);

const colOf = (key: string) => COMPONENT_COLUMNS.findIndex((c) => c.key === key) + 1;

function componentsSheet(wb: ExcelJS.Workbook, components: readonly Component[]) {
  const ws = wb.addWorksheet(COMPONENTS_SHEET, { views: [{ state: 'frozen', ySplit: 1 }] });
  header(ws, COMPONENT_COLUMNS);
  for (const c of components) {
    const row = ws.addRow({
      code: c.code,
      kind: c.kind,
      name: c.name,
      unit: c.unit,
      layer: orEmpty(c.layer),
      dowels: formatDowels(c.dowels, c.unit),
      stops: orEmpty(formatStops(c.stops, c.unit)),
      jawFaces: orEmpty(formatJawFaces(c.jawFaces, c.unit)),
      // Numbers stay numbers: the full value is stored and the cell format only rounds what is shown.
      ...(c.clamp ? Object.fromEntries(CLAMP_FIELDS.map((f) => [f, c.clamp![f]])) : {}),
      notes: orEmpty(c.notes),
    });
    // Units vary per row, so the length format is set on each cell rather than on the column.
    for (const f of CLAMP_FIELDS) {
      row.getCell(colOf(f)).numFmt = f === 'topSlope' || f === 'gripSlope' ? SLOPE_FORMAT : LENGTH_FORMAT[c.unit];
    }
  }
  listValidation(ws, colOf('kind'), COMPONENT_KINDS, 'kind');
  listValidation(ws, colOf('unit'), ['in', 'mm'], 'unit');
}

function layersSheet(wb: ExcelJS.Workbook, layers: readonly ManifestLayer[]) {
  const ws = wb.addWorksheet(LAYERS_SHEET, { views: [{ state: 'frozen', ySplit: 1 }] });
  header(ws, LAYER_COLUMNS);
  for (const l of layers) ws.addRow({ name: l.name, holds: orEmpty(l.holds), color: l.color });
  const col = LAYER_COLUMNS.findIndex((c) => c.key === 'color') + 1;
  ws.getColumn(col).numFmt = '0';
  (ws as unknown as SheetValidations).dataValidations.add(`${columnLetter(col)}2:${columnLetter(col)}${VALIDATED_LAST_ROW}`, {
    type: 'whole',
    operator: 'between',
    allowBlank: false,
    formulae: [1, 255],
    showErrorMessage: true,
    errorTitle: 'Color number',
    error: 'Color must be a DXF color number from 1 to 255.',
  });
}

const STATION_COLUMNS = [
  { key: 'station', label: 'station', width: 9 },
  { key: 'x', label: 'x', length: true, width: 12 },
  { key: 'y', label: 'y', length: true, width: 12 },
  { key: 'z', label: 'z', length: true, width: 12 },
  { key: 'c', label: 'c (deg)', width: 10 },
  { key: 'nominalWidth', label: 'nominal width', length: true, width: 15 },
  { key: 'placement', label: 'placement', width: 14 },
  { key: 'stop', label: 'stop', width: 6 },
  { key: 'id', label: 'station id', width: 16 },
] as const;

function stationsSheet(wb: ExcelJS.Workbook, unit: Unit, rows: readonly Station[]) {
  const ws = wb.addWorksheet(STATIONS_SHEET, { views: [{ state: 'frozen', ySplit: 1 }] });
  ws.columns = STATION_COLUMNS.map((c) => ({
    header: 'length' in c ? `${c.label} (${unit})` : c.label,
    key: c.key,
    width: c.width,
    style: 'length' in c ? { numFmt: LENGTH_FORMAT[unit] } : c.key === 'c' ? { numFmt: '0.000' } : {},
  }));
  ws.getRow(1).font = { bold: true };
  ws.getCell('A1').note = 'Translations from the shared work offset, for reference; importing a manifest ignores this sheet.';
  // Stops are counted from 1 on paper, as the station table and the setup sheet count them.
  for (const s of rows) {
    ws.addRow({ station: s.number, x: s.x, y: s.y, z: s.z, c: s.c, nominalWidth: s.nominalWidth, placement: s.placement, stop: s.stop + 1, id: s.id });
  }
}

/**
 * The catalog as a manifest workbook: Components, Layers and, for a template version, Stations.
 * server/manifest/FORMAT.md describes the columns; readManifest reads the file back.
 */
export async function catalogWorkbook(input: CatalogWorkbookInput): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  wb.creator = 'Gridset';
  componentsSheet(wb, input.components);
  layersSheet(wb, input.layers);
  if (input.stations) stationsSheet(wb, input.stations.unit, input.stations.rows);
  return Buffer.from(await wb.xlsx.writeBuffer());
}
