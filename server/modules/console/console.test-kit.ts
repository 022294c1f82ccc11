/**
 * Helpers for console API tests: the real app on this run's database, a real SMTP catcher on a free
 * port receiving what the app sends, and direct ways to set up users, organizations and sessions.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { randomBytes } from 'node:crypto';
import request from 'supertest';
import { CSRF_HEADER, CSRF_HEADER_VALUE, type Role } from '#shared/schemas/accounts.ts';
import { createTestApp } from '../../../tests/setup/app.ts';
import type { Db } from '../../db/client.ts';
import { memberships, organizations, sessions, users } from '../../db/schema/index.ts';
import { startSmtpCatcher, type CaughtMessage } from '../../fakes/smtp-catcher.ts';
import { hashPassword } from '../auth/password.ts';
import { hashToken, randomToken } from '../auth/tokens.ts';

export const TEST_PASSWORD = 'marble otter quietly tunes violins';

let cachedHash: Promise<string> | undefined;
const testPasswordHash = () => (cachedHash ??= hashPassword(TEST_PASSWORD));

export async function startConsoleKit(overrides: Record<string, string> = {}) {
  const mailboxDir = mkdtempSync(join(tmpdir(), 'ohmstead-mailbox-'));
  const catcher = await startSmtpCatcher({ mailboxDir });
  const app = createTestApp({
    SMTP_HOST: catcher.host,
    SMTP_PORT: String(catcher.port),
    DEV_MAILBOX_DIR: mailboxDir,
    // Test files share one database and one client address: per-address limits are tested on their own
    // addresses (X-Forwarded-For behind TRUST_PROXY_HOPS=1) and kept out of the way elsewhere.
    SIGNIN_ADDRESS_MAX_FAILURES: '10000',
    MAIL_REQUESTS_PER_ADDRESS_PER_HOUR: '10000',
    ...overrides,
  });
  return {
    ...app,
    catcher,
    mailboxDir,
    /** A cookie-keeping client that sends the CSRF header, like the console. */
    agent: () => request.agent(app.app).set(CSRF_HEADER, CSRF_HEADER_VALUE),
    async close() {
      await app.close();
      await catcher.close();
      rmSync(mailboxDir, { recursive: true, force: true });
    },
  };
}

export type ConsoleKit = Awaited<ReturnType<typeof startConsoleKit>>;

/** The token from a link in a caught message (`…#token=<token>`). */
export function tokenFrom(message: CaughtMessage, path: string): string {
  const link = message.links.find((l) => new URL(l).pathname === path);
  if (!link) throw new Error(`No ${path} link in "${message.subject}": ${message.links.join(', ')}`);
  return new URL(link).hash.replace(/^#token=/, '');
}

export const uniqueEmail = (label: string) => `${label}-${randomBytes(4).toString('hex')}@tests.example`;

/** A verified user with TEST_PASSWORD, inserted directly. */
export async function createUser(db: Db, label: string, options: { verified?: boolean } = {}) {
  const [user] = await db
    .insert(users)
    .values({ email: uniqueEmail(label), name: `Test ${label}`, passwordHash: await testPasswordHash(), emailVerifiedAt: options.verified === false ? null : new Date() })
    .returning();
  return user!;
}

/** An organization with one user per listed role (the first `owner` is its owner). */
export async function createOrganizationWith(db: Db, label: string, roles: Role[]) {
  const [org] = await db
    .insert(organizations)
    .values({ name: `Org ${label}`, slug: `org-${label}-${randomBytes(4).toString('hex')}` })
    .returning();
  const members: Record<string, Awaited<ReturnType<typeof createUser>>> = {};
  for (const role of roles) {
    const user = await createUser(db, `${label}-${role}`);
    await db.insert(memberships).values({ organizationId: org!.id, userId: user.id, role });
    members[role] = user;
  }
  return { org: org!, members };
}

/** A live session for a user with an active organization; returns the Cookie header value. */
export async function sessionCookie(db: Db, userId: string, activeOrganizationId: string | null): Promise<string> {
  const token = randomToken();
  await db.insert(sessions).values({ tokenHash: hashToken(token), userId, activeOrganizationId, expiresAt: new Date(Date.now() + 3_600_000) });
  return `ohs_session=${token}`;
}
