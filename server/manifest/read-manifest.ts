/**
 * Reads a manifest (XLSX, or CSV of the Components sheet alone) into catalog fields, with every
 * problem named by sheet, row and column letter as the spreadsheet shows them. The whole file is
 * checked and every problem listed, so a lead fixes the sheet once rather than upload by upload.
 * server/manifest/FORMAT.md describes the columns. This module reads the file (XLSX through the
 * size guard, or CSV) and puts the sheets together; manifest-binding.ts finds the columns and
 * manifest-checks.ts checks each row.
 */
import ExcelJS from 'exceljs';
import { parse as parseCsv } from 'csv-parse/sync';
import type { NamingConvention } from '../../shared/schemas/naming';
import { columnNumber } from '../../shared/sheets/cell-address';
import { DEFAULT_CONVENTION } from '../../shared/naming/conventions';
import { COMPONENT_COLUMNS, COMPONENTS_SHEET, LAYERS_SHEET } from './manifest-columns';
import { DEFAULT_MANIFEST_LIMITS, type ManifestError, type ManifestLimits, type ManifestRead } from './manifest-types';
import { ErrorList, quote } from './manifest-binding';
import { nameChecker, readComponents, readLayers, type Context } from './manifest-checks';
import { gridFromRecords, gridFromWorksheet, type Grid } from './sheet-grid';
import { guardXlsx } from './xlsx-guard';

export interface ReadManifestOptions {
  /** Codes and layer names are held to it; the shop's current convention, or the default one. */
  convention?: NamingConvention;
  limits?: Partial<ManifestLimits>;
}

// ---------- the file ----------

const findSheet = (grids: readonly Grid[], name: string) => grids.find((g) => g.sheet.trim().toLowerCase() === name.toLowerCase());

function emptyRead(errors: ManifestError[], components: string | null = null): ManifestRead {
  return { components: [], layers: [], errors, columns: { components: {}, layers: {} }, sheets: { components, layers: null } };
}

function sortErrors(errors: ManifestError[], sheetOrder: readonly string[]): ManifestError[] {
  const sheetRank = (s: string | null) => (s === null ? -1 : sheetOrder.indexOf(s));
  const colRank = (c: string | null) => (c === null ? 0 : columnNumber(c));
  return errors
    .map((e, i) => ({ e, i }))
    .sort((a, b) => sheetRank(a.e.sheet) - sheetRank(b.e.sheet) || (a.e.row ?? 0) - (b.e.row ?? 0) || colRank(a.e.column) - colRank(b.e.column) || a.i - b.i)
    .map(({ e }) => e);
}

function readGrids(grids: readonly Grid[], options: ReadManifestOptions): ManifestRead {
  const convention = options.convention ?? DEFAULT_CONVENTION;
  const errors = new ErrorList();
  const ctx: Context = {
    errors,
    convention,
    checkCode: nameChecker(convention.component, 'component'),
    checkLayer: nameChecker(convention.layer, 'layer'),
  };
  const componentsGrid = findSheet(grids, COMPONENTS_SHEET);
  if (!componentsGrid) {
    const names = grids.map((g) => quote(g.sheet)).join(', ');
    errors.add(COMPONENTS_SHEET, null, null, 'missing-sheet', `The workbook has no sheet named "${COMPONENTS_SHEET}" (its sheets: ${names || 'none'}); rename the sheet that lists the components to "${COMPONENTS_SHEET}".`);
    return emptyRead(errors.items);
  }
  if (!componentsGrid.rows.has(1)) {
    errors.add(componentsGrid.sheet, 1, null, 'empty-sheet', `The ${componentsGrid.sheet} sheet has no header row; row 1 must hold the headers ${COMPONENT_COLUMNS.map((c) => c.header).join(', ')}.`);
    return emptyRead(errors.items, componentsGrid.sheet);
  }
  const components = readComponents(componentsGrid, ctx);

  const layersGrid = findSheet(grids, LAYERS_SHEET);
  const layers = layersGrid ? readLayers(layersGrid, ctx) : { rows: [], columns: {}, complete: false };
  // A component's layer must be one the manifest lists, when it lists layers at all (a Layers
  // sheet with only its header, as an export from a shop without a layer list writes, lists none).
  // Names are taken from the cells as written, so a layer row refused for another reason does not
  // also make every component on it "unlisted".
  const layerCol = components.columns.layer;
  const listed = new Set<string>();
  if (layersGrid && layers.complete && layers.columns.name) {
    const col = columnNumber(layers.columns.name);
    for (const [r, cells] of layersGrid.rows) {
      const c = cells.get(col);
      if (r > 1 && c?.t === 'text') listed.add(c.text.trim().toLowerCase());
    }
  }
  if (layersGrid && listed.size && layerCol) {
    for (const { row, fields } of components.rows) {
      if (fields.layer && !listed.has(fields.layer.toLowerCase())) {
        errors.add(componentsGrid.sheet, row, columnNumber(layerCol), 'unknown-layer', `${layerCol}${row}: the layer ${quote(fields.layer)} is not on the ${layersGrid.sheet} sheet; add it there, or correct the layer name.`);
      }
    }
  }

  const badComponents = errors.rowsWithErrors(componentsGrid.sheet);
  const badLayers = layersGrid ? errors.rowsWithErrors(layersGrid.sheet) : new Set<number>();
  return {
    components: components.rows.filter((r) => !badComponents.has(r.row)),
    layers: layers.rows.filter((r) => !badLayers.has(r.row)),
    errors: sortErrors(errors.items, grids.map((g) => g.sheet)),
    columns: { components: components.columns, layers: layers.columns },
    sheets: { components: componentsGrid.sheet, layers: layersGrid?.sheet ?? null },
  };
}

