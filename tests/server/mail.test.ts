import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import request from 'supertest';
import { SMTPServer } from 'smtp-server';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { DEMO_PASSWORD } from '../../server/db/seed-demo';
import { createMailer } from '../../server/mail/mailer';
import { makeTestApp, tableCounts, type Agent, type TestApp } from './test-app';

let t: TestApp;
let admin: Agent;
// A fresh demo shop per test: the tests share rate limits (per address and per client) and the
// outbox, so each starts from none of another's mail.
beforeEach(async () => {
  t = await makeTestApp();
  admin = await t.agent('admin');
});
afterEach(async () => {
  await t.app.locals.whenIdle();
  // Nothing logged while mailing, checked after every test.
  const errors = [...t.errors];
  await t.close();
  expect(errors).toEqual([]);
});

const SPENT = 'This link has expired or was already used; ask for a new one.';
const HOUR_MS = 60 * 60 * 1000;

/** The .eml as a mail reader sees it: headers unfolded (RFC 5322 §2.2.3), body decoded (RFC 2045 §6.7). */
function parseEml(raw: string) {
  const split = raw.indexOf('\r\n\r\n');
  const headers: Record<string, string> = {};
  for (const line of raw.slice(0, split).replace(/\r\n[ \t]+/g, ' ').split('\r\n')) {
    const colon = line.indexOf(':');
    headers[line.slice(0, colon).trim().toLowerCase()] = line.slice(colon + 1).trim();
  }
  let body = raw.slice(split + 4);
  if (/quoted-printable/i.test(headers['content-transfer-encoding'] ?? '')) {
    body = Buffer.from(body.replace(/=\r\n/g, '').replace(/=([0-9A-F]{2})/gi, (_m, h: string) => String.fromCharCode(parseInt(h, 16))), 'latin1').toString('utf8');
  }
  return { headers, body: body.replace(/\r\n/g, '\n') };
}

const tokenIn = (text: string) => {
  const m = /\/set-password\?token=([A-Za-z0-9_-]+)/.exec(text);
  if (!m) throw new Error(`no set-password link in: ${text}`);
  return m[1]!;
};
const sha256 = (s: string) => createHash('sha256').update(s).digest('hex');

async function signIn(email: string, password: string) {
  const a = await t.agent();
  const res = await a.post('/api/auth/login', { email, password });
  return { status: res.status, agent: a };
}

async function latestMailTo(to: string) {
  const res = await admin.get(`/api/outbox?q=${encodeURIComponent(to)}`).expect(200);
  const mail = res.body.items.find((m: { to: string }) => m.to === to);
  if (!mail) throw new Error(`no mail to ${to}`);
  return mail as { id: number; to: string; subject: string; text: string; sentAt: string };
}

