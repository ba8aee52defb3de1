// `npm run restore -- FILE [--force]`: restores a backup into GRIDSET_DATA_DIR (./data), which must not
// be served while it runs. Every file's SHA-256 is checked first; nothing is written when one differs.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { restoreBackup } from '../server/backup/archive';
import { databaseUrlOf, s3SettingsOf } from '../server/config';
import { createFileStore } from '../server/storage/create-store';

const args = process.argv.slice(2);
const file = args.find((a) => !a.startsWith('--'));
if (!file) {
  console.error('Name the backup to restore: npm run restore -- gridset-backup-….zip [--force]');
  process.exit(1);
}
const dataDir = path.resolve(process.env.GRIDSET_DATA_DIR ?? './data');
try {
  // The kept files go where the server will look for them: the data folder, or the bucket S3_URL names.
  const files = createFileStore({ dataDir, s3: s3SettingsOf(process.env) });
  const manifest = await restoreBackup(readFileSync(file), dataDir, { force: args.includes('--force'), files, databaseUrl: databaseUrlOf() });
  console.log(`Restored the backup of ${manifest.createdAt} into ${dataDir}: the database, and ${manifest.files.length} stored files into ${files.location}. Start Gridset as usual; it migrates the database if it is older.`);
} catch (e) {
  console.error(`Nothing restored: ${e instanceof Error ? e.message : String(e)}`);
  process.exit(1);
}
