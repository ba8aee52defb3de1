/**
 * Reads a manifest (XLSX, or CSV of the Components sheet alone) into catalog fields, with every
 * problem named by sheet, row and column letter as the spreadsheet shows them. The whole file is
 * checked and every problem listed, so a lead fixes the sheet once rather than upload by upload.
 * server/manifest/FORMAT.md describes the columns.
 */
import ExcelJS from 'exceljs';
import { parse as parseCsv } from 'csv-parse/sync';
import type { z } from 'zod';
import { ComponentInputSchema, type ComponentFields } from '../../shared/schemas/catalog';
import type { NamingCheckResult, NamingConvention, NamingRule, NamingTarget } from '../../shared/schemas/naming';
import { cellAddress, columnLetter, columnNumber } from '../../shared/sheets/cell-address';
import { checkName } from '../../shared/naming/check-name';
import { compileRule } from '../../shared/naming/compile-rule';
import { DEFAULT_CONVENTION } from '../../shared/naming/conventions';
import {
  CLAMP_FIELDS,
  COMPONENT_COLUMNS,
  COMPONENTS_SHEET,
  LAYER_COLUMNS,
  LAYERS_SHEET,
  ManifestLayerSchema,
  normalizeHeader,
  type ClampField,
  type ColumnSpec,
  type ComponentColumnKey,
  type LayerColumnKey,
  type ManifestLayer,
} from './manifest-columns';
import {
  DEFAULT_MANIFEST_LIMITS,
  type ManifestError,
  type ManifestErrorCode,
  type ManifestLimits,
  type ManifestRead,
} from './manifest-types';
import { parseDowels, parseJawFaces, parseStops } from './point-lists';
import { parseDecimal } from '../../shared/units/decimal';
import { gridFromRecords, gridFromWorksheet, type CellValue, type Grid } from './sheet-grid';
import { guardXlsx } from './xlsx-guard';

export interface ReadManifestOptions {
  /** Codes and layer names are held to it; the shop's current convention, or the default one. */
  convention?: NamingConvention;
  limits?: Partial<ManifestLimits>;
}

// ---------- errors ----------

class ErrorList {
  readonly items: ManifestError[] = [];
  add(sheet: string | null, row: number | null, col: number | null, code: ManifestErrorCode, message: string) {
    this.items.push({ sheet, row, column: col === null ? null : columnLetter(col), code, message });
  }
  rowsWithErrors(sheet: string): Set<number> {
    return new Set(this.items.filter((e) => e.sheet === sheet && e.row !== null).map((e) => e.row!));
  }
}

const quote = (s: string) => `"${s}"`;

// ---------- headers ----------

/** Optimal-string-alignment distance, so "Nmae" is one edit (a transposition) from "name". */
function editDistance(a: string, b: string): number {
  const d: number[][] = Array.from({ length: a.length + 1 }, (_, i) => Array.from({ length: b.length + 1 }, (_, j) => (i === 0 ? j : j === 0 ? i : 0)));
  for (let i = 1; i <= a.length; i++) {
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let v = Math.min(d[i - 1]![j]! + 1, d[i]![j - 1]! + 1, d[i - 1]![j - 1]! + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) v = Math.min(v, d[i - 2]![j - 2]! + 1);
      d[i]![j] = v;
    }
  }
  return d[a.length]![b.length]!;
}

interface Binding<K extends string> {
  /** Columns whose header reads right. */
  cols: Map<K, number>;
  /** Columns whose header is misspelled: only checked for formulas and error values, not read. */
  misspelled: Map<K, number>;
  /** Every column the sheet's checks look at. */
  watched: Set<number>;
}

function headerText(v: CellValue | undefined): string | null {
  if (!v) return null;
  if (v.t === 'text') return v.text;
  if (v.t === 'number') return String(v.value);
  return null;
}

/**
 * Finds each column by its header. A header that does not read right is reported where it was
 * expected: at its place in the written layout when that cell holds an unknown header, else at
 * an unknown header one or two edits away; otherwise the column is reported missing.
 */
