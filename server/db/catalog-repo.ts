import type { Db } from './knex';
import type { Component, ComponentFields, Plate, PlateFields } from '../../shared/schemas/catalog';
import type { ListQuery } from '../../shared/schemas/common';

interface PlateRow {
  id: number; code: string; name: string; unit: Plate['unit']; pitch: number; columns: number; rows: number;
  hole_diameter: number; thread: string; edge_margin: number; notes: string; created_at: string; updated_at: string;
}
interface ComponentRow {
  id: number; code: string; kind: Component['kind']; name: string; unit: Component['unit'];
  dowels: string; stops: string; jaw_faces: string; clamp: string | null; outline: string | null;
  layer: string; notes: string; created_at: string; updated_at: string;
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

const componentFromRow = (r: ComponentRow, usedBy = 0): Component => ({
  id: r.id, code: r.code, kind: r.kind, name: r.name, unit: r.unit,
  dowels: JSON.parse(r.dowels), stops: JSON.parse(r.stops), jawFaces: JSON.parse(r.jaw_faces),
  clamp: r.clamp ? JSON.parse(r.clamp) : null, outline: r.outline ? JSON.parse(r.outline) : null,
  layer: r.layer, notes: r.notes, usedBy, createdAt: String(r.created_at), updatedAt: String(r.updated_at),
});
const componentToRow = (c: ComponentFields) => ({
  code: c.code, kind: c.kind, name: c.name, unit: c.unit,
  dowels: JSON.stringify(c.dowels), stops: JSON.stringify(c.stops), jaw_faces: JSON.stringify(c.jawFaces),
  clamp: c.clamp ? JSON.stringify(c.clamp) : null, outline: c.outline ? JSON.stringify(c.outline) : null,
  layer: c.layer, notes: c.notes,
});

/** LIKE with the user's text escaped, so "%" and "_" in a code match themselves. */
function likePattern(q: string) {
  return `%${q.replace(/[\\%_]/g, (m) => `\\${m}`)}%`;
}

export function catalogRepo(db: Db) {
  // How many templates use a plate, and how many template versions use a component; shown in lists, checked before delete.
  const plateUse = db('templates').select('plate_id').count({ n: '*' }).groupBy('plate_id').as('u');
  const componentUse = db('template_version_components').select('component_id').countDistinct({ n: 'version_id' }).groupBy('component_id').as('u');

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
    async insertPlate(p: PlateFields): Promise<number> {
      const [row] = await db('plates').insert(plateToRow(p)).returning('id');
      return (row as { id: number }).id;
    },
    async updatePlate(id: number, p: PlateFields) {
      await db('plates').where({ id }).update({ ...plateToRow(p), updated_at: db.fn.now() });
    },
    deletePlate: (id: number) => db('plates').where({ id }).delete(),

    async listComponents(query: ListQuery & { kind?: string }): Promise<{ items: Component[]; total: number }> {
      const base = db<ComponentRow>('components');
      if (query.q) {
        const p = likePattern(query.q);
        base.where((w) => w.whereRaw("code LIKE ? ESCAPE '\\'", [p]).orWhereRaw("name LIKE ? ESCAPE '\\'", [p]).orWhereRaw("layer LIKE ? ESCAPE '\\'", [p]));
      }
      if (query.kind) base.where('kind', query.kind);
      const [{ total }] = (await base.clone().count({ total: '*' })) as [{ total: number }];
      const rows = await base.clone().leftJoin(componentUse, 'u.component_id', 'components.id').select('components.*', 'u.n as used_by')
        .orderBy('code').limit(query.limit ?? -1).offset(query.offset);
      return { items: rows.map((r: ComponentRow & { used_by: number | null }) => componentFromRow(r, Number(r.used_by ?? 0))), total: Number(total) };
    },
    async getComponent(id: number): Promise<Component | undefined> {
      const r = await db('components').leftJoin(componentUse, 'u.component_id', 'components.id').select('components.*', 'u.n as used_by').where('components.id', id).first();
      return r && componentFromRow(r, Number(r.used_by ?? 0));
    },
    async componentsByCodes(codes: string[]): Promise<Component[]> {
      if (codes.length === 0) return [];
      return (await db<ComponentRow>('components').whereIn('code', codes)).map((r) => componentFromRow(r));
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
    async updateComponent(id: number, c: ComponentFields) {
      await db('components').where({ id }).update({ ...componentToRow(c), updated_at: db.fn.now() });
    },
    deleteComponent: (id: number) => db('components').where({ id }).delete(),
  };
}
export type CatalogRepo = ReturnType<typeof catalogRepo>;
