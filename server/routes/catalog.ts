import { ComponentInputSchema, ComponentKindSchema, PlateInputSchema } from '../../shared/schemas/catalog';
import { IdParamSchema, ListQuerySchema } from '../../shared/schemas/common';
import { CAN } from '../../shared/schemas/auth';
import { currentUser } from '../middleware/auth';
import type { CatalogService } from '../services/catalog';
import { parseOr400 } from './parse';
import { sendRevalidated } from './conditional';
import { sessionCatalogStamp } from '../db/session-store';
import { jsonBody } from '../json-body';
import type { RouteDef } from './route-table';

const ComponentListQuerySchema = ListQuerySchema.extend({ kind: ComponentKindSchema.optional() });

export function catalogRoutes(catalog: CatalogService): RouteDef[] {
  const id = (params: unknown) => parseOr400(IdParamSchema, params, 'address').id;
  return [
    { method: 'get', path: '/plates', access: 'signed-in', handler: async (req, res) => {
      res.json(await catalog.listPlates(parseOr400(ListQuerySchema, req.query, 'query')));
    } },
    { method: 'post', path: '/plates', access: CAN.editCatalog, handler: async (req, res) => {
      res.status(201).json(await catalog.createPlate(currentUser(req).id, parseOr400(PlateInputSchema, req.body, 'plate')));
    } },
    { method: 'get', path: '/plates/:id', access: 'signed-in', handler: async (req, res) => {
      res.json(await catalog.getPlate(id(req.params)));
    } },
    { method: 'put', path: '/plates/:id', access: CAN.editCatalog, handler: async (req, res) => {
      const plateId = id(req.params);
      res.json(await catalog.updatePlate(currentUser(req).id, plateId, parseOr400(PlateInputSchema, req.body, 'plate')));
    } },
    { method: 'delete', path: '/plates/:id', access: CAN.deleteCatalog, handler: async (req, res) => {
      await catalog.deletePlate(currentUser(req).id, id(req.params));
      res.status(204).end();
    } },

    { method: 'get', path: '/components', access: 'signed-in', handler: async (req, res) => {
      // The catalog's stamp came with the session read: the kept page is checked against it, no second read.
      sendRevalidated(res, await catalog.listComponentsBody(parseOr400(ComponentListQuerySchema, req.query, 'query'), sessionCatalogStamp(req)));
    } },
    { method: 'post', path: '/components', access: CAN.editCatalog, handler: async (req, res) => {
      res.status(201).json(await catalog.createComponent(currentUser(req).id, parseOr400(ComponentInputSchema, req.body, 'component')));
    } },
    { method: 'get', path: '/components/:id', access: 'signed-in', handler: async (req, res) => {
      sendRevalidated(res, jsonBody(JSON.stringify(await catalog.getComponent(id(req.params)))));
    } },
    { method: 'put', path: '/components/:id', access: CAN.editCatalog, handler: async (req, res) => {
      const componentId = id(req.params);
      res.json(await catalog.updateComponent(currentUser(req).id, componentId, parseOr400(ComponentInputSchema, req.body, 'component')));
    } },
    { method: 'delete', path: '/components/:id', access: CAN.deleteCatalog, handler: async (req, res) => {
      await catalog.deleteComponent(currentUser(req).id, id(req.params));
      res.status(204).end();
    } },
  ];
}