function bindHeaders<K extends string>(grid: Grid, specs: readonly ColumnSpec<K>[], errors: ErrorList): Binding<K> {
  const header = grid.rows.get(1) ?? new Map<number, CellValue>();
  const byNorm = new Map(specs.map((s) => [normalizeHeader(s.header), s]));
  const cols = new Map<K, number>();
  const unknown = new Map<number, string>();
  for (const [col, v] of [...header].sort((a, b) => a[0] - b[0])) {
    const text = headerText(v);
    if (text === null) {
      if (v.t === 'no-value' || v.t === 'error') unknown.set(col, v.t === 'error' ? v.text : `=${v.formula}`);
      continue;
    }
    const spec = byNorm.get(normalizeHeader(text));
    if (!spec) {
      unknown.set(col, text.trim());
    } else if (cols.has(spec.key)) {
      errors.add(grid.sheet, 1, col, 'header', `Header ${cellAddress(col, 1)} repeats "${spec.header}", already the header of ${cellAddress(cols.get(spec.key)!, 1)}; each column may appear once, so delete or rename one of them.`);
    } else {
      cols.set(spec.key, col);
    }
  }
  const misspelled = new Map<K, number>();
  specs.forEach((spec, i) => {
    if (cols.has(spec.key)) return;
    const expectedAt = i + 1;
    let at: number | undefined = unknown.has(expectedAt) ? expectedAt : undefined;
    if (at === undefined) {
      const target = normalizeHeader(spec.header);
      let best = Infinity;
      for (const [col, text] of unknown) {
        const dist = editDistance(normalizeHeader(text), target);
        if (dist <= 2 && dist < best) { best = dist; at = col; }
      }
    }
    if (at !== undefined) {
      misspelled.set(spec.key, at);
      const text = unknown.get(at)!;
      unknown.delete(at);
      errors.add(grid.sheet, 1, at, 'header', `Header ${cellAddress(at, 1)} reads ${quote(text)}; expected "${spec.header}". Correct the header (case and spaces do not matter).`);
    } else if (!header.has(expectedAt)) {
      errors.add(grid.sheet, 1, expectedAt, 'header', `Header ${cellAddress(expectedAt, 1)} is empty; expected "${spec.header}". Add the "${spec.header}" column.`);
    } else {
      errors.add(grid.sheet, 1, null, 'header', `The ${grid.sheet} sheet has no "${spec.header}" column; add a column headed "${spec.header}" in row 1.`);
    }
  });
  return { cols, misspelled, watched: new Set([...cols.values(), ...misspelled.values()]) };
}

// ---------- cells ----------

/** Reports formulas without a saved value and error values in the columns the checks look at; answers those cells' columns. */
function cellProblems(grid: Grid, row: number, cells: Map<number, CellValue>, watched: Set<number>, errors: ErrorList): Set<number> {
  const bad = new Set<number>();
  for (const [col, v] of cells) {
    if (!watched.has(col)) continue;
    const at = cellAddress(col, row);
    if (v.t === 'no-value') {
      errors.add(grid.sheet, row, col, 'formula', `${at} holds the formula =${v.formula} but no saved value (the program that wrote the file did not calculate it); replace the formula with its value.`);
      bad.add(col);
    } else if (v.t === 'error') {
      errors.add(grid.sheet, row, col, 'cell-error', `${at} shows the error ${v.text}; correct the formula or type the value in its place.`);
      bad.add(col);
    }
  }
  return bad;
}

type Read<T> = { ok: true; value: T } | { ok: false; code: ManifestErrorCode; message: string };

function describe(v: CellValue): string {
  switch (v.t) {
    case 'boolean': return v.value ? 'TRUE' : 'FALSE';
    case 'date': return 'a date';
    case 'number': return `the number ${v.value}`;
    case 'text': return `the text ${quote(v.text)}`;
    default: return 'a value';
  }
}

function readText(v: CellValue | undefined, at: string, header: string): Read<string> {
  if (!v) return { ok: true, value: '' };
  if (v.t === 'text') return { ok: true, value: v.text };
  if (v.t === 'number') return { ok: true, value: String(v.value) };
  return { ok: false, code: 'not-text', message: `${at} holds ${describe(v)}, but ${header} must be text; type it in as text.` };
}

