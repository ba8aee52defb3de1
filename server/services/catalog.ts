import type { ComponentFields, PlateFields } from '../../shared/schemas/catalog';
import { OutlineSchema, type Outline } from '../../shared/schemas/geometry';
import type { ListQuery } from '../../shared/schemas/common';
import type { CatalogRepo } from '../db/catalog-repo';
import { conflict, notFound, validationError } from '../middleware/errors';
import type { NamingService } from './naming';
import type { AuditRepo } from '../db/audit-repo';

export function catalogService(repo: CatalogRepo, naming: NamingService, audit: AuditRepo) {
  return {
    listPlates: (q: ListQuery) => repo.listPlates(q),
    async getPlate(id: number) {
      const p = await repo.getPlate(id);
      if (!p) throw notFound(`Plate ${id}`);
      return p;
    },
    async createPlate(actorId: number, input: PlateFields) {
      if (await repo.plateCodeTaken(input.code)) throw conflict(`A plate with the code ${input.code} already exists; choose another code.`);
      const id = await audit.audited((trx) => repo.insertPlate(input, trx), (id) => ({ userId: actorId, action: 'plate.create', objectType: 'plate', objectId: id, summary: `Added plate ${input.code}`, after: input }));
      return repo.getPlate(id);
    },
    async updatePlate(actorId: number, id: number, input: PlateFields) {
      const existing = await this.getPlate(id);
      if (await repo.plateCodeTaken(input.code, id)) throw conflict(`A plate with the code ${input.code} already exists; choose another code.`);
      if (existing.usedBy > 0 && (input.unit !== existing.unit || input.pitch !== existing.pitch)) {
        throw conflict(`Plate ${existing.code} is used by ${existing.usedBy} template(s); its unit and pitch cannot change. Add a new plate instead.`);
      }
      await audit.audited((trx) => repo.updatePlate(id, input, trx), () => ({ userId: actorId, action: 'plate.update', objectType: 'plate', objectId: id, summary: `Changed plate ${input.code}`, before: existing, after: input }));
      return repo.getPlate(id);
    },
    async deletePlate(actorId: number, id: number) {
      const p = await this.getPlate(id);
      if (p.usedBy > 0) throw conflict(`Plate ${p.code} is used by ${p.usedBy} template(s) and cannot be deleted.`);
      await audit.audited((trx) => repo.deletePlate(id, trx), () => ({ userId: actorId, action: 'plate.delete', objectType: 'plate', objectId: id, summary: `Deleted plate ${p.code}`, before: p }));
    },

    listComponentsBody: (q: ListQuery & { kind?: string }, readStamp?: number) => repo.listComponentsBody(q, readStamp),
    async getComponent(id: number) {
      const c = await repo.getComponent(id);
      if (!c) throw notFound(`Component ${id}`);
      return c;
    },
    async createComponent(actorId: number, input: ComponentFields) {
      await naming.requireComponentNames(input);
      if (await repo.componentCodeTaken(input.code)) throw conflict(`A component with the code ${input.code} already exists; choose another code.`);
      const id = await audit.audited((trx) => repo.insertComponent(input, trx), (id) => ({ userId: actorId, action: 'component.create', objectType: 'component', objectId: id, summary: `Added component ${input.code} (${input.kind})`, after: { code: input.code, kind: input.kind, layer: input.layer } }));
      return repo.getComponent(id);
    },
    async updateComponent(actorId: number, id: number, input: ComponentFields) {
      const existing = await this.getComponent(id);
      await naming.requireComponentNames(input);
      if (await repo.componentCodeTaken(input.code, id)) throw conflict(`A component with the code ${input.code} already exists; choose another code.`);
      if (existing.usedBy > 0 && input.code !== existing.code) {
        throw conflict(`Component ${existing.code} is used by ${existing.usedBy} template version(s); its code cannot change.`);
      }
      const changed = (Object.keys(input) as (keyof ComponentFields)[]).filter((k) => JSON.stringify(input[k]) !== JSON.stringify((existing as Record<string, unknown>)[k]));
      await audit.audited((trx) => repo.updateComponent(id, input, trx), () => ({ userId: actorId, action: 'component.update', objectType: 'component', objectId: id, summary: `Changed component ${input.code}: ${changed.join(', ') || 'no fields'}`, before: Object.fromEntries(changed.map((k) => [k, (existing as Record<string, unknown>)[k]])), after: Object.fromEntries(changed.map((k) => [k, input[k]])) }));
      return repo.getComponent(id);
    },
    /** Stores an outline read from a DXF (already in the component's unit, origin at its primary dowel). */
    async setOutline(actorId: number, id: number, outline: Outline, file: { name: string; size: number; sha256: string; unit: string }) {
      const c = await this.getComponent(id);
      // Layer names may have been mapped since the file was read: the outline is checked as stored.
      const checked = OutlineSchema.safeParse(outline);
      if (!checked.success) throw validationError(checked.error, 'outline');
      await audit.audited((trx) => repo.setOutline(id, outline, file, trx), () => ({ userId: actorId, action: 'component.outline', objectType: 'component', objectId: id, summary: `Set the outline of ${c.code} from ${file.name} (${outline.paths.length} paths, ${outline.circles.length} circles)`, after: file }));
      return repo.getComponent(id);
    },
    async deleteComponent(actorId: number, id: number) {
      const c = await this.getComponent(id);
      if (c.usedBy > 0) throw conflict(`Component ${c.code} is used by ${c.usedBy} template version(s) and cannot be deleted.`);
      await audit.audited((trx) => repo.deleteComponent(id, trx), () => ({ userId: actorId, action: 'component.delete', objectType: 'component', objectId: id, summary: `Deleted component ${c.code}`, before: { code: c.code, kind: c.kind } }));
    },
  };
}
export type CatalogService = ReturnType<typeof catalogService>;
