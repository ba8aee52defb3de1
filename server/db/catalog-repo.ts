import type { Db } from './knex';
import type { Component, ComponentFields, Plate, PlateFields } from '../../shared/schemas/catalog';
import type { ListQuery } from '../../shared/schemas/common';

interface PlateRow {
  id: number; code: string; name: string; unit: Plate['unit']; pitch: number; columns: number; rows: number;
  hole_diameter: number; thread: string; edge_margin: number; notes: string; created_at: string; updated_at: string;
}

const plateFromRow = (r: PlateRow, usedBy = 0): Plate => ({
  id: r.id, code: r.code, name: r.name, unit: r.unit, pitch: r.pitch, columns: r.columns, rows: r.rows,
  holeDiameter: r.hole_diameter, thread: r.thread, edgeMargin: r.edge_margin, notes: r.notes, usedBy,
  createdAt: String(r.created_at), updatedAt: String(r.updated_at),
});
const plateToRow = (p: PlateFields) => ({
  code: p.code, name: p.name, unit: p.unit, pitch: p.pitch, columns: p.columns, rows: p.rows,
  hole_diameter: p.holeDiameter, thread: p.thread, edge_margin: p.edgeMargin ?? p.pitch / 2, notes: p.notes,
});

/**
 * A component row as its API JSON, built by SQLite's JSON1 functions: the JSON columns are
 * spliced in as they are stored, so a list of a thousand components is never parsed and
 * re-serialized in JavaScript (see the catalog-list benchmark). The one mapping for reads.
 */
const COMPONENT_JSON = `json_object(
  'id', c.id, 'code', c.code, 'kind', c.kind, 'name', c.name, 'unit', c.unit,
  'dowels', json(c.dowels), 'stops', json(c.stops), 'jawFaces', json(c.jaw_faces),
  'clamp', json(c.clamp), 'outline', json(c.outline), 'layer', c.layer, 'notes', c.notes,
  'seatHeight', c.seat_height, 'jawTop', c.jaw_top,
  'outlineFile', json(c.outline_file),
  'usedBy', coalesce(u.n, 0), 'createdAt', c.created_at, 'updatedAt', c.updated_at)`;
const componentToRow = (c: ComponentFields) => ({
  code: c.code, kind: c.kind, name: c.name, unit: c.unit,
  dowels: JSON.stringify(c.dowels), stops: JSON.stringify(c.stops), jaw_faces: JSON.stringify(c.jawFaces),
  clamp: c.clamp ? JSON.stringify(c.clamp) : null, outline: c.outline ? JSON.stringify(c.outline) : null,
  layer: c.layer, notes: c.notes, seat_height: c.seatHeight, jaw_top: c.jawTop,
});

const USAGE_JOIN = `LEFT JOIN (SELECT component_id, count(DISTINCT version_id) AS n FROM template_version_components GROUP BY component_id) u ON u.component_id = c.id`;

/** LIKE with the user's text escaped, so "%" and "_" in a code match themselves. */
function likePattern(q: string) {
  return `%${q.replace(/[\\%_]/g, (m) => `\\${m}`)}%`;
}

export function catalogRepo(db: Db) {
  // How many templates use a plate, and how many template versions use a component; shown in lists, checked before delete.
  const plateUse = db('templates').select('plate_id').count({ n: '*' }).groupBy('plate_id').as('u');

  return {
    async listPlates(query: ListQuery): Promise<{ items: Plate[]; total: number }> {
      const base = db<PlateRow>('plates');
      if (query.q) base.where((w) => w.whereRaw("code LIKE ? ESCAPE '\\'", [likePattern(query.q!)]).orWhereRaw("name LIKE ? ESCAPE '\\'", [likePattern(query.q!)]));
      const [{ total }] = (await base.clone().count({ total: '*' })) as [{ total: number }];
      const rows = await base.clone().leftJoin(plateUse, 'u.plate_id', 'plates.id').select('plates.*', 'u.n as used_by')
        .orderBy('code').limit(query.limit ?? -1).offset(query.offset);
      return { items: rows.map((r: PlateRow & { used_by: number | null }) => plateFromRow(r, Number(r.used_by ?? 0))), total: Number(total) };
    },
    async getPlate(id: number): Promise<Plate | undefined> {
      const r = await db('plates').leftJoin(plateUse, 'u.plate_id', 'plates.id').select('plates.*', 'u.n as used_by').where('plates.id', id).first();
      return r && plateFromRow(r, Number(r.used_by ?? 0));
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

    /** The list answer `{items, total}` as JSON text, ready to send. */
    async listComponentsJson(query: ListQuery & { kind?: string }): Promise<string> {
      const where: string[] = [];
      const args: (string | number)[] = [];
      if (query.q) {
        const p = likePattern(query.q);
        where.push("(c.code LIKE ? ESCAPE '\\' OR c.name LIKE ? ESCAPE '\\' OR c.layer LIKE ? ESCAPE '\\')");
        args.push(p, p, p);
      }
      if (query.kind) {
        where.push('c.kind = ?');
        args.push(query.kind);
      }
      const whereSql = where.length ? `WHERE ${where.join(' AND ')}` : '';
      const rows = await db.raw(
        `SELECT json_object(
           'items', (SELECT json_group_array(json(item) ORDER BY code) FROM (
              SELECT ${COMPONENT_JSON} AS item, c.code AS code FROM components c ${USAGE_JOIN} ${whereSql}
              ORDER BY c.code LIMIT ? OFFSET ?)),
           'total', (SELECT count(*) FROM components c ${whereSql})) AS body`,
        [...args, query.limit ?? -1, query.offset, ...args],
      );
      return (rows as { body: string }[])[0]!.body;
    },
    async getComponent(id: number): Promise<Component | undefined> {
      const rows = (await db.raw(`SELECT ${COMPONENT_JSON} AS item FROM components c ${USAGE_JOIN} WHERE c.id = ?`, [id])) as { item: string }[];
      return rows[0] ? (JSON.parse(rows[0].item) as Component) : undefined;
    },
    async componentsByCodes(codes: string[]): Promise<Component[]> {
      if (codes.length === 0) return [];
      const rows = (await db.raw(`SELECT ${COMPONENT_JSON} AS item FROM components c ${USAGE_JOIN} WHERE c.code IN (${codes.map(() => '?').join(',')})`, codes)) as { item: string }[];
      return rows.map((r) => JSON.parse(r.item) as Component);
    },
    async componentCodeTaken(code: string, exceptId?: number) {
      const q = db('components').whereRaw('lower(code) = lower(?)', [code]);
      if (exceptId) q.whereNot({ id: exceptId });
      return !!(await q.first());
    },
    async insertComponent(c: ComponentFields, trx: Db = db): Promise<number> {
      const [row] = await trx('components').insert(componentToRow(c)).returning('id');
      return (row as { id: number }).id;
    },
    async updateComponent(id: number, c: ComponentFields, trx: Db = db) {
      await trx('components').where({ id }).update({ ...componentToRow(c), updated_at: trx.fn.now() });
    },
    async updateComponentIn(trx: Db, id: number, c: ComponentFields) {
      await trx('components').where({ id }).update({ ...componentToRow(c), updated_at: trx.fn.now() });
    },
    async setOutline(id: number, outline: unknown, file: unknown, trx: Db = db) {
      await trx('components').where({ id }).update({ outline: JSON.stringify(outline), outline_file: JSON.stringify(file), updated_at: trx.fn.now() });
    },
    deleteComponent: (id: number, trx: Db = db) => trx('components').where({ id }).delete(),
  };
}
export type CatalogRepo = ReturnType<typeof catalogRepo>;
