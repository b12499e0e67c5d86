import nodemailer from 'nodemailer';
import type { Db } from '../db/client';
import { outbox } from '../db/schema';
import type { Logger } from '../logger';

export interface MailMessage {
  to: string | readonly string[];
  subject: string;
  text: string;
}

export interface Mailer {
  /** 'outbox': development/test fake that stores messages; 'smtp': a real server (SMTP_URL). */
  readonly kind: 'outbox' | 'smtp';
  send(message: MailMessage): Promise<void>;
}

const recipients = (to: MailMessage['to']) => (typeof to === 'string' ? [to] : [...to]);

/**
 * Mail through nodemailer. With an SMTP URL it talks to that server; without one the message
 * is rendered by nodemailer's stream transport and stored in the `outbox` table, where admins
 * can read it (GET /api/admin/outbox).
 */
export function createMailer(opts: { db: Db; smtpUrl?: string | undefined; from: string; logger: Logger }): Mailer {
  if (opts.smtpUrl) {
    const transport = nodemailer.createTransport(opts.smtpUrl);
    return {
      kind: 'smtp',
      async send(m) {
        await transport.sendMail({ from: opts.from, to: recipients(m.to), subject: m.subject, text: m.text });
      },
    };
  }
  const transport = nodemailer.createTransport({ streamTransport: true, buffer: true, newline: 'unix' });
  return {
    kind: 'outbox',
    async send(m) {
      const to = recipients(m.to);
      if (to.length === 0) return;
      const info = await transport.sendMail({ from: opts.from, to, subject: m.subject, text: m.text });
      const raw = Buffer.isBuffer(info.message) ? info.message.toString('utf8') : String(info.message);
      await opts.db.insert(outbox).values({ to: to.join(', '), from: opts.from, subject: m.subject, text: m.text, raw });
    },
  };
}

/** Send without failing the caller: mail trouble is logged, the request still succeeds. */
export async function sendQuietly(mailer: Mailer, logger: Logger, message: MailMessage): Promise<void> {
  try {
    await mailer.send(message);
  } catch (err) {
    logger.warn(`mail to ${recipients(message.to).join(', ')} failed`, err instanceof Error ? err.message : err);
  }
}
