/**
 * What importing a read manifest would do to the catalog: each row added, changed (naming the
 * fields) or the same. The preview shows this; the commit applies the same plan in one
 * transaction, and refuses while `errors` is not empty. Catalog components missing from the
 * sheet are left as they are: a manifest adds and changes, it never deletes.
 */
import type { ClampModel, Component, ComponentFields, JawFace, Stop } from '../../shared/schemas/catalog';
import type { Point, Unit } from '../../shared/schemas/common';
import { DISPLAY_DECIMALS } from '../../shared/units/units';
import { CLAMP_FIELDS, COMPONENTS_SHEET, LAYERS_SHEET, type ManifestLayer } from './manifest-columns';
import { formatDowels, formatJawFaces, formatStops } from './point-lists';
import type { ManifestError, ManifestRead } from './manifest-types';

export type PlanAction = 'add' | 'change' | 'same';

/** The component fields a manifest carries (not the outline, which only a DXF import sets). */
export const COMPARED_FIELDS = ['code', 'kind', 'name', 'unit', 'layer', 'dowels', 'stops', 'jawFaces', 'clamp', 'notes'] as const;
export type ComparedField = (typeof COMPARED_FIELDS)[number];
export type LayerField = keyof ManifestLayer;
export interface FieldValueChange { field: string; from: string; to: string }

export interface ComponentChange {
  sheet: string;
  row: number;
  action: PlanAction;
  code: string;
  /** For 'change': the fields that differ; empty for 'add' and 'same'. */
  fields: ComparedField[];
  /** For 'change': each changed field's cell text before → after (a clamp model field by field). */
  values: FieldValueChange[];
  /** The catalog component the row updates, or null for 'add'. */
  id: number | null;
  /** What to write: the row's fields, keeping the catalog component's outline. */
  input: ComponentFields;
}

export interface LayerChange {
  sheet: string;
  row: number;
  action: PlanAction;
  /** The layer name. */
  code: string;
  fields: LayerField[];
  values: FieldValueChange[];
  input: ManifestLayer;
}

export interface ManifestPlan {
  changes: (ComponentChange | LayerChange)[];
  errors: ManifestError[];
  counts: Record<PlanAction, number>;
}

export interface PlanOptions {
  /** The shop's layers, when it keeps them; without them the Layers sheet is not planned. */
  layers?: readonly ManifestLayer[];
}

/**
 * Half a display step (0.0001 in, 0.001 mm): values that show the same in the sheet compare as
 * the same, so writing a catalog out and reading it back plans nothing.
 */
const lengthTolerance = (unit: Unit) => 0.5 * 10 ** -DISPLAY_DECIMALS[unit];
/** Angles and slopes are shown to 0.001° and 0.0001 (the workbook's formats). */
const ANGLE_TOLERANCE = 0.0005;
const SLOPE_TOLERANCE = 0.00005;

// The relative slack keeps a difference of exactly half a step, computed in binary, on the "same" side.
const close = (a: number, b: number, tol: number) => Math.abs(a - b) <= tol * (1 + 1e-9);

function samePoints(a: readonly Point[], b: readonly Point[], tol: number): boolean {
  return a.length === b.length && a.every((p, i) => close(p.x, b[i]!.x, tol) && close(p.y, b[i]!.y, tol));
}

// A stop without z, angle or face means 0 for each (as the station engine reads it), so "@0" and no angle are the same stop.
function sameStops(a: readonly Stop[], b: readonly Stop[], tol: number): boolean {
  return (
    a.length === b.length &&
    a.every((s, i) => {
      const t = b[i]!;
      return close(s.x, t.x, tol) && close(s.y, t.y, tol) && close(s.z ?? 0, t.z ?? 0, tol) && close(s.angle ?? 0, t.angle ?? 0, ANGLE_TOLERANCE) && (s.face ?? 0) === (t.face ?? 0);
    })
  );
}

function sameFaces(a: readonly JawFace[], b: readonly JawFace[], tol: number): boolean {
  return a.length === b.length && a.every((f, i) => close(f.x, b[i]!.x, tol) && close(f.y, b[i]!.y, tol) && close(f.normal, b[i]!.normal, ANGLE_TOLERANCE));
}

function sameClamp(a: ClampModel | null, b: ClampModel | null, tol: number): boolean {
  if (a === null || b === null) return a === b;
  return CLAMP_FIELDS.every((f) => close(a[f], b[f], f === 'topSlope' || f === 'gripSlope' ? SLOPE_TOLERANCE : tol));
}