describe('invitations', () => {
  it('invites, mails a link kept as an .eml, sets the password once, and the user signs in', async () => {
    const res = await admin.post('/api/users/invite', { email: ' Mara.Quill@Example.com', name: 'Mara Quill', role: 'programmer' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email: 'mara.quill@example.com', name: 'Mara Quill', role: 'programmer', active: false, invited: true });
    expect(res.body.passwordHash).toBeUndefined();
    const row = await t.db('users').where({ email: 'mara.quill@example.com' }).first();
    expect(row).toMatchObject({ password_hash: null });
    expect(!!row.active).toBe(false);
    expect((await signIn('mara.quill@example.com', 'anything-at-all')).status).toBe(401);

    // The outbox answers the contract's field names, newest first.
    const outbox = await admin.get('/api/outbox').expect(200);
    expect(outbox.body.total).toBeGreaterThanOrEqual(1);
    const mail = outbox.body.items[0];
    expect(Object.keys(mail).sort()).toEqual(['id', 'sentAt', 'subject', 'text', 'to']);
    expect(mail).toMatchObject({ to: 'mara.quill@example.com', subject: 'Avery Admin invited you to Gridset' });
    expect(new Date(mail.sentAt).toISOString()).toBe(mail.sentAt);
    expect(mail.text).toContain('http://localhost:3000/set-password?token=');
    const token = tokenIn(mail.text);

    // Only the SHA-256 of the 32-byte token is stored (base64url of 32 bytes is 43 characters).
    expect(token).toHaveLength(43);
    expect(Buffer.from(token, 'base64url')).toHaveLength(32);
    const tokens = await t.db('user_tokens').where({ user_id: row.id });
    expect(tokens).toHaveLength(1);
    expect(tokens[0]).toMatchObject({ purpose: 'invite', token_hash: sha256(token), used_at: null });
    expect(JSON.stringify(tokens)).not.toContain(token);
    const weekMs = Date.parse(tokens[0].expires_at) - Date.now();
    expect(weekMs).toBeGreaterThan(7 * 24 * HOUR_MS - 60_000);
    expect(weekMs).toBeLessThanOrEqual(7 * 24 * HOUR_MS);

    // The same mail as a file a mail reader opens: <time>-<outbox id>.eml, CRLF line ends (RFC 5322 §2.1).
    const stored = await t.db('outbox').where({ id: mail.id }).first();
    expect(stored.eml_file).toMatch(new RegExp(`^\\d{8}T\\d{9}Z-${mail.id}\\.eml$`));
    const file = path.join(t.dataDir, 'outbox', stored.eml_file);
    expect(existsSync(file)).toBe(true);
    const raw = readFileSync(file, 'latin1');
    expect(raw.replace(/\r\n/g, '')).not.toMatch(/[\r\n]/);
    const eml = parseEml(raw);
    expect(eml.headers.to).toBe('mara.quill@example.com');
    expect(eml.headers.subject).toBe(mail.subject);
    expect(eml.headers.from).toBe('Gridset <gridset@localhost>');
    expect(eml.headers['message-id']).toMatch(/^<.+@.+>$/);
    expect(eml.body.trim()).toBe(mail.text.trim());
    expect(tokenIn(eml.body)).toBe(token);

    // A password the schema refuses writes nothing; the link still works afterwards.
    const anon = await t.agent();
    const weak = await anon.post('/api/auth/set-password', { token, password: 'short' });
    expect(weak.status).toBe(400);
    expect(weak.body.error.details.issues.map((i: { path: string }) => i.path)).toEqual(['password']);
    expect((await t.db('user_tokens').where({ user_id: row.id }).first()).used_at).toBeNull();

    const set = await anon.post('/api/auth/set-password', { token, password: 'quill-chooses-this' });
    expect(set.status).toBe(200);
    expect(set.body).toEqual({ ok: true, email: 'mara.quill@example.com' });
    const signedIn = await signIn('mara.quill@example.com', 'quill-chooses-this');
    expect(signedIn.status).toBe(200);
    const me = await signedIn.agent.get('/api/auth/me').expect(200);
    expect(me.body.user).toMatchObject({ email: 'mara.quill@example.com', role: 'programmer', active: true, invited: false });
    expect((await t.db('user_tokens').where({ user_id: row.id }).first()).used_at).not.toBeNull();

    const reuse = await anon.post('/api/auth/set-password', { token, password: 'someone-else-tries' });
    expect(reuse.status).toBe(400);
    expect(reuse.body.error).toEqual({ code: 'link-spent', message: SPENT, details: null });
    expect((await signIn('mara.quill@example.com', 'someone-else-tries')).status).toBe(401);
  });

  it('answers an unknown or malformed token with the same sentence', async () => {
    const anon = await t.agent();
    const unknown = await anon.post('/api/auth/set-password', { token: 'x'.repeat(43), password: 'long-enough-password' });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.message).toBe(SPENT);
    const missing = await anon.post('/api/auth/set-password', { password: 'long-enough-password' });
    expect(missing.status).toBe(400);
    expect(missing.body.error.details.issues[0]).toMatchObject({ path: 'token', message: 'The link is incomplete; open it again from the mail.' });
  });

  it('refuses bad input and an address already in use, and writes nothing', async () => {
    const before = await tableCounts(t.db, ['users', 'user_tokens', 'outbox']);
    const bad = await admin.post('/api/users/invite', { email: 'not-an-address', name: '', role: 'boss' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.issues.map((i: { path: string }) => i.path).sort()).toEqual(['email', 'name', 'role']);
    const taken = await admin.post('/api/users/invite', { email: 'lead@gridset.test', name: 'Another lead', role: 'lead' });
    expect(taken.status).toBe(409);
    expect(taken.body.error.message).toBe('A user with the address lead@gridset.test already exists.');
    expect(await tableCounts(t.db, ['users', 'user_tokens', 'outbox'])).toEqual(before);
    // Adding a user with a first password still works beside invitations.
    const added = await admin.post('/api/users', { email: 'first.password@example.com', name: 'First Password', role: 'operator', password: 'a-first-password' });
    expect(added.status).toBe(201);
    expect(added.body).toMatchObject({ active: true, invited: false });
    expect((await signIn('first.password@example.com', 'a-first-password')).status).toBe(200);
  });

  it('inviting a pending address again sends a new link, ends the old one and takes the new role', async () => {
    await admin.post('/api/users/invite', { email: 'twice@example.com', name: 'Twice', role: 'operator' }).expect(201);
    const first = tokenIn((await latestMailTo('twice@example.com')).text);
    const again = await admin.post('/api/users/invite', { email: 'twice@example.com', name: 'Twice Invited', role: 'reviewer' });
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ name: 'Twice Invited', role: 'reviewer', active: false, invited: true });
    const second = tokenIn((await latestMailTo('twice@example.com')).text);
    expect(second).not.toBe(first);
    const anon = await t.agent();
    expect((await anon.post('/api/auth/set-password', { token: first, password: 'twice-password-1' })).status).toBe(400);
    expect((await anon.post('/api/auth/set-password', { token: second, password: 'twice-password-2' })).status).toBe(200);
    expect((await signIn('twice@example.com', 'twice-password-2')).status).toBe(200);
    // Now that the password is set, the address is taken like any other.
    expect((await admin.post('/api/users/invite', { email: 'twice@example.com', name: 'Twice', role: 'operator' })).status).toBe(409);
  });

  it('keeps nothing when the invitation cannot be mailed', async () => {
    const failing = createApp({
      db: t.db, sessionSecret: 'test-secret', dataDir: t.dataDir, log: (e) => t.errors.push(e),
      mailer: { send: async () => { throw new Error('connection refused by the mail server'); } },
    });
    const http = request.agent(failing);
    let csrf = (await http.get('/api/auth/csrf').expect(200)).body.token;
    csrf = (await http.post('/api/auth/login').set('X-CSRF-Token', csrf).send({ email: 'admin@gridset.test', password: DEMO_PASSWORD }).expect(200)).body.csrfToken;
    const before = await tableCounts(t.db, ['users', 'user_tokens', 'outbox']);
    const res = await http.post('/api/users/invite').set('X-CSRF-Token', csrf).send({ email: 'unlucky@example.com', name: 'Unlucky', role: 'operator' });
    expect(res.status).toBe(502);
    expect(res.body.error.code).toBe('mail-failed');
    expect(res.body.error.message).toMatch(/connection refused by the mail server.*nothing was saved/);
    expect(await tableCounts(t.db, ['users', 'user_tokens', 'outbox'])).toEqual(before);
  });

  it('deactivating a user ends their unused links', async () => {
    const anon = await t.agent();
    await anon.post('/api/auth/forgot-password', { email: 'reviewer@gridset.test' }).expect(200);
    await t.app.locals.whenIdle();
    const token = tokenIn((await latestMailTo('reviewer@gridset.test')).text);
    const reviewer = await t.db('users').where({ email: 'reviewer@gridset.test' }).first();
    await admin.patch(`/api/users/${reviewer.id}`, { active: false }).expect(200);
    await admin.patch(`/api/users/${reviewer.id}`, { active: true }).expect(200);
    // Reactivated, yet the link from before the deactivation stays dead.
    expect((await anon.post('/api/auth/set-password', { token, password: 'back-door-attempt' })).body.error.message).toBe(SPENT);
    expect((await signIn('reviewer@gridset.test', DEMO_PASSWORD)).status).toBe(200);
  });

  it('lets only one of two simultaneous uses of a link through', async () => {
    await admin.post('/api/users/invite', { email: 'race@example.com', name: 'Race', role: 'operator' }).expect(201);
    const token = tokenIn((await latestMailTo('race@example.com')).text);
    const [a, b] = await Promise.all([t.agent(), t.agent()]);
    const answers = await Promise.all([
      a.post('/api/auth/set-password', { token, password: 'first-of-the-two' }),
      b.post('/api/auth/set-password', { token, password: 'second-of-the-two' }),
    ]);
    expect(answers.map((r) => r.status).sort()).toEqual([200, 400]);
    const winner = answers[0]!.status === 200 ? 'first-of-the-two' : 'second-of-the-two';
    const loser = winner === 'first-of-the-two' ? 'second-of-the-two' : 'first-of-the-two';
    expect((await signIn('race@example.com', winner)).status).toBe(200);
    expect((await signIn('race@example.com', loser)).status).toBe(401);
  });
});

