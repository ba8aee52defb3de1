/**
 * Checking a manifest's rows once its columns are bound (manifest-binding.ts): each cell read as
 * text, number or point list, each row through the catalog's own schema, codes and layer names
 * held to the naming convention, and duplicates named with the row they repeat.
 */
import type { z } from 'zod';
import { ComponentInputSchema, type ComponentFields } from '../../shared/schemas/catalog';
import type { NamingCheckResult, NamingConvention, NamingRule, NamingTarget } from '../../shared/schemas/naming';
import { cellAddress, columnLetter } from '../../shared/sheets/cell-address';
import { checkName } from '../../shared/naming/check-name';
import { compileRule } from '../../shared/naming/compile-rule';
import { isExponentForm, parseDecimal } from '../../shared/units/decimal';
import {
  CLAMP_FIELDS,
  COMPONENT_COLUMNS,
  LAYER_COLUMNS,
  ManifestLayerSchema,
  type ClampField,
  type ComponentColumnKey,
  type LayerColumnKey,
  type ManifestLayer,
} from './manifest-columns';
import type { ManifestErrorCode } from './manifest-types';
import { bindHeaders, cellProblems, dataRows, mergedRows, quote, type ErrorList } from './manifest-binding';
import { parseDowels, parseJawFaces, parseStops } from './point-lists';
import type { CellValue, Grid } from './sheet-grid';

// ---------- cells ----------

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
    if (isExponentForm(v.text)) {
      // The one decimal grammar (shared/units/decimal.ts) has no exponents; a CSV may carry what a spreadsheet displayed.
      return { ok: false, code: 'not-a-number', message: `${at} holds ${v.text.trim()} in exponent form, but ${header} must be a plain decimal; write it with digits and one ".", e.g. ${example}.` };
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
export function nameChecker(rule: NamingRule, target: NamingTarget): (name: string) => NamingCheckResult {
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

export interface Context {
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

export function readComponents(grid: Grid, ctx: Context): { rows: ComponentRow[]; columns: Partial<Record<ComponentColumnKey, string>> } {
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

export function readLayers(grid: Grid, ctx: Context): { rows: LayerRow[]; columns: Partial<Record<LayerColumnKey, string>>; complete: boolean } {
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