function readNumber(v: CellValue | undefined, at: string, header: string, numbersAsText: boolean, example: string): Read<number | undefined> {
  if (!v) return { ok: true, value: undefined };
  if (v.t === 'number') return { ok: true, value: v.value };
  if (v.t === 'text') {
    const n = parseDecimal(v.text);
    if (numbersAsText && n !== null) return { ok: true, value: n };
    if (n !== null) {
      return { ok: false, code: 'not-a-number', message: `${at} holds ${v.text.trim()} as text, but ${header} must be a number; clear the cell's text format and enter the number again.` };
    }
    return { ok: false, code: 'not-a-number', message: `${at} holds ${describe(v)}, but ${header} must be a number; enter the number alone, e.g. ${example}.` };
  }
  return { ok: false, code: 'not-a-number', message: `${at} holds ${describe(v)}, but ${header} must be a number, e.g. ${example}.` };
}

function readList<T>(v: CellValue | undefined, at: string, header: string, example: string, parse: (text: string) => { ok: true; value: T[] } | { ok: false; message: string }): Read<T[]> {
  if (!v) return { ok: true, value: [] };
  if (v.t !== 'text') {
    return { ok: false, code: 'invalid', message: `${at} holds ${describe(v)}, but ${header} are written as text, e.g. ${example}.` };
  }
  const r = parse(v.text);
  return r.ok ? r : { ok: false, code: 'invalid', message: `${at}: ${r.message}` };
}

// ---------- naming ----------

/**
 * checkName's answer, with the rule compiled once for the file rather than once per name (the
 * compile is most of checkName's cost), and each name checked once: a layer appears on the
 * Components sheet and again on the Layers sheet.
 */
function nameChecker(rule: NamingRule, target: NamingTarget): (name: string) => NamingCheckResult {
  const compiled = compileRule(rule, target);
  if (!compiled.ok) {
    const refused = checkName(rule, '', target);
    return () => refused;
  }
  const seen = new Map<string, NamingCheckResult>();
  return (name) => {
    let r = seen.get(name);
    if (!r) seen.set(name, (r = compiled.checker.check(name, target)));
    return r;
  };
}

interface Context {
  errors: ErrorList;
  convention: NamingConvention;
  checkCode: (name: string) => NamingCheckResult;
  checkLayer: (name: string) => NamingCheckResult;
}

function namingErrors(ctx: Context, grid: Grid, row: number, col: number, name: string, target: NamingTarget) {
  const result = target === 'component' ? ctx.checkCode(name) : ctx.checkLayer(name);
  const what = target === 'component' ? 'code' : 'layer name';
  for (const p of result.problems) {
    ctx.errors.add(grid.sheet, row, col, 'naming', `${cellAddress(col, row)}: the ${what} breaks the naming convention (version ${ctx.convention.version}): ${p.message}`);
  }
}

// ---------- rows ----------

/** Rows covered by a merged range over a checked column; the range is reported once, at its first cell. */
function mergedRows(grid: Grid, watched: Set<number>, errors: ErrorList): Set<number> {
  const rows = new Set<number>();
  for (const m of grid.merges) {
    if (![...watched].some((c) => c >= m.left && c <= m.right)) continue;
    errors.add(grid.sheet, m.top, m.left, 'merged', `Cells ${m.range} are merged; unmerge them and give each cell its own value (a merged range keeps only the first cell's value).`);
    for (let r = m.top; r <= m.bottom; r++) rows.add(r);
  }
  return rows;
}

function dataRows(grid: Grid, watched: Set<number>, skip: Set<number>): [number, Map<number, CellValue>][] {
  return [...grid.rows].filter(([r, cells]) => r > 1 && !skip.has(r) && [...cells.keys()].some((c) => watched.has(c)));
}

/** zod issue → the column it belongs to: clamp fields have columns of their own. */
function issueKey(issue: z.core.$ZodIssue): ComponentColumnKey | null {
  const [first, second] = issue.path;
  if (first === 'clamp') return typeof second === 'string' && (CLAMP_FIELDS as readonly string[]).includes(second) ? (second as ClampField) : 'acceptBelow';
  if (typeof first !== 'string') return null;
  return COMPONENT_COLUMNS.some((c) => c.key === first) ? (first as ComponentColumnKey) : null;
}

const EXAMPLE_NUMBER: Record<string, string> = { length: '0.0300', slope: '0.5000', whole: '7' };

interface ComponentRow {
  row: number;
  fields: ComponentFields;
}

