import nodemailer from 'nodemailer';
import type { Db } from '../db/client';
import type { Logger } from '../logger';
import { startMailCatcher, TEAM_HEADER } from './catcher';

export interface MailMessage {
  to: string | readonly string[];
  subject: string;
  text: string;
  /** The team the mail is about; files it for addressees who are not members of any team yet. */
  teamId?: string;
}

export interface Mailer {
  /** 'outbox': the in-process SMTP catcher of development and tests; 'smtp': a real server (SMTP_URL). */
  readonly kind: 'outbox' | 'smtp';
  /** Where the catcher keeps each message as an .eml file (outbox only). */
  readonly mailDir: string | undefined;
  /** Address the catcher listens on (outbox only). */
  readonly catcherAddress: { host: string; port: number } | undefined;
  send(message: MailMessage): Promise<void>;
  /** Wait for mail in flight, then stop the transport and the catcher. */
  close(): Promise<void>;
}

const recipients = (to: MailMessage['to']) => (typeof to === 'string' ? [to] : [...to]);

/**
 * Mail through nodemailer over SMTP. With an SMTP URL it talks to that server; without one it
 * starts the development catcher (server/mail/catcher.ts) on 127.0.0.1 and sends to it, so the
 * real SMTP path runs in development and tests too.
 */
export async function createMailer(opts: {
  db: Db;
  smtpUrl?: string | undefined;
  from: string;
  logger: Logger;
  /** Directory for the catcher's .eml files (DATA_DIR/mail); required without an SMTP URL. */
  mailDir?: string | undefined;
}): Promise<Mailer> {
  const inFlight = new Set<Promise<unknown>>();
  const track = <T>(p: Promise<T>): Promise<T> => {
    inFlight.add(p);
    const done = () => inFlight.delete(p);
    p.then(done, done);
    return p;
  };
  const drain = async () => {
    while (inFlight.size > 0) await Promise.allSettled([...inFlight]);
  };

  if (opts.smtpUrl) {
    const transport = nodemailer.createTransport(opts.smtpUrl);
    return {
      kind: 'smtp',
      mailDir: undefined,
      catcherAddress: undefined,
      async send(m) {
        const to = recipients(m.to);
        if (to.length === 0) return;
        await track(transport.sendMail({ from: opts.from, to, subject: m.subject, text: m.text }));
      },
      async close() {
        await drain();
        transport.close();
      },
    };
  }

  if (!opts.mailDir)
    throw new Error('createMailer: mailDir is required when no SMTP URL is configured');
  const catcher = await startMailCatcher({
    db: opts.db,
    mailDir: opts.mailDir,
    logger: opts.logger,
  });
  const transport = nodemailer.createTransport({
    host: catcher.host,
    port: catcher.port,
    secure: false,
    ignoreTLS: true,
    auth: catcher.auth,
    // Loopback: fail fast rather than hang a request when the catcher is gone.
    connectionTimeout: 5000,
    socketTimeout: 10_000,
  });
  let closed = false;
  return {
    kind: 'outbox',
    mailDir: catcher.mailDir,
    catcherAddress: { host: catcher.host, port: catcher.port },
    async send(m) {
      if (closed) throw new Error('the mailer is closed');
      const to = recipients(m.to);
      if (to.length === 0) return;
      await track(
        transport.sendMail({
          from: opts.from,
          to,
          subject: m.subject,
          text: m.text,
          ...(m.teamId ? { headers: { [TEAM_HEADER]: m.teamId } } : {}),
        }),
      );
    },
    async close() {
      closed = true;
      await drain();
      transport.close();
      await catcher.close();
    },
  };
}

/** Send without failing the caller: mail trouble is logged, the request still succeeds. */
export async function sendQuietly(
  mailer: Mailer,
  logger: Logger,
  message: MailMessage,
): Promise<void> {
  try {
    await mailer.send(message);
  } catch (err) {
    logger.warn(
      `mail to ${recipients(message.to).join(', ')} failed`,
      err instanceof Error ? err.message : err,
    );
  }
}

/** Send in the background (the caller answers at once; `mailer.close()` waits for it). */
export function sendInBackground(mailer: Mailer, logger: Logger, message: MailMessage): void {
  void sendQuietly(mailer, logger, message);
}
