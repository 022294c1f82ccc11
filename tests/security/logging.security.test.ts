/**
 * Secrets stay out of the logs (OWASP Logging Cheat Sheet; API8:2023): the server's own pino output, captured
 * at the most verbose level, never holds an API key, a session token (in the Cookie or in Set-Cookie), a
 * Stripe webhook signature, a password, or the token of an e-mailed link — while the requests themselves
 * are logged (so the test looks at real log lines, not an empty file).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import { createApp } from '../../server/app.ts';
import { createDb } from '../../server/db/client.ts';
import { parseEnv } from '../../server/env.ts';
import { startSmtpCatcher } from '../../server/fakes/smtp-catcher.ts';
import { createLogger } from '../../server/logger.ts';
import { createMailer } from '../../server/modules/mail/mailer.ts';
import { tokenFrom, uniqueEmail } from '../../server/modules/console/console.test-kit.ts';
import { createOrganization, createTestKey } from '../setup/fixtures.ts';

const lines: string[] = [];
const mailboxDir = mkdtempSync(join(tmpdir(), 'ohmstead-log-mail-'));
let catcher: Awaited<ReturnType<typeof startSmtpCatcher>>;
let app: ReturnType<typeof createApp>;
let close: () => Promise<void>;
beforeAll(async () => {
  catcher = await startSmtpCatcher({ mailboxDir });
  const env = parseEnv({ ...process.env, LOG_LEVEL: 'trace', CONSOLE_DIST_DIR: '.data/no-console', SMTP_HOST: catcher.host, SMTP_PORT: String(catcher.port), DEV_MAILBOX_DIR: mailboxDir });
  const logger = createLogger('trace', { write: (line: string) => void lines.push(line) });
  const { db, pool } = createDb(env.DATABASE_URL, { max: 4 });
  app = createApp({ env, db, pool, logger, mailer: createMailer(env, logger) });
  close = async () => {
    await app.platform?.close();
    await pool.end();
  };
});
afterAll(async () => {
  await close?.();
  await catcher?.close();
  rmSync(mailboxDir, { recursive: true, force: true });
});

const logText = () => lines.join('');

describe('what the logs never hold', () => {
  it('when calls carry an API key, a session, a signed webhook, a password and an e-mailed token, then none of them reaches the log', async () => {
    const secrets: string[] = [];
    // An API key, valid and not.
    const db = createDb(process.env.DATABASE_URL!, { max: 1 });
    const org = await createOrganization(db.db);
    const { secret } = await createTestKey(db.db, app.platform!.hashSecret, org.id);
    await db.pool.end();
    secrets.push(secret, `ohs_srv_${'Q'.repeat(40)}`);
    expect((await request(app).post('/v1/packs/energy').set('Authorization', `Bearer ${secret}`).send({ pack: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 } })).status).toBe(200);
    expect((await request(app).get('/v1/usage').set('Authorization', `Bearer ohs_srv_${'Q'.repeat(40)}`)).status).toBe(401);

    // Sign-up: a password in the body, a verification token by e-mail, then the token posted back.
    const email = uniqueEmail('logging');
    const password = 'lantern orbit granite kettle';
    secrets.push(password);
    const signUp = await request(app).post('/console-api/auth/sign-up').set(CSRF_HEADER, CSRF_HEADER_VALUE).send({ email, name: 'Log Person', password });
    expect(signUp.status).toBe(201);
    const mail = await catcher.waitForMessage((m) => m.to.includes(email));
    const token = tokenFrom(mail, '/verify-email');
    secrets.push(token);
    expect((await request(app).post('/console-api/auth/verify-email').set(CSRF_HEADER, CSRF_HEADER_VALUE).send({ token })).status).toBe(200);

    // A session: issued in Set-Cookie, sent back in Cookie.
    const signIn = await request(app).post('/console-api/auth/sign-in').set(CSRF_HEADER, CSRF_HEADER_VALUE).send({ email, password });
    expect(signIn.status).toBe(200);
    const cookie = ([] as string[]).concat(signIn.headers['set-cookie'] ?? []).at(-1)!.split(';')[0]!;
    secrets.push(cookie.split('=')[1]!);
    expect((await request(app).get('/console-api/session').set('Cookie', cookie)).status).toBe(200);

    // A Stripe webhook with a (bad) signature: the signature is what an attacker would replay.
    const signature = `t=${Math.floor(Date.now() / 1000)},v1=${'5'.repeat(64)}`;
    secrets.push('5'.repeat(64));
    expect((await request(app).post('/v1/webhooks/stripe').set('Stripe-Signature', signature).set('Content-Type', 'application/json').send('{"id":"evt_1"}')).status).toBe(400);

    await new Promise((r) => setTimeout(r, 50));
    const text = logText();
    // The requests were logged, with their credentials censored.
    expect(lines.length).toBeGreaterThan(6);
    expect(text).toContain('"authorization":"[redacted]"');
    expect(text).toContain('"cookie":"[redacted]"');
    expect(text).toContain('"set-cookie":"[redacted]"');
    expect(text).toContain('"stripe-signature":"[redacted]"');
    for (const s of secrets) expect(text, `a secret (${s.slice(0, 6)}…) is in the log`).not.toContain(s);
  });
});