describe('forgot password', () => {
  it('answers an unknown and a known address identically, and mails only the known one', async () => {
    const before = await t.db('outbox').count({ n: '*' }).first();
    const anon = await t.agent();
    const unknown = await anon.post('/api/auth/forgot-password', { email: 'nobody-here@example.com' });
    const known = await anon.post('/api/auth/forgot-password', { email: 'Operator@Gridset.test' });
    // An invited user who has not chosen a password yet is not active: no reset mail either.
    await admin.post('/api/users/invite', { email: 'pending@example.com', name: 'Pending', role: 'operator' }).expect(201);
    const pending = await anon.post('/api/auth/forgot-password', { email: 'pending@example.com' });
    await t.app.locals.whenIdle();
    for (const r of [unknown, known, pending]) {
      expect(r.status).toBe(200);
      expect(r.body).toEqual({ ok: true, message: 'If that address has an account, a link is on its way.' });
      expect(r.headers['content-length']).toBe(unknown.headers['content-length']);
    }
    const after = await t.db('outbox').where('id', '>', 0).orderBy('id');
    const added = after.slice(Number(before!.n));
    // The reset mail is sent after its answer, so it may be stored before or after the invitation.
    expect(added.map((m) => m.to).sort()).toEqual(['operator@gridset.test', 'pending@example.com']);
    expect(added.find((m) => m.to === 'operator@gridset.test')).toMatchObject({ subject: 'Reset your Gridset password' });
    expect(added.find((m) => m.to === 'pending@example.com')!.subject).not.toBe('Reset your Gridset password');
    expect(await t.db('user_tokens').join('users', 'users.id', 'user_tokens.user_id').where({ email: 'pending@example.com', purpose: 'reset' })).toHaveLength(0);
  });

  it('mails a reset link that works once, ends the old sessions, and expires after an hour', async () => {
    const old = await signIn('programmer@gridset.test', DEMO_PASSWORD);
    expect(old.status).toBe(200);
    const anon = await t.agent();
    const t0 = Date.now();
    await anon.post('/api/auth/forgot-password', { email: 'programmer@gridset.test' }).expect(200);
    await t.app.locals.whenIdle();
    const t1 = Date.now();
    const mail = await latestMailTo('programmer@gridset.test');
    expect(mail.text).toContain('within 1 hour');
    const token = tokenIn(mail.text);
    const row = await t.db('user_tokens').where({ token_hash: sha256(token) }).first();
    expect(row).toMatchObject({ purpose: 'reset', used_at: null });
    expect(Date.parse(row.expires_at)).toBeGreaterThanOrEqual(t0 + HOUR_MS);
    expect(Date.parse(row.expires_at)).toBeLessThanOrEqual(t1 + HOUR_MS);

    expect((await anon.post('/api/auth/set-password', { token, password: 'programmer-new-pass' })).status).toBe(200);
    expect((await old.agent.get('/api/auth/me')).status).toBe(401);
    expect((await signIn('programmer@gridset.test', DEMO_PASSWORD)).status).toBe(401);
    expect((await signIn('programmer@gridset.test', 'programmer-new-pass')).status).toBe(200);
    expect((await anon.post('/api/auth/set-password', { token, password: 'programmer-third-pass' })).body.error.message).toBe(SPENT);

    // A second link, an hour on: refused, and the password stays.
    await anon.post('/api/auth/forgot-password', { email: 'programmer@gridset.test' }).expect(200);
    await t.app.locals.whenIdle();
    const late = tokenIn((await latestMailTo('programmer@gridset.test')).text);
    expect(late).not.toBe(token);
    const issued = await t.db('user_tokens').where({ token_hash: sha256(late) }).first();
    await t.db('user_tokens').where({ id: issued.id }).update({ expires_at: new Date(Date.parse(issued.expires_at) - HOUR_MS).toISOString() });
    const expired = await anon.post('/api/auth/set-password', { token: late, password: 'too-late-password' });
    expect(expired.status).toBe(400);
    expect(expired.body.error).toEqual({ code: 'link-spent', message: SPENT, details: null });
    expect((await t.db('user_tokens').where({ id: issued.id }).first()).used_at).toBeNull();
    expect((await signIn('programmer@gridset.test', 'programmer-new-pass')).status).toBe(200);
  });

  it('takes five requests per address in 15 minutes, then 429, for known and unknown addresses alike', async () => {
    const before = await t.db('outbox').where({ to: 'lead@gridset.test' }).count({ n: '*' }).first();
    const anon = await t.agent();
    for (const email of ['lead@gridset.test', 'flood@example.com']) {
      for (let i = 0; i < 5; i++) expect((await anon.post('/api/auth/forgot-password', { email })).status).toBe(200);
      const refused = await anon.post('/api/auth/forgot-password', { email: email.toUpperCase() });
      expect(refused.status).toBe(429);
      expect(refused.body.error).toMatchObject({ code: 'too-many-requests', message: expect.stringMatching(/15 minutes/), details: null });
    }
    await t.app.locals.whenIdle();
    const after = await t.db('outbox').where({ to: 'lead@gridset.test' }).count({ n: '*' }).first();
    expect(Number(after!.n) - Number(before!.n)).toBe(5);
    expect((await anon.post('/api/auth/forgot-password', { email: 'someone-else@example.com' })).status).toBe(200);
  });
});

