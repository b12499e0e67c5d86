import fs from 'node:fs';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { eq, inArray, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { outbox, teamMembers, teams, user } from '../db/schema';
import type { Logger } from '../logger';
import { parseMail } from './mime';
import { redactOneUseLinks } from './redact';

/** Header the mailer adds when the sender names a team (used for addressees who belong to none yet). */
export const TEAM_HEADER = 'x-spoolwright-team';

export interface MailCatcher {
  readonly host: string;
  readonly port: number;
  /** Credentials the catcher accepts (random per start, so other local programs cannot post into the outbox). */
  readonly auth: { user: string; pass: string };
  readonly mailDir: string;
  close(): Promise<void>;
}

const LARGEST_MESSAGE = 2 * 1024 * 1024;
let sequence = 0;

/** A name that sorts by arrival: time, a counter, a random tail. */
function emlName(): string {
  sequence = (sequence + 1) % 1_000_000;
  return `${new Date().toISOString().replace(/[:.]/g, '-')}-${String(sequence).padStart(6, '0')}-${randomBytes(3).toString('hex')}.eml`;
}

/** Team of each addressee that is a member; the rest map to `fallback` (if that team exists) or null. */
async function teamsOf(
  db: Db,
  addresses: readonly string[],
  fallback: string | undefined,
): Promise<Map<string | null, string[]>> {
  const rows =
    addresses.length === 0
      ? []
      : await db
          .select({ email: user.email, teamId: teamMembers.teamId })
          .from(user)
          .innerJoin(teamMembers, eq(teamMembers.userId, user.id))
          .where(inArray(sql`lower(${user.email})`, [...addresses]));
  const byEmail = new Map(rows.map((r) => [r.email.toLowerCase(), r.teamId]));
  let fallbackTeam: string | null = null;
  if (fallback && addresses.some((a) => !byEmail.has(a))) {
    const [t] = await db
      .select({ id: teams.id })
      .from(teams)
      .where(eq(teams.id, fallback))
      .limit(1);
    fallbackTeam = t?.id ?? null;
  }
  const groups = new Map<string | null, string[]>();
  for (const a of addresses) {
    const team = byEmail.get(a) ?? fallbackTeam;
    groups.set(team, [...(groups.get(team) ?? []), a]);
  }
  return groups;
}

/**
 * The development mail server: smtp-server on 127.0.0.1 (random port). Each message is kept
 * whole as an .eml file in `mailDir` (the addressees' mailbox on this machine) and as outbox
 * rows, one per addressees' team, with one-use links redacted.
 */
export async function startMailCatcher(opts: {
  db: Db;
  mailDir: string;
  logger: Logger;
}): Promise<MailCatcher> {
  const { db, mailDir, logger } = opts;
  fs.mkdirSync(mailDir, { recursive: true });
  const auth = { user: 'spoolwright', pass: randomBytes(18).toString('base64url') };
  // Loaded only when there is no SMTP_URL.
  const { SMTPServer } = await import('smtp-server');
  const server = new SMTPServer({
    secure: false,
    disabledCommands: ['STARTTLS'],
    allowInsecureAuth: true,
    authMethods: ['PLAIN', 'LOGIN'],
    size: LARGEST_MESSAGE,
    banner: 'Spoolwright development mail catcher',
    closeTimeout: 1000,
    logger: false,
    onAuth(a, _session, cb) {
      if (a.username === auth.user && a.password === auth.pass) cb(null, { user: a.username });
      else cb(new Error('Invalid username or password'));
    },
    onData(stream, session, cb) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('error', (err) => cb(err));
      stream.on('end', () => {
        if ((stream as unknown as { sizeExceeded?: boolean }).sizeExceeded) {
          cb(Object.assign(new Error('Message too large'), { responseCode: 552 }));
          return;
        }
        const raw = Buffer.concat(chunks);
        const recipients = session.envelope.rcptTo.map((r) => r.address.toLowerCase());
        store(raw, recipients).then(
          () => cb(),
          (err: unknown) => {
            logger.error(
              'mail catcher could not store a message',
              err instanceof Error ? err.message : err,
            );
            cb(err instanceof Error ? err : new Error(String(err)));
          },
        );
      });
    },
  });

  async function store(raw: Buffer, recipients: string[]) {
    const file = path.join(mailDir, emlName());
    const tmp = `${file}.part`;
    await fs.promises.writeFile(tmp, raw, { mode: 0o600 });
    await fs.promises.rename(tmp, file);
    const mail = parseMail(raw);
    const text = redactOneUseLinks(mail.text);
    const subject = redactOneUseLinks(mail.subject);
    const groups = await teamsOf(db, recipients, mail.headers.get(TEAM_HEADER));
    for (const [teamId, to] of groups) {
      await db.insert(outbox).values({ teamId, to: to.join(', '), from: mail.from, subject, text });
    }
  }

  const host = '127.0.0.1';
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(0, host, () => {
      server.off('error', reject);
      resolve();
    });
  });
  server.on('error', (err) =>
    logger.warn('mail catcher', err instanceof Error ? err.message : err),
  );
  const port = (server.server.address() as AddressInfo).port;
  let closing: Promise<void> | undefined;
  return {
    host,
    port,
    auth,
    mailDir,
    close() {
      closing ??= new Promise<void>((resolve) => server.close(() => resolve()));
      return closing;
    },
  };
}
