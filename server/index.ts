import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { ConfigError, readConfig } from './config';
import { openDb, migrate } from './db/knex';
import { seedDemoDataIfEmpty } from './db/seed-demo';
import { oneProcessAtATime } from './db/dialect';
import { usersRepo } from './db/users-repo';
import { createApp } from './app';
import { createMailer } from './mail/mailer';
import { sweepUploadTemp } from './middleware/upload';
import { createFileStore } from './storage/create-store';
import { StoreError } from './storage/file-store';
import { sharedWorkerPool } from './workers/pool';
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { listenOn, PortTakenError } from './listen';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

async function main() {
  const config = readConfig();
  // The port first: a second start on a taken port says so and stops before it touches the data
  // folder (sweeping another process's uploads) or the database. Until the app is ready, the
  // port answers 503.
  const server = createServer((_req, res) => {
    res.writeHead(503, { 'Content-Type': 'text/plain; charset=utf-8', 'Retry-After': '2' });
    res.end('Gridset is starting; try again in a moment.\n');
  });
  await listenOn(server, config.port);
  sweepUploadTemp(config.dataDir);
  const files = createFileStore(config);
  await files.check();
  const db = openDb(config.database);
  await migrate(db);
  // Processes starting together on one PostgreSQL database load the demo shop once between them.
  const seeded = config.demo && (await oneProcessAtATime(db, () => seedDemoDataIfEmpty(db)));
  if (seeded) console.log('New database: demo data loaded (demo accounts use the password gridset-demo).');
  if (!config.demo && (await usersRepo(db).countActiveAdmins()) === 0) {
    console.log('No admin yet: run `npm run add-admin -- you@your-shop.example "Your Name"` on this server for the link to choose a password.');
  }
  const app = createApp({
    db,
    sessionSecret: config.sessionSecret,
    dataDir: config.dataDir,
    files,
    clientDir: path.join(root, 'dist'),
    uploadLimitBytes: config.uploadLimitBytes,
    // The .eml copies are for someone at the server's own folder; with S3 the database rows are the outbox.
    mailer: createMailer({ db, emlFiles: files.kind === 'local' ? files : undefined, smtpUrl: config.smtpUrl, from: config.mailFrom }),
    publicUrl: config.publicUrl,
    https: config.https,
    trustProxy: config.trustProxy,
    workers: sharedWorkerPool(config.workers),
  });
  server.removeAllListeners('request');
  server.on('request', app);
  {
    const port = (server.address() as AddressInfo).port;
    console.log(`Gridset is serving http://localhost:${port} (data in ${config.dataDir}${config.databaseUrl ? ', database on PostgreSQL (DATABASE_URL)' : ''})`);
    console.log(`Kept files (DXF originals) are in ${files.kind === 's3' ? `object storage, ${files.location} (S3_URL)` : files.location}.`);
    console.log(config.smtpUrl ? 'Mail goes out by SMTP (SMTP_URL).' : files.kind === 's3' ? 'Mail stays in the outbox in the database; admins read it under Outbox.' : `Mail stays in the local outbox (${path.join(config.dataDir, 'outbox')}); admins read it under Outbox.`);
  }
  server.on('error', (err: NodeJS.ErrnoException) => console.error(`Gridset's listening socket failed: ${err.message}`));
  // A request's error is answered by the error handler; one that escapes it (a promise no one awaited)
  // is logged, and the server goes on serving the others rather than ending for everyone.
  process.on('unhandledRejection', (reason) => console.error('Unhandled rejection (the server goes on):', reason));
  // Mails still being sent after their answer (password resets) and files being read on the worker
  // threads finish before the database closes.
  const stop = () => server.close(() => app.locals.close().then(() => db.destroy()).then(() => process.exit(0)));
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

main().catch((err: NodeJS.ErrnoException) => {
  if (err instanceof PortTakenError) {
    console.error(err.message);
    process.exit(1);
  }
  // A data folder the server cannot write is said in one line, not as a stack.
  if (err instanceof StoreError) {
    console.error(`Gridset cannot start: ${err.message}`);
    process.exit(1);
  }
  if (err instanceof ConfigError) {
    console.error(`Gridset cannot start: ${err.message}`);
    process.exit(1);
  }
  // A PostgreSQL server that cannot be reached or refuses the sign-in (node-postgres errors; SQLSTATE 28P01, 3D000).
  if (['ECONNREFUSED', 'ENOTFOUND', 'ETIMEDOUT', 'EAI_AGAIN', '28P01', '28000', '3D000'].includes(String(err?.code))) {
    console.error(`Gridset cannot start: the database in DATABASE_URL cannot be used (${err.message}). Check the URL, that PostgreSQL is running, and the user's password.`);
    process.exit(1);
  }
  const folder = ['EACCES', 'EROFS', 'ENOSPC', 'EPERM', 'ENOTDIR', 'SQLITE_CANTOPEN', 'SQLITE_READONLY'].includes(String(err?.code));
  console.error(folder ? `Gridset cannot start: its data folder cannot be written (${err.message}). Check GRIDSET_DATA_DIR and its permissions and free space.` : err);
  process.exit(1);
});