function readComponents(grid: Grid, ctx: Context): { rows: ComponentRow[]; columns: Partial<Record<ComponentColumnKey, string>> } {
  const { errors } = ctx;
  const bound = bindHeaders(grid, COMPONENT_COLUMNS, errors);
  const colOf = (k: ComponentColumnKey) => bound.cols.get(k);
  const columns = Object.fromEntries([...bound.cols].map(([k, c]) => [k, columnLetter(c)])) as Partial<Record<ComponentColumnKey, string>>;
  const skip = mergedRows(grid, bound.watched, errors);
  const clampComplete = CLAMP_FIELDS.every((f) => bound.cols.has(f));
  const out: ComponentRow[] = [];
  const firstRowOfCode = new Map<string, { row: number; col: number }>();

  for (const [row, cells] of dataRows(grid, bound.watched, skip)) {
    const bad = cellProblems(grid, row, cells, bound.watched, errors);
    let rowOk = bad.size === 0;
    const at = (k: ComponentColumnKey) => cellAddress(colOf(k)!, row);
    const cell = (k: ComponentColumnKey) => {
      const c = colOf(k);
      return c === undefined || bad.has(c) ? undefined : cells.get(c);
    };
    const fail = (k: ComponentColumnKey, r: { code: ManifestErrorCode; message: string }) => {
      errors.add(grid.sheet, row, colOf(k)!, r.code, r.message);
      rowOk = false;
    };
    const input: Record<string, unknown> = {};
    const unread = new Set<ComponentColumnKey>();

    for (const spec of COMPONENT_COLUMNS) {
      const k = spec.key;
      if (!bound.cols.has(k) || bad.has(colOf(k)!)) { unread.add(k); continue; }
      const v = cell(k);
      let r: Read<unknown>;
      switch (spec.type) {
        case 'text': r = readText(v, at(k), spec.header); break;
        // Fixed values carry no meaning in their case ("MM" is mm); the drop-down writes them in lower case.
        case 'choice': { const t = readText(v, at(k), spec.header); r = t.ok ? { ok: true, value: t.value.trim().toLowerCase() } : t; break; }
        case 'dowels': r = readList(v, at(k), spec.header, '0,0; 8,0', parseDowels); break;
        case 'stops': r = readList(v, at(k), spec.header, '0.5,0.375@0; 1.5,0.375@0', parseStops); break;
        case 'jawFaces': r = readList(v, at(k), spec.header, '0,0.375@90', parseJawFaces); break;
        default: r = readNumber(v, at(k), spec.header, grid.numbersAsText, EXAMPLE_NUMBER[spec.type] ?? '1');
      }
      if (!r.ok) { fail(k, r); unread.add(k); continue; }
      // An empty text cell is left out so the schema names what is required and defaults the rest.
      if (r.value === '' && (k === 'code' || k === 'kind' || k === 'name' || k === 'unit')) continue;
      input[k] = r.value;
    }

    // Clamp: all eight values or none (a component without a clamp model).
    let clampKnown = clampComplete && CLAMP_FIELDS.every((f) => !unread.has(f));
    if (clampKnown) {
      const filled = CLAMP_FIELDS.filter((f) => input[f] !== undefined);
      if (filled.length === 0) {
        input.clamp = null;
      } else if (filled.length < CLAMP_FIELDS.length) {
        for (const f of CLAMP_FIELDS.filter((g) => input[g] === undefined)) {
          fail(f, { code: 'invalid', message: `${at(f)}: ${f} is empty, but this row's clamp model has other values; fill all eight clamp columns (acceptBelow to slotSlop) or clear them all for a component without a clamp.` });
        }
        clampKnown = false;
      } else {
        input.clamp = Object.fromEntries(CLAMP_FIELDS.map((f) => [f, input[f]]));
      }
    }
    for (const f of CLAMP_FIELDS) delete input[f];
    if (!clampKnown) input.clamp = null;

    const parsed = ComponentInputSchema.safeParse(input);
    const issueKeys = new Set<ComponentColumnKey>();
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        const k = issueKey(issue);
        // A column that is missing, misspelled or already refused is reported once, by its header or cell.
        if (k === null || unread.has(k) || (!clampKnown && (CLAMP_FIELDS as readonly string[]).includes(k))) {
          if (k === null) errors.add(grid.sheet, row, null, 'invalid', `Row ${row}: ${issue.message}`);
          rowOk = false;
          continue;
        }
        issueKeys.add(k);
        fail(k, { code: 'invalid', message: `${at(k)}: ${issue.message}` });
      }
    }
    if (unread.size) rowOk = false;

    // Names are checked only where the schema took them, so one bad character is not reported twice.
    const code = typeof input.code === 'string' ? input.code.trim() : '';
    if (code && bound.cols.has('code') && !unread.has('code') && !issueKeys.has('code')) {
      const first = firstRowOfCode.get(code.toLowerCase());
      if (first) {
        // Codes are unique regardless of case, as the catalog keeps them.
        fail('code', { code: 'duplicate', message: `${at('code')}: the code ${quote(code)} is already on row ${first.row} (${cellAddress(first.col, first.row)}); each code may appear once, so delete one of the two rows or give it another code.` });
      } else {
        firstRowOfCode.set(code.toLowerCase(), { row, col: colOf('code')! });
      }
      const before = errors.items.length;
      namingErrors(ctx, grid, row, colOf('code')!, code, 'component');
      if (errors.items.length > before) rowOk = false;
    }
    const layer = typeof input.layer === 'string' ? input.layer.trim() : '';
    if (layer && !unread.has('layer') && !issueKeys.has('layer')) {
      const before = errors.items.length;
      namingErrors(ctx, grid, row, colOf('layer')!, layer, 'layer');
      if (errors.items.length > before) rowOk = false;
    }
    if (rowOk && parsed.success) out.push({ row, fields: parsed.data });
  }
  return { rows: out, columns };
}

