import { CAN } from '../../shared/schemas/auth';
import { ShopSettingsSchema } from '../../shared/schemas/settings';
import type { SettingsRepo } from '../db/settings-repo';
import { parseOr400 } from './parse';
import type { RouteDef } from './route-table';

export function settingsRoutes(settings: SettingsRepo): RouteDef[] {
  return [
    { method: 'get', path: '/settings', access: 'signed-in', handler: async (_req, res) => {
      res.json(await settings.get());
    } },
    { method: 'put', path: '/settings', access: CAN.editSettings, handler: async (req, res) => {
      res.json(await settings.put(parseOr400(ShopSettingsSchema, req.body, 'shop settings')));
    } },
  ];
}
