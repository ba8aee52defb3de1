// `npm run add-admin -- EMAIL "NAME"`: the first admin of a database started with GRIDSET_DEMO=0.
// Prints the link to choose a password (valid 7 days); that admin then invites everyone else.
import { z } from 'zod';
import { readConfig } from '../server/config';
import { migrate, openDb } from '../server/db/knex';
import { usersRepo } from '../server/db/users-repo';
import { userTokensRepo } from '../server/db/user-tokens-repo';
import { auditRepo } from '../server/db/audit-repo';
import { createMailer } from '../server/mail/mailer';
import { accountLinksService } from '../server/services/account-links';
import { InviteUserInputSchema } from '../shared/schemas/auth';

const [email, name] = process.argv.slice(2);
if (!email || !name) {
  console.error('Give the admin\'s e-mail address and name: npm run add-admin -- you@your-shop.example "Your Name"');
  process.exit(1);
}
const parsed = InviteUserInputSchema.pick({ email: true, name: true }).safeParse({ email, name });
if (!parsed.success) {
  console.error(`Give the admin's e-mail address and name: npm run add-admin -- you@your-shop.example "Your Name" (${z.prettifyError(parsed.error).split('\n').join(' ')})`);
  process.exit(1);
}
const config = readConfig();
const db = openDb(config.database);
try {
  await migrate(db);
  const links = accountLinksService({
    db, users: usersRepo(db), tokens: userTokensRepo(db), audit: auditRepo(db),
    mailer: createMailer({ db, smtpUrl: config.smtpUrl, from: config.mailFrom }),
    publicUrl: config.publicUrl, log: console.error,
  });
  const { user, link } = await links.firstAdmin(parsed.data);
  console.log(`${user.email} is invited as the admin. Open this link within 7 days to choose a password (it works once):\n${link}`);
} catch (e) {
  console.error(`No admin added: ${e instanceof Error ? e.message : String(e)}`);
  process.exitCode = 1;
} finally {
  await db.destroy();
}
