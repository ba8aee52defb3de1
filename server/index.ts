import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { ConfigError, readConfig } from './config';
import { openDb, migrate } from './db/knex';
import { seedDemoDataIfEmpty } from './db/seed-demo';
import { createApp } from './app';
import { createMailer } from './mail/mailer';
import { sweepUploadTemp } from './middleware/upload';
import { sharedWorkerPool } from './workers/pool';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

async function main() {
  const config = readConfig();
  sweepUploadTemp(config.dataDir);
  const db = openDb(config.database);
  await migrate(db);
  const seeded = await seedDemoDataIfEmpty(db);
  if (seeded) console.log('New database: demo data loaded (demo accounts use the password gridset-demo).');
  const app = createApp({
    db,
    sessionSecret: config.sessionSecret,
    dataDir: config.dataDir,
    clientDir: path.join(root, 'dist'),
    uploadLimitBytes: config.uploadLimitBytes,
    mailer: createMailer({ db, dataDir: config.dataDir, smtpUrl: config.smtpUrl, from: config.mailFrom }),
    publicUrl: config.publicUrl,
    https: config.https,
    trustProxy: config.trustProxy,
    workers: sharedWorkerPool(config.workers),
  });
  // Express 5 calls this back with the error too when the port cannot be had; 'error' below says it.
  const server = app.listen(config.port, (err?: Error) => {
    if (err) return;
    console.log(`Gridset is serving http://localhost:${config.port} (data in ${config.dataDir}${config.databaseUrl ? ', database on PostgreSQL (DATABASE_URL)' : ''})`);
    console.log(config.smtpUrl ? 'Mail goes out by SMTP (SMTP_URL).' : `Mail stays in the local outbox (${path.join(config.dataDir, 'outbox')}); admins read it under Outbox.`);
  });
  server.on('error', (err: NodeJS.ErrnoException) => {
    console.error(err.code === 'EADDRINUSE'
      ? `Gridset cannot start: port ${config.port} is taken by another program (another Gridset?). Stop it, or start with PORT=<another port>.`
      : `Gridset cannot start: ${err.message}`);
    process.exit(1);
  });
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
  // A data folder the server cannot write is said in one line, not as a stack.
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
