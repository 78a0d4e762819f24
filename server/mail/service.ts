// Outgoing e-mail through nodemailer. Without SMTP_URL a local SMTP server on loopback receives
// the messages and stores them, so admins can read them at GET /api/admin/mail.
import type { AddressInfo } from 'node:net';
import nodemailer from 'nodemailer';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { Config } from '../config';
import type { Database } from '../db/connection';
import type { ListMailQuery } from '../../shared/api/admin';
import { findMail, insertMail, type MailRow } from './repository';

/** Sends notifications. */
export interface Mailer {
  /** Sends one message; failures are logged, never thrown (the state change already committed). */
  send(to: string[], subject: string, text: string): Promise<void>;
  /** Port of the local capture server, or null when SMTP_URL is used. */
  localPort: number | null;
  close(): Promise<void>;
}

/** Largest captured message (common practice, no source). */
const MAX_MESSAGE_BYTES = 1024 * 1024;

/**
 * Starts the local capture server on 127.0.0.1 (random port).
 * @param db - where messages are stored.
 * @param log - error log.
 * @returns the server and its port.
 */
async function startCaptureServer(db: Database, log: (m: string) => void): Promise<{ server: SMTPServer; port: number }> {
  const server = new SMTPServer({
    authOptional: true, disabledCommands: ['STARTTLS', 'AUTH'], size: MAX_MESSAGE_BYTES, logger: false, banner: 'Varsmith local mail capture',
    onData(stream, session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          const recipients = session.envelope.rcptTo.map((r) => r.address);
          const sender = session.envelope.mailFrom ? session.envelope.mailFrom.address : '';
          await db.write((t) => insertMail({ sender, recipients, subject: parsed.subject ?? '', text: parsed.text ?? '' }, t));
          callback();
        })
        .catch((err: Error) => { log(`mail capture failed: ${err.message}`); callback(err); });
    },
  });
  await new Promise<void>((resolve, reject) => { server.once('error', reject); server.listen(0, '127.0.0.1', () => resolve()); });
  return { server, port: ((server as unknown as { server: { address(): AddressInfo } }).server.address()).port };
}

/**
 * Creates the mailer: SMTP_URL when configured, else the local capture server.
 * @param config - configuration.
 * @param db - database (for captured mail).
 * @param log - error log.
 * @returns the mailer.
 */
export async function createMailer(config: Config, db: Database, log: (m: string) => void): Promise<Mailer> {
  let capture: { server: SMTPServer; port: number } | null = null;
  let transport;
  if (config.smtpUrl) transport = nodemailer.createTransport(config.smtpUrl);
  else {
    capture = await startCaptureServer(db, log);
    transport = nodemailer.createTransport({ host: '127.0.0.1', port: capture.port, secure: false, ignoreTLS: true });
  }
  return {
    localPort: capture?.port ?? null,
    async send(to, subject, text) {
      if (to.length === 0) return;
      try {
        await transport.sendMail({ from: config.mailFrom, to, subject, text });
      } catch (err) {
        log(`mail to ${to.join(', ')} failed: ${(err as Error).message}`);
      }
    },
    async close() {
      transport.close();
      if (capture) await new Promise<void>((resolve) => capture!.server.close(() => resolve()));
    },
  };
}

/**
 * Captured messages.
 * @param q - optional recipient filter and page.
 * @returns one page of rows, newest first, and how many match.
 */
export function capturedMail(q: ListMailQuery): Promise<{ rows: MailRow[]; total: number }> {
  return findMail(q);
}
