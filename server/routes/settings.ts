import { CAN } from '../../shared/schemas/auth';
import { ShopSettingsSchema } from '../../shared/schemas/settings';
import type { SettingsRepo } from '../db/settings-repo';
import type { AuditRepo } from '../db/audit-repo';
import { currentUser } from '../middleware/auth';
import { parseOr400 } from './parse';
import { createBackup } from '../backup/archive';
import type { RouteDef } from './route-table';

export function settingsRoutes(settings: SettingsRepo, audit: AuditRepo, backup: { dataDir: string; database: string }): RouteDef[] {
  return [
    // An admin takes the whole shop home: the database and the stored files, in one checked archive.
    { method: 'get', path: '/admin/backup', access: CAN.backups, handler: async (req, res) => {
      const { zip, manifest } = await createBackup(backup.dataDir, backup.database);
      await audit.audited(async () => manifest, (m) => ({ userId: currentUser(req).id, action: 'backup.download', objectType: 'backup', objectId: m.createdAt, summary: `Downloaded a backup: the database and ${m.files.length} stored files` }));
      res.attachment(`gridset-backup-${manifest.createdAt.replace(/[:.]/g, '-')}.zip`).type('application/zip').send(zip);
    } },
    { method: 'get', path: '/settings', access: 'signed-in', handler: async (_req, res) => {
      res.json(await settings.get());
    } },
    { method: 'put', path: '/settings', access: CAN.editSettings, handler: async (req, res) => {
      const before = await settings.get();
      const input = parseOr400(ShopSettingsSchema, req.body, 'shop settings');
      res.json(await audit.audited((trx) => settings.put(input, trx), (saved) => ({ userId: currentUser(req).id, action: 'settings.save', objectType: 'settings', objectId: 'shop', summary: 'Changed the shop settings', before, after: saved })));
    } },
  ];
}
