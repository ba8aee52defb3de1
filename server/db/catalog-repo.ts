import type { Db } from './knex';
import { containsPattern, isoTime, orderByText, paged, toNumber, whereContains } from './dialect';
import { hotReads, type StoredComponentRow } from './hot-reads';
import { bumpReadStamp } from './read-stamps';
import { jsonBody, type JsonBody } from '../json-body';
import type { Component, ComponentFields, Plate, PlateFields } from '../../shared/schemas/catalog';
import type { ListQuery } from '../../shared/schemas/common';

interface PlateRow {
  id: number; code: string; name: string; unit: Plate['unit']; pitch: number; columns: number; rows: number;
  hole_diameter: number; thread: string; edge_margin: number; notes: string; created_at: string | Date; updated_at: string | Date;
}

const plateFromRow = (r: PlateRow, usedBy = 0): Plate => ({
  id: r.id, code: r.code, name: r.name, unit: r.unit, pitch: r.pitch, columns: r.columns, rows: r.rows,
  holeDiameter: r.hole_diameter, thread: r.thread, edgeMargin: r.edge_margin, notes: r.notes, usedBy,
  createdAt: isoTime(r.created_at), updatedAt: isoTime(r.updated_at),
});
const plateToRow = (p: PlateFields) => ({
  code: p.code, name: p.name, unit: p.unit, pitch: p.pitch, columns: p.columns, rows: p.rows,
  hole_diameter: p.holeDiameter, thread: p.thread, edge_margin: p.edgeMargin ?? p.pitch / 2, notes: p.notes,
});

interface ComponentRow {
  id: number; code: string; kind: Component['kind']; name: string; unit: Component['unit'];
  dowels: string; stops: string; jaw_faces: string; clamp: string | null; outline: string | null; outline_file: string | null;
  layer: string; notes: string; seat_height: number | string; jaw_top: number | string | null;
  created_at: string | Date; updated_at: string | Date; used_by?: number | string | null;
}

const str = JSON.stringify;
/** A JSON column as stored: text that JSON.stringify wrote (componentToRow), spliced in unparsed. */
const stored = (text: string | null | undefined) => (text === null || text === undefined ? 'null' : text);

/**
 * A component row as its API JSON text: the one mapping for reads. The JSON columns are spliced in
 * as stored, so a list of a thousand components is not parsed and re-serialized (see the
 * catalog-list benchmark); services that need objects parse this text.
 */
const componentJson = (r: ComponentRow | StoredComponentRow): string =>
  `{"id":${str(r.id)},"code":${str(r.code)},"kind":${str(r.kind)},"name":${str(r.name)},"unit":${str(r.unit)},` +
  `"dowels":${stored(r.dowels)},"stops":${stored(r.stops)},"jawFaces":${stored(r.jaw_faces)},"clamp":${stored(r.clamp)},"outline":${stored(r.outline)},` +
  `"layer":${str(r.layer)},"notes":${str(r.notes)},"seatHeight":${str(toNumber(r.seat_height))},"jawTop":${r.jaw_top === null ? 'null' : str(toNumber(r.jaw_top))},` +
  `"outlineFile":${stored(r.outline_file)},"usedBy":${str(toNumber(r.used_by))},"createdAt":${str(isoTime(r.created_at))},"updatedAt":${str(isoTime(r.updated_at))}}`;
const componentFromRow = (r: ComponentRow): Component => JSON.parse(componentJson(r)) as Component;
const componentToRow = (c: ComponentFields) => ({
  code: c.code, kind: c.kind, name: c.name, unit: c.unit,
  dowels: JSON.stringify(c.dowels), stops: JSON.stringify(c.stops), jaw_faces: JSON.stringify(c.jawFaces),
  clamp: c.clamp ? JSON.stringify(c.clamp) : null, outline: c.outline ? JSON.stringify(c.outline) : null,
  layer: c.layer, notes: c.notes, seat_height: c.seatHeight, jaw_top: c.jawTop,
});


/** Rendered component pages per database, by query; each is served only while the catalog stamp it was made at is current. */
const PAGE_CACHE_SIZE = 100;
const pageCaches = new WeakMap<Db, Map<string, { stamp: number; body: JsonBody }>>();

