// `npm run backup [-- --out FILE]`: one zip of the database (an online SQLite backup, or pg_dump's
// custom format when DATABASE_URL is set; both safe while the servers run) and the stored files,
// with a manifest of SHA-256s.
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import { createBackup } from '../server/backup/archive';
import { databaseUrlOf, s3SettingsOf } from '../server/config';
import { createFileStore } from '../server/storage/create-store';

const args = process.argv.slice(2);
const outAt = args.indexOf('--out');
const dataDir = path.resolve(process.env.GRIDSET_DATA_DIR ?? './data');
const out = outAt >= 0 && args[outAt + 1] ? path.resolve(args[outAt + 1]!) : path.resolve(`gridset-backup-${new Date().toISOString().replace(/[:.]/g, '-')}.zip`);
try {
  // The kept files come from where the server keeps them: the data folder, or the bucket S3_URL names.
  const files = createFileStore({ dataDir, s3: s3SettingsOf(process.env) });
  const { zip, manifest } = await createBackup(files, databaseUrlOf() ?? path.join(dataDir, 'gridset.sqlite'));
  writeFileSync(out, zip);
  console.log(`Backup written to ${out}: the database (schema ${manifest.schema ?? 'unknown'}) and ${manifest.files.length} stored files from ${files.location}, ${zip.length.toLocaleString('en-US')} bytes.`);
} catch (e) {
  console.error(`No backup written: ${e instanceof Error ? e.message : String(e)}`);
  process.exit(1);
}
