// `npm run backup [-- --out FILE]`: one zip of the database (an online SQLite backup, safe while the
// server runs) and the stored files, with a manifest of SHA-256s. SQLite only: back PostgreSQL up with pg_dump.
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import { createBackup } from '../server/backup/archive';

const args = process.argv.slice(2);
const outAt = args.indexOf('--out');
if (process.env.DATABASE_URL) {
  console.error('DATABASE_URL is set: this command backs up the SQLite database only; back PostgreSQL up with pg_dump and copy the data folder.');
  process.exit(1);
}
const dataDir = path.resolve(process.env.GRIDSET_DATA_DIR ?? './data');
const out = outAt >= 0 && args[outAt + 1] ? path.resolve(args[outAt + 1]!) : path.resolve(`gridset-backup-${new Date().toISOString().replace(/[:.]/g, '-')}.zip`);
try {
  const { zip, manifest } = await createBackup(dataDir, path.join(dataDir, 'gridset.sqlite'));
  writeFileSync(out, zip);
  console.log(`Backup written to ${out}: the database (schema ${manifest.schema ?? 'unknown'}) and ${manifest.files.length} stored files, ${zip.length.toLocaleString('en-US')} bytes.`);
} catch (e) {
  console.error(`No backup written: ${e instanceof Error ? e.message : String(e)}`);
  process.exit(1);
}
