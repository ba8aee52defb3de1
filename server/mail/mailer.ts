import nodemailer from 'nodemailer';
import type { Db } from '../db/knex';
import { outboxRepo } from '../db/outbox-repo';
import type { FileStore } from '../storage/file-store';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  /**
   * Parts of the text (a one-time link) that must reach the reader but not be kept: when the mail
   * leaves by SMTP, the outbox copy shows "[removed]" in their place. The local outbox is itself
   * the delivery, so there they stay.
   */
  secrets?: string[];
}

/** What other services call to send a plain-text mail; it resolves once the mail is delivered and recorded. */
export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
}

export interface MailerOptions {
  db: Db;
  /**
   * Where each locally kept mail is also written as an .eml file (key `outbox/<time>-<id>.eml`): the
   * data folder's store. Omitted (as with S3 storage, where processes share no folder) the database
   * row is the whole outbox; admins read the outbox from the database either way.
   */
  emlFiles?: FileStore;
  /** smtp:// or smtps:// URL; without it mail stays in the local outbox. */
  smtpUrl?: string;
  from?: string;
}

export const DEFAULT_FROM = 'Gridset <gridset@localhost>';

/** Compact UTC time for file names: 20261201T093012345Z (no colons, so it is a valid name everywhere). */
const fileStamp = (d: Date) => d.toISOString().replace(/[-:.]/g, '');

/**
 * Without SMTP_URL, nodemailer's stream transport builds the message and Gridset keeps it: a row in
 * `outbox` and, when `emlFiles` is given, an .eml file (RFC 5322, CRLF line ends) at outbox/<time>-<outbox
 * id>.eml in that store. With SMTP_URL the message goes to that server and the row is still kept.
 * Never call send() inside a database transaction: it writes through the app's only connection.
 */
export function createMailer(opts: MailerOptions): Mailer {
  const outbox = outboxRepo(opts.db);
  const from = opts.from ?? DEFAULT_FROM;
  const emlFiles = opts.emlFiles;

  if (opts.smtpUrl) {
    const smtp = nodemailer.createTransport(opts.smtpUrl);
    return {
      async send(mail) {
        await smtp.sendMail({ from, to: mail.to, subject: mail.subject, text: mail.text });
        let kept = mail.text;
        for (const s of mail.secrets ?? []) if (s) kept = kept.split(s).join('[removed]');
        await outbox.insert({ to: mail.to, subject: mail.subject, text: kept, sentAt: new Date().toISOString(), emlFile: null });
      },
    };
  }

  // RFC 5322 section 2.1: lines end in CRLF.
  const local = nodemailer.createTransport({ streamTransport: true, buffer: true, newline: 'windows' });
  return {
    async send(mail) {
      const info = await local.sendMail({ from, to: mail.to, subject: mail.subject, text: mail.text });
      const message = info.message;
      if (!Buffer.isBuffer(message)) throw new Error('The stream transport did not hand back the message as a buffer.');
      const sentAt = new Date();
      const row = { to: mail.to, subject: mail.subject, text: mail.text, sentAt: sentAt.toISOString(), emlFile: null };
      if (!emlFiles) {
        await outbox.insert(row);
        return;
      }
      // The row and the file together: a failed write leaves no row pointing at nothing.
      await opts.db.transaction(async (trx) => {
        const id = await outbox.insert(row, trx);
        const file = `${fileStamp(sentAt)}-${id}.eml`;
        await emlFiles.put(`outbox/${file}`, message, { contentType: 'message/rfc822' });
        await outbox.setFile(id, file, trx);
      });
    },
  };
}
