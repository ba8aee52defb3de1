import { z } from 'zod';
import { CAN } from '../../shared/schemas/auth';
import { NamingCheckInputSchema, LayerRuleSchema, ComponentRuleSchema } from '../../shared/schemas/naming';
import { currentUser } from '../middleware/auth';
import type { NamingService } from '../services/naming';
import { parseOr400 } from './parse';
import type { RouteDef } from './route-table';

const SaveConventionSchema = z.object({ layer: LayerRuleSchema, component: ComponentRuleSchema });

export function namingRoutes(naming: NamingService): RouteDef[] {
  return [
    { method: 'get', path: '/naming/convention', access: 'signed-in', handler: async (_req, res) => {
      res.json(await naming.current());
    } },
    { method: 'put', path: '/naming/convention', access: CAN.editNaming, handler: async (req, res) => {
      const body = parseOr400(SaveConventionSchema, req.body, 'naming convention');
      res.json(await naming.save(body, currentUser(req).id));
    } },
    { method: 'get', path: '/naming/conventions', access: 'signed-in', handler: async (_req, res) => {
      const items = await naming.history();
      res.json({ items, total: items.length });
    } },
    { method: 'post', path: '/naming/check', access: 'signed-in', handler: async (req, res) => {
      const { target, name } = parseOr400(NamingCheckInputSchema, req.body, 'naming check');
      res.json(await naming.check(target, name));
    } },
  ];
}