describe('outbox', () => {
  it('is for admins: 403 for other roles, 401 without a session', async () => {
    for (const role of ['lead', 'operator'] as const) {
      const res = await (await t.agent(role)).get('/api/outbox');
      expect(res.status).toBe(403);
      expect(res.body.error).toMatchObject({ code: 'forbidden', message: expect.any(String) });
    }
    expect((await request(t.app).get('/api/outbox')).status).toBe(401);
  });

  it('lists newest first, pages with limit and offset, and filters with q', async () => {
    // Mail of its own to list: two invitations and one reset, whatever else the outbox holds.
    await admin.post('/api/users/invite', { email: 'outbox.one@example.com', name: 'Outbox One', role: 'operator' }).expect(201);
    await admin.post('/api/users/invite', { email: 'outbox.two@example.com', name: 'Outbox Two', role: 'operator' }).expect(201);
    await (await t.agent()).post('/api/auth/forgot-password', { email: 'lead@gridset.test' }).expect(200);
    await t.app.locals.whenIdle();
    const all = (await admin.get('/api/outbox?limit=1000').expect(200)).body;
    expect(all.total).toBeGreaterThanOrEqual(3);
    expect(all.items.length).toBe(all.total);
    const times = all.items.map((m: { sentAt: string }) => m.sentAt);
    expect([...times].sort().reverse()).toEqual(times);
    const page = (await admin.get('/api/outbox?limit=2&offset=1').expect(200)).body;
    expect(page.items.map((m: { id: number }) => m.id)).toEqual(all.items.slice(1, 3).map((m: { id: number }) => m.id));
    expect(page.total).toBe(all.total);
    const q = (await admin.get('/api/outbox?q=Reset your').expect(200)).body;
    expect(q.total).toBeGreaterThan(0);
    expect(q.items.every((m: { subject: string }) => m.subject === 'Reset your Gridset password')).toBe(true);
    expect((await admin.get('/api/outbox?limit=0')).status).toBe(400);
  });
});

