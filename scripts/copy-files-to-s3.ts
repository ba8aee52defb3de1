// `npm run copy-files-to-s3`: copies the DXF originals kept in GRIDSET_DATA_DIR (./data) into the bucket
// S3_URL names, before Gridset is started with S3_URL. Each file is read back and checked by SHA-256;
// files already in the bucket are left alone, so it can be run again.
import path from 'node:path';
import { ConfigError, s3SettingsOf } from '../server/config';
import { copyKeptFiles } from '../server/storage/copy-files';
import { localFileStore } from '../server/storage/local-store';
import { s3FileStore } from '../server/storage/s3-store';

try {
  const s3 = s3SettingsOf(process.env);
  if (!s3) throw new ConfigError('Set S3_URL (and S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY) to the bucket the files go to.');
  const from = localFileStore(path.resolve(process.env.GRIDSET_DATA_DIR ?? './data'));
  const to = s3FileStore(s3);
  await to.check();
  const r = await copyKeptFiles(from, to);
  console.log(`Copied ${r.copied} files (${r.bytes.toLocaleString('en-US')} bytes) from ${from.location} to ${to.location}; ${r.alreadyThere} were there already.`);
} catch (e) {
  console.error(`Copy stopped: ${e instanceof Error ? e.message : String(e)}`);
  process.exit(1);
}