const limitsOf = (options: ReadManifestOptions): ManifestLimits => ({ ...DEFAULT_MANIFEST_LIMITS, ...options.limits });

/** Worksheet parts exceljs need not model for a manifest: none of them holds a cell value. */
const IGNORED_NODES = ['dataValidations', 'conditionalFormatting', 'extLst', 'hyperlinks', 'pageSetup', 'headerFooter', 'printOptions', 'picture', 'drawing', 'rowBreaks', 'tableParts', 'autoFilter', 'sheetProtection'];

/**
 * The workbook's sheets as grids, after the size checks (xlsx-guard.ts); exported so tests can
 * compare the cell values read with an outside reader's.
 */
export async function readWorkbookGrids(input: Buffer | Uint8Array, limits: Partial<ManifestLimits> = {}): Promise<{ ok: true; grids: Grid[] } | { ok: false; error: ManifestError }> {
  const r = await loadGuardedWorkbook(input, { ...DEFAULT_MANIFEST_LIMITS, ...limits });
  return r.ok ? { ok: true, grids: r.workbook.worksheets.map(gridFromWorksheet) } : r;
}

/**
 * Every spreadsheet upload goes through here: the size, part and merge checks of xlsx-guard.ts,
 * then exceljs on what the guard lets through (comment parts left out).
 */
export async function loadGuardedWorkbook(input: Buffer | Uint8Array, limits: ManifestLimits): Promise<{ ok: true; workbook: ExcelJS.Workbook } | { ok: false; error: ManifestError }> {
  const buf = Buffer.isBuffer(input) ? input : Buffer.from(input.buffer, input.byteOffset, input.byteLength);
  const guard = await guardXlsx(buf, limits);
  if (!guard.ok) {
    return { ok: false, error: { sheet: guard.problem.sheet ?? null, row: null, column: null, code: guard.problem.code, message: guard.problem.message } };
  }
  const wb = new ExcelJS.Workbook();
  try {
    await wb.xlsx.load(guard.workbook as unknown as Parameters<typeof wb.xlsx.load>[0], { ignoreNodes: IGNORED_NODES });
  } catch {
    // exceljs's own messages name its internals ("reading 'comments'"), not what to fix.
    return {
      ok: false,
      error: { sheet: null, row: null, column: null, code: 'damaged', message: 'The workbook could not be read as a spreadsheet; open it in a spreadsheet program and save it again as .xlsx.' },
    };
  }
  return { ok: true, workbook: wb };
}

/** Reads an XLSX manifest: the Components sheet, and the Layers sheet when there is one. */
export async function readManifest(input: Buffer | Uint8Array, options: ReadManifestOptions = {}): Promise<ManifestRead> {
  const r = await readWorkbookGrids(input, limitsOf(options));
  if (!r.ok) return emptyRead([r.error]);
  return readGrids(r.grids, options);
}

/**
 * Reads the Components sheet saved as CSV (RFC 4180; "," or ";" between fields, found from the
 * header line). Rows and column letters are those a spreadsheet shows on opening the file.
 */
export function readManifestCsv(text: string, options: ReadManifestOptions = {}): ManifestRead {
  const limits = limitsOf(options);
  const bytes = Buffer.byteLength(text, 'utf8');
  if (bytes > limits.maxFileBytes) {
    return emptyRead([{ sheet: null, row: null, column: null, code: 'too-large', message: `The file is ${(bytes / 1024 / 1024).toFixed(1)} MB; a manifest may be at most ${limits.maxFileBytes / 1024 / 1024} MB. Split the catalog into several files.` }]);
  }
  const firstLine = text.replace(/^\uFEFF/, '').split(/\r?\n/, 1)[0] ?? '';
  const delimiter = !firstLine.includes(',') && firstLine.includes(';') ? ';' : ',';
  let records: string[][];
  try {
    // Parsed whole (the size is capped above): a line limit would cut a file whose quoted cells hold line breaks.
    records = parseCsv(text, { bom: true, delimiter, relax_column_count: true, skip_empty_lines: false }) as string[][];
  } catch (err) {
    const line = (err as { lines?: number }).lines;
    return emptyRead([{ sheet: COMPONENTS_SHEET, row: line ?? null, column: null, code: 'damaged', message: `The CSV file could not be read${line ? ` at line ${line}` : ''} (${(err as Error).message}); check the quotes on that line.` }]);
  }
  if (records.length > limits.maxDataRows + 1) {
    return emptyRead([{ sheet: COMPONENTS_SHEET, row: null, column: null, code: 'too-many-rows', message: `The file has more than ${limits.maxDataRows.toLocaleString('en-US')} rows below the header, the most a manifest takes; split it into several files.` }]);
  }
  return readGrids([gridFromRecords(COMPONENTS_SHEET, records)], options);
}
