import { CAN } from '../../shared/schemas/auth';
import { ShopSettingsSchema } from '../../shared/schemas/settings';
import type { SettingsRepo } from '../db/settings-repo';
import type { AuditRepo } from '../db/audit-repo';
import { currentUser } from '../middleware/auth';
import { HttpError } from '../middleware/errors';
import { parseOr400 } from './parse';
import { BackupTooLarge, createBackup } from '../backup/archive';
import type { FileStore } from '../storage/file-store';
import type { RouteDef } from './route-table';

export function settingsRoutes(settings: SettingsRepo, audit: AuditRepo, backup: { files: FileStore; database: string }): RouteDef[] {
  return [
    // An admin takes the whole shop home: the database and the stored files, in one checked archive.
    { method: 'get', path: '/admin/backup', access: CAN.backups, handler: async (req, res) => {
      const { zip, manifest } = await createBackup(backup.files, backup.database).catch((e: unknown) => {
        throw e instanceof BackupTooLarge ? new HttpError(409, 'backup-too-large', e.message) : e;
      });
      await audit.audited(async () => manifest, (m) => ({ userId: currentUser(req).id, action: 'backup.download', objectType: 'backup', objectId: m.createdAt, summary: `Downloaded a backup: the database and ${m.files.length} stored files${m.storage?.kind === 's3' ? ' from object storage' : ''}` }));
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