interface LayerRow {
  row: number;
  fields: ManifestLayer;
}

function readLayers(grid: Grid, ctx: Context): { rows: LayerRow[]; columns: Partial<Record<LayerColumnKey, string>>; complete: boolean } {
  const { errors } = ctx;
  const before = errors.items.length;
  const bound = bindHeaders(grid, LAYER_COLUMNS, errors);
  const complete = errors.items.length === before;
  const colOf = (k: LayerColumnKey) => bound.cols.get(k);
  const columns = Object.fromEntries([...bound.cols].map(([k, c]) => [k, columnLetter(c)])) as Partial<Record<LayerColumnKey, string>>;
  const skip = mergedRows(grid, bound.watched, errors);
  const out: LayerRow[] = [];
  const firstRowOfName = new Map<string, number>();
  for (const [row, cells] of dataRows(grid, bound.watched, skip)) {
    const bad = cellProblems(grid, row, cells, bound.watched, errors);
    let rowOk = bad.size === 0 && complete;
    const input: Record<string, unknown> = {};
    const unread = new Set<LayerColumnKey>();
    for (const spec of LAYER_COLUMNS) {
      const col = colOf(spec.key);
      if (col === undefined || bad.has(col)) { unread.add(spec.key); continue; }
      const at = cellAddress(col, row);
      const r = spec.type === 'whole' ? readNumber(cells.get(col), at, spec.header, grid.numbersAsText, '7') : readText(cells.get(col), at, spec.header);
      if (!r.ok) { errors.add(grid.sheet, row, col, r.code, r.message); unread.add(spec.key); rowOk = false; continue; }
      if (r.value !== '' && r.value !== undefined) input[spec.key] = r.value;
    }
    const parsed = ManifestLayerSchema.safeParse(input);
    const issueKeys = new Set<string>();
    if (!parsed.success) {
      rowOk = false;
      for (const issue of parsed.error.issues) {
        const k = issue.path[0] as LayerColumnKey;
        if (unread.has(k) || colOf(k) === undefined) continue;
        issueKeys.add(k);
        errors.add(grid.sheet, row, colOf(k)!, 'invalid', `${cellAddress(colOf(k)!, row)}: ${issue.message}`);
      }
    }
    const name = typeof input.name === 'string' ? input.name.trim() : '';
    if (name && !unread.has('name') && !issueKeys.has('name')) {
      const col = colOf('name')!;
      const first = firstRowOfName.get(name.toLowerCase());
      if (first !== undefined) {
        errors.add(grid.sheet, row, col, 'duplicate', `${cellAddress(col, row)}: the layer ${quote(name)} is already on row ${first} (${cellAddress(col, first)}); list each layer once (layer names do not differ by case alone).`);
        rowOk = false;
      } else {
        firstRowOfName.set(name.toLowerCase(), row);
      }
      const n = errors.items.length;
      namingErrors(ctx, grid, row, col, name, 'layer');
      if (errors.items.length > n) rowOk = false;
    }
    if (rowOk && parsed.success) out.push({ row, fields: parsed.data });
  }
  return { rows: out, columns, complete };
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
