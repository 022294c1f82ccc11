/**
 * A local SMTP server that accepts every message and keeps it, for development and tests: the stand-in
 * for a real mail service. Built on smtp-server (plain SMTP on loopback: no TLS, no authentication) and
 * mailparser. Each message is kept in memory (for tests: `waitForMessage`) and, when `mailboxDir` is
 * given, written there as JSON, where the development-only mailbox page reads it.
 *
 * Started by `npm start` in development and by the API tests that send mail. Never used in production.
 */
import { simpleParser, type AddressObject } from 'mailparser';
import { randomUUID } from 'node:crypto';
import { mkdirSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { SMTPServer } from 'smtp-server';
import type { MailboxMessage } from '#shared/schemas/accounts.ts';

export interface CaughtMessage extends MailboxMessage {
  html: string | null;
}

export interface SmtpCatcher {
  host: string;
  port: number;
  /** Everything received since start (or the last clear), oldest first. */
  readonly messages: CaughtMessage[];
  /** Resolves with the first message (already received or arriving within `timeoutMs`) that matches. */
  waitForMessage(match: (m: CaughtMessage) => boolean, timeoutMs?: number): Promise<CaughtMessage>;
  clear(): void;
  close(): Promise<void>;
}

/** The most messages kept in `mailboxDir`; older ones are deleted. */
const KEEP_ON_DISK = 200;

const addresses = (field: AddressObject | AddressObject[] | undefined) =>
  (Array.isArray(field) ? field : field ? [field] : []).flatMap((a) => a.value.map((v) => v.address ?? '')).filter(Boolean);

export function extractLinks(text: string): string[] {
  return [...new Set(text.match(/https?:\/\/[^\s<>"')]+/g) ?? [])];
}

export async function startSmtpCatcher(options: { host?: string; port?: number; mailboxDir?: string } = {}): Promise<SmtpCatcher> {
  const host = options.host ?? '127.0.0.1';
  const messages: CaughtMessage[] = [];
  const waiters = new Set<{ match: (m: CaughtMessage) => boolean; resolve: (m: CaughtMessage) => void }>();
  if (options.mailboxDir) mkdirSync(options.mailboxDir, { recursive: true });

  function keep(message: CaughtMessage) {
    messages.push(message);
    if (options.mailboxDir) {
      const stamp = message.receivedAt.replace(/[:.]/g, '-');
      writeFileSync(join(options.mailboxDir, `${stamp}_${message.id}.json`), JSON.stringify(message, null, 2));
      const files = readdirSync(options.mailboxDir).filter((f) => f.endsWith('.json')).sort();
      for (const old of files.slice(0, Math.max(0, files.length - KEEP_ON_DISK))) rmSync(join(options.mailboxDir, old), { force: true });
    }
    for (const waiter of waiters) {
      if (waiter.match(message)) {
        waiters.delete(waiter);
        waiter.resolve(message);
      }
    }
  }

  const server = new SMTPServer({
    secure: false,
    disabledCommands: ['STARTTLS'],
    authOptional: true,
    banner: 'Ohmstead development mail catcher',
    size: 2 * 1024 * 1024,
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const text = parsed.text ?? '';
          keep({
            id: randomUUID(),
            receivedAt: new Date().toISOString(),
            from: addresses(parsed.from)[0] ?? session.envelope.mailFrom?.valueOf().toString() ?? '',
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: parsed.subject ?? '',
            text,
            html: typeof parsed.html === 'string' ? parsed.html : null,
            links: extractLinks(text),
          });
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, host, () => {
      server.off('error', reject);
      resolve();
    });
  });
  server.on('error', () => {
    // A client that drops the connection mid-message is not our problem; keep serving.
  });
  const address = server.server.address();
  const port = typeof address === 'object' && address ? address.port : (options.port ?? 0);

  return {
    host,
    port,
    messages,
    waitForMessage(match, timeoutMs = 5_000) {
      const found = messages.find(match);
      if (found) return Promise.resolve(found);
      return new Promise((resolve, reject) => {
        const waiter = { match, resolve: (m: CaughtMessage) => (clearTimeout(timer), resolve(m)) };
        const timer = setTimeout(() => {
          waiters.delete(waiter);
          reject(new Error(`No matching message reached the SMTP catcher within ${timeoutMs} ms (${messages.length} received).`));
        }, timeoutMs);
        waiters.add(waiter);
      });
    },
    clear() {
      messages.length = 0;
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