export function catalogRepo(db: Db) {
  // How many templates use a plate, and how many template versions use a component; shown in lists, checked before delete.
  const plateUse = db('templates').select('plate_id').count({ n: '*' }).groupBy('plate_id').as('u');
  const componentUse = () => db('template_version_components').select('component_id').countDistinct({ n: 'version_id' }).groupBy('component_id').as('u');
  const components = () => db('components as c').leftJoin(componentUse(), 'u.component_id', 'c.id').select('c.*', 'u.n as used_by');

  const hot = hotReads(db);

  /** Contains-search over code, name and layer ignoring case, kind filter, code-point order by code: one prepared statement (hot-reads). */
  async function listComponentsJson(query: ListQuery & { kind?: string }): Promise<string> {
    const { rows, total } = await hot.componentPage({ kind: query.kind || null, pattern: query.q ? containsPattern(query.q) : null, limit: query.limit ?? null, offset: query.offset ?? 0 });
    return `{"items":[${rows.map(componentJson).join(',')}],"total":${total}}`;
  }

  /**
   * The page as bytes to send, kept rendered while the catalog's read stamp stays where it was: one
   * read of the stamp instead of the page's rows. The stamp is read before the rows, and every write
   * moves it in its own transaction, so a page is never kept under a stamp older than its rows. Never
   * kept inside a transaction (its rows may yet roll back). `readStamp`, when given, is the stamp as
   * read earlier in the same request (with its session), saving a read.
   */
  async function listComponentsBody(query: ListQuery & { kind?: string }, readStamp?: number): Promise<JsonBody> {
    if (db.isTransaction) return jsonBody(await listComponentsJson(query));
    let pages = pageCaches.get(db);
    if (!pages) pageCaches.set(db, (pages = new Map()));
    const key = JSON.stringify([query.kind ?? null, query.q ?? null, query.limit ?? null, query.offset ?? 0]);
    const stamp = readStamp ?? (await hot.stamp('catalog'));
    const hit = pages.get(key);
    if (hit && hit.stamp === stamp) return hit.body;
    const body = jsonBody(await listComponentsJson(query));
    pages.delete(key);
    pages.set(key, { stamp, body });
    if (pages.size > PAGE_CACHE_SIZE) pages.delete(pages.keys().next().value!);
    return body;
  }

  return {
    async listPlates(query: ListQuery): Promise<{ items: Plate[]; total: number }> {
      const base = db<PlateRow>('plates');
      if (query.q) whereContains(db, base, ['plates.code', 'plates.name'], query.q);
      const [{ total }] = (await base.clone().count({ total: '*' })) as [{ total: number | string }];
      const rows = await paged(orderByText(db, base.clone().leftJoin(plateUse, 'u.plate_id', 'plates.id').select('plates.*', 'u.n as used_by'), 'plates.code'), query.limit, query.offset);
      return { items: rows.map((r: PlateRow & { used_by: number | string | null }) => plateFromRow(r, toNumber(r.used_by))), total: toNumber(total) };
    },
    async getPlate(id: number): Promise<Plate | undefined> {
      const r = await db('plates').leftJoin(plateUse, 'u.plate_id', 'plates.id').select('plates.*', 'u.n as used_by').where('plates.id', id).first();
      return r && plateFromRow(r, toNumber(r.used_by));
    },
    async plateCodeTaken(code: string, exceptId?: number) {
      const q = db('plates').whereRaw('lower(code) = lower(?)', [code]);
      if (exceptId) q.whereNot({ id: exceptId });
      return !!(await q.first());
    },
    async plateByCode(code: string): Promise<Plate | undefined> {
      const r = await db('plates').where({ code }).first();
      return r && plateFromRow(r);
    },
    async insertPlate(p: PlateFields, trx: Db = db): Promise<number> {
      const [row] = await trx('plates').insert(plateToRow(p)).returning('id');
      return (row as { id: number }).id;
    },
    async updatePlate(id: number, p: PlateFields, trx: Db = db) {
      await trx('plates').where({ id }).update({ ...plateToRow(p), updated_at: trx.fn.now() });
    },
    deletePlate: (id: number, trx: Db = db) => trx('plates').where({ id }).delete(),

    /** One page of components (all when no limit), ordered by code, as the list answer `{items, total}` in JSON text. */
    listComponentsJson,
    /** The same page as bytes ready to send, with their ETag. */
    listComponentsBody,
    /** The same list as objects. */
    async listComponents(query: ListQuery & { kind?: string }): Promise<{ items: Component[]; total: number }> {
      return JSON.parse(await listComponentsJson(query)) as { items: Component[]; total: number };
    },
    async getComponent(id: number): Promise<Component | undefined> {
      const r: ComponentRow | undefined = await components().where('c.id', id).first();
      return r && componentFromRow(r);
    },
    async componentsByCodes(codes: string[]): Promise<Component[]> {
      if (codes.length === 0) return [];
      const rows: ComponentRow[] = await components().whereIn('c.code', codes);
      return rows.map(componentFromRow);
    },
    async componentCodeTaken(code: string, exceptId?: number) {
      const q = db('components').whereRaw('lower(code) = lower(?)', [code]);
      if (exceptId) q.whereNot({ id: exceptId });
      return !!(await q.first());
    },
    async insertComponent(c: ComponentFields, trx: Db = db): Promise<number> {
      await bumpReadStamp(trx, 'catalog');
      const [row] = await trx('components').insert(componentToRow(c)).returning('id');
      return (row as { id: number }).id;
    },
    async updateComponent(id: number, c: ComponentFields, trx: Db = db) {
      await bumpReadStamp(trx, 'catalog');
      await trx('components').where({ id }).update({ ...componentToRow(c), updated_at: trx.fn.now() });
    },
    async updateComponentIn(trx: Db, id: number, c: ComponentFields) {
      await bumpReadStamp(trx, 'catalog');
      await trx('components').where({ id }).update({ ...componentToRow(c), updated_at: trx.fn.now() });
    },
    async setOutline(id: number, outline: unknown, file: unknown, trx: Db = db) {
      await bumpReadStamp(trx, 'catalog');
      await trx('components').where({ id }).update({ outline: JSON.stringify(outline), outline_file: JSON.stringify(file), updated_at: trx.fn.now() });
    },
    async deleteComponent(id: number, trx: Db = db) {
      await bumpReadStamp(trx, 'catalog');
      return trx('components').where({ id }).delete();
    },
  };
}
export type CatalogRepo = ReturnType<typeof catalogRepo>;
