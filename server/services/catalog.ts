import type { ComponentFields, PlateFields } from '../../shared/schemas/catalog';
import type { ListQuery } from '../../shared/schemas/common';
import type { CatalogRepo } from '../db/catalog-repo';
import { conflict, notFound } from '../middleware/errors';
import type { NamingService } from './naming';

export function catalogService(repo: CatalogRepo, naming: NamingService) {
  return {
    listPlates: (q: ListQuery) => repo.listPlates(q),
    async getPlate(id: number) {
      const p = await repo.getPlate(id);
      if (!p) throw notFound(`Plate ${id}`);
      return p;
    },
    async createPlate(input: PlateFields) {
      if (await repo.plateCodeTaken(input.code)) throw conflict(`A plate with the code ${input.code} already exists; choose another code.`);
      return repo.getPlate(await repo.insertPlate(input));
    },
    async updatePlate(id: number, input: PlateFields) {
      const existing = await this.getPlate(id);
      if (await repo.plateCodeTaken(input.code, id)) throw conflict(`A plate with the code ${input.code} already exists; choose another code.`);
      if (existing.usedBy > 0 && (input.unit !== existing.unit || input.pitch !== existing.pitch)) {
        throw conflict(`Plate ${existing.code} is used by ${existing.usedBy} template(s); its unit and pitch cannot change. Add a new plate instead.`);
      }
      await repo.updatePlate(id, input);
      return repo.getPlate(id);
    },
    async deletePlate(id: number) {
      const p = await this.getPlate(id);
      if (p.usedBy > 0) throw conflict(`Plate ${p.code} is used by ${p.usedBy} template(s) and cannot be deleted.`);
      await repo.deletePlate(id);
    },

    listComponentsJson: (q: ListQuery & { kind?: string }) => repo.listComponentsJson(q),
    async getComponent(id: number) {
      const c = await repo.getComponent(id);
      if (!c) throw notFound(`Component ${id}`);
      return c;
    },
    async createComponent(input: ComponentFields) {
      await naming.requireComponentNames(input);
      if (await repo.componentCodeTaken(input.code)) throw conflict(`A component with the code ${input.code} already exists; choose another code.`);
      return repo.getComponent(await repo.insertComponent(input));
    },
    async updateComponent(id: number, input: ComponentFields) {
      const existing = await this.getComponent(id);
      await naming.requireComponentNames(input);
      if (await repo.componentCodeTaken(input.code, id)) throw conflict(`A component with the code ${input.code} already exists; choose another code.`);
      if (existing.usedBy > 0 && input.code !== existing.code) {
        throw conflict(`Component ${existing.code} is used by ${existing.usedBy} template version(s); its code cannot change.`);
      }
      await repo.updateComponent(id, input);
      return repo.getComponent(id);
    },
    async deleteComponent(id: number) {
      const c = await this.getComponent(id);
      if (c.usedBy > 0) throw conflict(`Component ${c.code} is used by ${c.usedBy} template version(s) and cannot be deleted.`);
      await repo.deleteComponent(id);
    },
  };
}
export type CatalogService = ReturnType<typeof catalogService>;
