// For the knex command line: `NODE_OPTIONS="--import tsx" npx knex migrate:latest` migrates the
// database the server would open (DATABASE_URL, else the SQLite file in GRIDSET_DATA_DIR), with
// the same statically imported migration list the server runs.
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { databaseUrlOf } from './server/config';
import { dbConfig } from './server/db/knex';

function target(): string {
  const url = databaseUrlOf(process.env);
  if (url) return url;
  const dataDir = path.resolve(process.env.GRIDSET_DATA_DIR ?? './data');
  mkdirSync(dataDir, { recursive: true });
  return path.join(dataDir, 'gridset.sqlite');
}

export default dbConfig(target());
