import { CAN } from '../../shared/schemas/auth';
import { NamingCheckInputSchema, SaveConventionInputSchema } from '../../shared/schemas/naming';
import { currentUser } from '../middleware/auth';
import type { NamingService } from '../services/naming';
import { parseOr400 } from './parse';
import type { RouteDef } from './route-table';

export function namingRoutes(naming: NamingService): RouteDef[] {
  return [
    { method: 'get', path: '/naming/convention', access: 'signed-in', handler: async (_req, res) => {
      res.json(await naming.current());
    } },
    { method: 'put', path: '/naming/convention', access: CAN.editNaming, handler: async (req, res) => {
      const { revision, ...rules } = parseOr400(SaveConventionInputSchema, req.body, 'naming convention');
      res.json(await naming.save(rules, currentUser(req).id, revision));
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
