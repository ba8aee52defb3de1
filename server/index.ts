import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { readConfig } from './config';
import { openDb, migrate } from './db/knex';
import { seedDemoDataIfEmpty } from './db/seed-demo';
import { createApp } from './app';
import { createMailer } from './mail/mailer';
import { sweepUploadTemp } from './middleware/upload';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

async function main() {
  const config = readConfig();
  sweepUploadTemp(config.dataDir);
  const db = openDb(config.databaseFile);
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
  });
  const server = app.listen(config.port, () => {
    console.log(`Gridset is serving http://localhost:${config.port} (data in ${config.dataDir})`);
    console.log(config.smtpUrl ? 'Mail goes out by SMTP (SMTP_URL).' : `Mail stays in the local outbox (${path.join(config.dataDir, 'outbox')}); admins read it under Outbox.`);
  });
  // Mails still being sent after their answer (password resets) finish before the database closes.
  const stop = () => server.close(() => app.locals.whenIdle().then(() => db.destroy()).then(() => process.exit(0)));
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