describe('mailer over SMTP', () => {
  /**
   * An SMTP receiver from the smtp-server package (an RFC 5321 server implementation), on a free
   * loopback port, keeping each message as delivered with its envelope. No TLS and no login: the
   * mailer is given `ignoreTLS` and no credentials, as for a relay on the shop's own network.
   */
  function smtpReceiver() {
    const received: { raw: string; from: string | false; to: string[] }[] = [];
    const server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS', 'AUTH'],
      logger: false,
      onData(stream, session, callback) {
        const chunks: Buffer[] = [];
        stream.on('data', (c: Buffer) => chunks.push(c));
        stream.on('end', () => {
          received.push({ raw: Buffer.concat(chunks).toString('latin1'), from: session.envelope.mailFrom && session.envelope.mailFrom.address, to: session.envelope.rcptTo.map((r) => r.address) });
          callback();
        });
      },
    });
    return { server, received };
  }

  it('delivers to the SMTP server, keeps a row without a file, and leaves the one-time link out of the kept copy', async () => {
    const { server, received } = smtpReceiver();
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    try {
      const port = (server.server.address() as AddressInfo).port;
      const mailer = createMailer({ db: t.db, smtpUrl: `smtp://127.0.0.1:${port}?ignoreTLS=true`, from: 'Shop <shop@example.com>' });
      // The outbox folder is made with the first mail kept as a file, which another test may or may not have sent.
      const outboxFiles = () => (existsSync(path.join(t.dataDir, 'outbox')) ? readdirSync(path.join(t.dataDir, 'outbox')).length : 0);
      const filesBefore = outboxFiles();
      const link = 'http://localhost:3000/set-password?token=secret-token-value';
      await mailer.send({ to: 'smtp.reader@example.com', subject: 'Over the wire', text: `Your link:\n${link}\nThanks.`, secrets: [link] });
      expect(received).toHaveLength(1);
      // The envelope (RFC 5321 §3.3, MAIL FROM and RCPT TO) names the sender and the one reader.
      expect(received[0]!.from).toBe('shop@example.com');
      expect(received[0]!.to).toEqual(['smtp.reader@example.com']);
      const delivered = parseEml(received[0]!.raw);
      expect(delivered.headers.to).toBe('smtp.reader@example.com');
      expect(delivered.headers.from).toBe('Shop <shop@example.com>');
      expect(delivered.body).toContain(link);
      const kept = await t.db('outbox').where({ to: 'smtp.reader@example.com' }).first();
      expect(kept).toMatchObject({ subject: 'Over the wire', text: 'Your link:\n[removed]\nThanks.', eml_file: null });
      expect(outboxFiles()).toBe(filesBefore);
    } finally {
      await new Promise<void>((resolve) => server.close(() => resolve()));
    }
  });
});
