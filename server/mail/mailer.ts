// Outgoing e-mail: nodemailer's SMTP transport to SMTP_URL, or, when SMTP_URL is unset, to the
// built-in fake SMTP server (started on the first message or by start(), stopped by stop()). Either
// way the message goes through nodemailer → SMTP, so tests exercise what production runs.
import nodemailer from 'nodemailer';
import type { Logger } from 'pino';
import type { Db } from '../db/index.js';
import { startFakeSmtp, type FakeSmtpServer } from './fakeSmtp.js';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
}

export interface Mailer {
  /** Sends one message; rejects with the transport's reason when the server refuses it. */
  send(mail: OutgoingMail): Promise<void>;
  /** Starts the fake SMTP server when there is no SMTP_URL (idempotent; send() calls it too). */
  start(): Promise<void>;
  /** Closes the transport and the fake server; a later send() starts them again. */
  stop(): Promise<void>;
  /** For GET /api/health: 'fake smtp on 127.0.0.1:<port>', 'fake smtp (starts with the first message)', 'smtp' or 'error: …'. */
  status(): string;
}

export interface MailerOptions {
  db: Db;
  smtpUrl?: string;
  /** MAIL_FROM; a real relay usually accepts only its own domain's addresses. */
  from?: string;
  logger: Logger;
}

type Transport = ReturnType<typeof nodemailer.createTransport>;

/** .invalid is reserved for addresses that must never resolve (RFC 2606 §2). */
export const defaultMailFrom = 'Orbitab <no-reply@orbitab.invalid>';

export function createMailer({ db, smtpUrl, from = defaultMailFrom, logger }: MailerOptions): Mailer {
  let fake: FakeSmtpServer | null = null;
  let transport: Transport | null = null;
  let starting: Promise<Transport> | null = null;
  let lastError: string | null = null;

  async function open(): Promise<Transport> {
    if (smtpUrl) return nodemailer.createTransport(smtpUrl);
    fake = await startFakeSmtp(db, (err) => logger.error({ err }, 'fake SMTP server failed'));
    logger.info({ port: fake.port }, 'fake SMTP server (dev inbox) listening');
    // Nothing to encrypt on the loopback interface; ignoreTLS keeps nodemailer from asking for STARTTLS.
    return nodemailer.createTransport({ host: fake.host, port: fake.port, secure: false, ignoreTLS: true });
  }

  function ready(): Promise<Transport> {
    if (transport) return Promise.resolve(transport);
    starting ??= open().then(
      (t) => {
        transport = t;
        starting = null;
        lastError = null;
        return t;
      },
      (err: Error) => {
        starting = null;
        lastError = `could not start the fake SMTP server: ${err.message}`;
        throw err;
      },
    );
    return starting;
  }

  return {
    async send(mail) {
      const t = await ready();
      try {
        await t.sendMail({ from, to: mail.to, subject: mail.subject, text: mail.text });
        lastError = null;
        // With the dev inbox nobody receives the mail, so its links go to the log too, where the
        // person running the server can open them.
        if (!smtpUrl) logger.info({ to: mail.to, subject: mail.subject, links: mail.text.match(/https?:\/\/\S+/g) ?? [] }, 'dev inbox message');
      } catch (err) {
        lastError = (err as Error).message;
        logger.warn({ err, to: mail.to }, 'e-mail not sent');
        throw err;
      }
    },
    async start() {
      await ready();
    },
    async stop() {
      await starting?.catch(() => undefined);
      transport?.close();
      transport = null;
      const server = fake;
      fake = null;
      await server?.close();
    },
    status() {
      if (lastError) return `error: ${lastError}`;
      if (smtpUrl) return 'smtp';
      return fake ? `fake smtp on ${fake.host}:${fake.port}` : 'fake smtp (starts with the first message)';
    },
  };
}