/** The fields of `next` that differ from `current`; lengths at the tolerance of the row's unit. */
export function changedFields(current: Component, next: ComponentFields): ComparedField[] {
  const tol = lengthTolerance(next.unit);
  const differs: Record<ComparedField, boolean> = {
    code: current.code !== next.code,
    kind: current.kind !== next.kind,
    name: current.name !== next.name,
    unit: current.unit !== next.unit,
    layer: current.layer !== next.layer,
    dowels: !samePoints(current.dowels, next.dowels, tol),
    stops: !sameStops(current.stops, next.stops, tol),
    jawFaces: !sameFaces(current.jawFaces, next.jawFaces, tol),
    clamp: !sameClamp(current.clamp, next.clamp, tol),
    notes: current.notes !== next.notes,
  };
  return COMPARED_FIELDS.filter((f) => differs[f]);
}

/** A field as the workbook's cell writes it (point lists in their sheet syntax), so the preview reads like the sheet. */
function cellText(c: Pick<Component, ComparedField>, field: Exclude<ComparedField, 'clamp'>): string {
  switch (field) {
    case 'dowels': return formatDowels(c.dowels, c.unit);
    case 'stops': return formatStops(c.stops, c.unit);
    case 'jawFaces': return formatJawFaces(c.jawFaces, c.unit);
    default: return String(c[field] ?? '');
  }
}

/** Before → after of each changed field; a changed clamp model is said field by field ("none" where there is no clamp). */
export function fieldValues(current: Component, next: ComponentFields, changed: readonly ComparedField[]): FieldValueChange[] {
  const out: FieldValueChange[] = [];
  for (const field of changed) {
    if (field !== 'clamp') {
      out.push({ field, from: cellText(current, field), to: cellText(next, field) });
      continue;
    }
    const a = current.clamp;
    const b = next.clamp;
    if (!a || !b) {
      out.push({ field: 'clamp', from: a ? 'clamp model' : 'none', to: b ? 'clamp model' : 'none' });
      if (!b) continue;
    }
    for (const f of CLAMP_FIELDS) {
      if (!a || a[f] !== b[f]) out.push({ field: `clamp ${f}`, from: a ? String(a[f]) : 'none', to: String(b[f]) });
    }
  }
  return out;
}

export function planManifest(existing: readonly Component[], read: ManifestRead, options: PlanOptions = {}): ManifestPlan {
  const errors = [...read.errors];
  const changes: (ComponentChange | LayerChange)[] = [];
  // The catalog keeps codes unique regardless of case, so a row matches its component that way.
  const byCode = new Map(existing.map((c) => [c.code.toLowerCase(), c]));
  const componentsSheet = read.sheets.components ?? COMPONENTS_SHEET;
  const codeColumn = read.columns.components.code ?? null;

  for (const { row, fields: readFields } of read.components) {
    let fields = readFields;
    const current = byCode.get(fields.code.toLowerCase());
    if (!current) {
      changes.push({ sheet: componentsSheet, row, action: 'add', code: fields.code, fields: [], values: [], id: null, input: fields });
      continue;
    }
    const changed = changedFields(current, fields);
    if (changed.includes('code') && current.usedBy > 0) {
      errors.push({
        sheet: componentsSheet, row, column: codeColumn, code: 'code-in-use',
        message: `${codeColumn ?? ''}${row}: ${current.code} is used by ${current.usedBy} template version(s), so its code cannot change to "${fields.code}"; write it as ${current.code}.`,
      });
    }
    // The manifest has no seat-height or jaw-top column yet: a change keeps the catalog's values.
    fields = { ...fields, seatHeight: current.seatHeight, jawTop: current.jawTop };
    changes.push({
      sheet: componentsSheet, row, action: changed.length ? 'change' : 'same', code: fields.code, fields: changed, values: fieldValues(current, fields, changed), id: current.id,
      input: { ...fields, outline: current.outline },
    });
  }

  if (options.layers && read.sheets.layers) {
    const byName = new Map(options.layers.map((l) => [l.name.toLowerCase(), l]));
    for (const { row, fields } of read.layers) {
      const current = byName.get(fields.name.toLowerCase());
      const changed = current ? (['name', 'holds', 'color'] as const).filter((f) => current[f] !== fields[f]) : [];
      const action: PlanAction = !current ? 'add' : changed.length ? 'change' : 'same';
      const values = changed.map((f) => ({ field: f, from: String(current![f] ?? ''), to: String(fields[f] ?? '') }));
      changes.push({ sheet: read.sheets.layers ?? LAYERS_SHEET, row, action, code: fields.name, fields: [...changed], values, input: fields });
    }
  }

  const counts: Record<PlanAction, number> = { add: 0, change: 0, same: 0 };
  for (const c of changes) counts[c.action]++;
  return { changes, errors, counts };
}
