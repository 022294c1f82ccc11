/**
 * OWASP API2:2023 broken authentication — console sessions (OWASP Session Management Cheat Sheet; ASVS V3):
 * no session fixation (a token the browser brings to sign-in, planted or real, is never kept), the cookie's
 * attributes, server-side sign-out, sessions ended by a password change, the token never in a body, and
 * sign-in throttling per account and per address.
 */
import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import { sessions } from '../../server/db/schema/index.ts';
import { hashToken, randomToken } from '../../server/modules/auth/tokens.ts';
import { createUser, sessionCookie, startConsoleKit, TEST_PASSWORD, type ConsoleKit } from '../../server/modules/console/console.test-kit.ts';

let kit: ConsoleKit;
let secureKit: ConsoleKit;
beforeAll(async () => {
  kit = await startConsoleKit();
  secureKit = await startConsoleKit({ SESSION_COOKIE_SECURE: 'true' });
}, 60_000);
afterAll(async () => {
  await kit?.close();
  await secureKit?.close();
});

const signIn = (app: ConsoleKit['app'], email: string, password: string, cookie?: string) => {
  const r = request(app).post('/console-api/auth/sign-in').set(CSRF_HEADER, CSRF_HEADER_VALUE);
  return (cookie ? r.set('Cookie', cookie) : r).send({ email, password });
};
/** The token the browser keeps: the last non-empty Set-Cookie for the name (an invalid cookie is cleared first). */
const tokenFrom = (res: request.Response, name = 'ohs_session') =>
  ([] as string[])
    .concat(res.headers['set-cookie'] ?? [])
    .map((c) => c.split(';')[0]!)
    .filter((c) => c.startsWith(`${name}=`) && c.length > name.length + 1)
    .at(-1)
    ?.slice(name.length + 1);

describe('session fixation', () => {
  it('when a browser brings a planted token to sign-in, then it gets a new token and the planted one never works', async () => {
    const user = await createUser(kit.db, 'fixation-planted');
    const planted = randomToken();
    const res = await signIn(kit.app, user.email, TEST_PASSWORD, `ohs_session=${planted}`);
    expect(res.status).toBe(200);
    const issued = tokenFrom(res);
    expect(issued).toBeDefined();
    expect(issued).not.toBe(planted);
    expect(JSON.stringify(res.body)).not.toContain(issued!);
    expect((await request(kit.app).get('/console-api/session').set('Cookie', `ohs_session=${planted}`)).status).toBe(401);
    expect((await request(kit.app).get('/console-api/session').set('Cookie', `ohs_session=${issued}`)).status).toBe(200);
  });

  it("when an attacker's own live session is planted in a victim's browser, then the victim's sign-in ends it", async () => {
    const attacker = await createUser(kit.db, 'fixation-attacker');
    const victim = await createUser(kit.db, 'fixation-victim');
    const attackerCookie = await sessionCookie(kit.db, attacker.id, null);
    const res = await signIn(kit.app, victim.email, TEST_PASSWORD, attackerCookie);
    expect(res.status).toBe(200);
    expect(tokenFrom(res)).not.toBe(attackerCookie.split('=')[1]);
    const planted = await kit.db.select().from(sessions).where(eq(sessions.tokenHash, hashToken(attackerCookie.split('=')[1]!)));
    expect(planted).toEqual([]);
  });
});

describe('the session cookie', () => {
  it('when served on loopback in development, then it is HttpOnly, SameSite=Lax, Path=/ and has no Domain', async () => {
    const user = await createUser(kit.db, 'cookie-flags');
    const cookie = ([] as string[]).concat((await signIn(kit.app, user.email, TEST_PASSWORD)).headers['set-cookie'] ?? []).at(-1)!;
    expect(cookie).toMatch(/^ohs_session=[A-Za-z0-9_-]{43};/);
    expect(cookie).toMatch(/; HttpOnly/);
    expect(cookie).toMatch(/; SameSite=Lax/);
    expect(cookie).toMatch(/; Path=\//);
    expect(cookie).not.toMatch(/Domain=/i);
  });

  it('when the cookie is Secure, then it carries the __Host- prefix and the Secure attribute', async () => {
    const user = await createUser(secureKit.db, 'cookie-secure');
    const cookie = ([] as string[]).concat((await signIn(secureKit.app, user.email, TEST_PASSWORD)).headers['set-cookie'] ?? []).at(-1)!;
    expect(cookie).toMatch(/^__Host-ohs_session=/);
    expect(cookie).toMatch(/; Secure/);
    expect(cookie).toMatch(/; Path=\//);
    expect(cookie).not.toMatch(/Domain=/i);
  });
});

describe('ending sessions', () => {
  it('when a member signs out, then the token stops working on the server, not only in the browser', async () => {
    const user = await createUser(kit.db, 'sign-out');
    const token = tokenFrom(await signIn(kit.app, user.email, TEST_PASSWORD))!;
    const out = await request(kit.app).post('/console-api/auth/sign-out').set('Cookie', `ohs_session=${token}`).set(CSRF_HEADER, CSRF_HEADER_VALUE);
    expect(out.status).toBe(204);
    expect(String(out.headers['set-cookie'])).toMatch(/ohs_session=;.*Expires=Thu, 01 Jan 1970/);
    expect((await request(kit.app).get('/console-api/session').set('Cookie', `ohs_session=${token}`)).status).toBe(401);
  });

  it('when the password is changed, then every other session of the account ends', async () => {
    const user = await createUser(kit.db, 'password-change');
    const other = tokenFrom(await signIn(kit.app, user.email, TEST_PASSWORD))!;
    const current = tokenFrom(await signIn(kit.app, user.email, TEST_PASSWORD))!;
    const changed = await request(kit.app)
      .post('/console-api/account/password')
      .set('Cookie', `ohs_session=${current}`)
      .set(CSRF_HEADER, CSRF_HEADER_VALUE)
      .send({ currentPassword: TEST_PASSWORD, newPassword: 'cobalt meadow sings beyond harbours' });
    expect(changed.status).toBeLessThan(300);
    expect((await request(kit.app).get('/console-api/session').set('Cookie', `ohs_session=${other}`)).status).toBe(401);
    // The browser that changed it got a new token too (privilege change, ASVS 3.2.1).
    expect(tokenFrom(changed)).toBeDefined();
    expect(tokenFrom(changed)).not.toBe(current);
  });
});

describe('e-mailed links', () => {
  it('when a reset is asked for with a forged Host header, then the e-mailed link still points at the console, with the token in the fragment', async () => {
    const user = await createUser(kit.db, 'host-header');
    const res = await request(kit.app).post('/console-api/auth/forgot-password').set('Host', 'evil.example').set(CSRF_HEADER, CSRF_HEADER_VALUE).send({ email: user.email });
    expect(res.status).toBe(202);
    const mail = await kit.catcher.waitForMessage((m) => m.to.includes(user.email));
    const link = new URL(mail.links.find((l) => l.includes('/reset-password'))!);
    expect(link.host).not.toBe('evil.example');
    expect(link.host).toBe(`${kit.env.HOST}:${kit.env.PORT}`);
    expect(link.search).toBe('');
    expect(link.hash).toMatch(/^#token=[A-Za-z0-9_-]{43}$/);
  });
});

describe('sign-in throttling', () => {
  it('when one account gets more failed sign-ins than allowed, then the next attempt is 429 with Retry-After, even with the right password', async () => {
    const user = await createUser(kit.db, 'throttle-account');
    const free = kit.env.SIGNIN_ACCOUNT_FREE_FAILURES;
    for (let i = 0; i < free; i += 1) expect((await signIn(kit.app, user.email, 'wrong but long enough password')).status).toBe(401);
    const refused = await signIn(kit.app, user.email, TEST_PASSWORD);
    expect(refused.status).toBe(429);
    expect(Number(refused.headers['retry-after'])).toBeGreaterThan(0);
    expect(refused.headers['content-type']).toMatch(/^application\/problem\+json/);
  });

  it('when one address fails sign-ins across many accounts, then it is stopped per address (password spraying)', async () => {
    const spray = await startConsoleKit({ SIGNIN_ADDRESS_MAX_FAILURES: '5', TRUST_PROXY_HOPS: '1' });
    try {
      const from = (r: request.Test) => r.set('X-Forwarded-For', '198.51.100.77');
      for (let i = 0; i < 5; i += 1) {
        const res = await from(request(spray.app).post('/console-api/auth/sign-in')).set(CSRF_HEADER, CSRF_HEADER_VALUE).send({ email: `spray-${i}@tests.example`, password: 'a guess that is long enough' });
        expect(res.status).toBe(401);
      }
      const res = await from(request(spray.app).post('/console-api/auth/sign-in')).set(CSRF_HEADER, CSRF_HEADER_VALUE).send({ email: 'spray-last@tests.example', password: 'a guess that is long enough' });
      expect(res.status).toBe(429);
      // Another address is not affected.
      const other = await request(spray.app).post('/console-api/auth/sign-in').set('X-Forwarded-For', '198.51.100.78').set(CSRF_HEADER, CSRF_HEADER_VALUE).send({ email: 'spray-last@tests.example', password: 'a guess that is long enough' });
      expect(other.status).toBe(401);
    } finally {
      await spray.close();
    }
  });
});
