import { eq, sql } from 'drizzle-orm';
import express from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER } from '#shared/schemas/accounts.ts';
import { auditEvents, emailTokens, sessions } from '../../db/schema/index.ts';
import { notFoundHandler } from '../../http/error-handler.ts';
import { createLogger } from '../../logger.ts';
import { accountsConsoleRouter } from '../console/accounts-console.routes.ts';
import { createUser, startConsoleKit, TEST_PASSWORD, tokenFrom, uniqueEmail, type ConsoleKit } from '../console/console.test-kit.ts';

let kit: ConsoleKit;
beforeAll(async () => {
  kit = await startConsoleKit();
});
afterAll(() => kit.close());

const problem = (res: request.Response) => {
  expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
  return res.body as { type: string; status: number; detail: string; errors?: Array<{ pointer?: string; header?: string; code?: string }>; reason?: string };
};

describe('sign-up → confirmation e-mail over SMTP → sign-in → invite → accept', () => {
  it('when the whole journey is walked through the API, then each step works and the invitee joins with the invited role', async () => {
    const owner = kit.agent();
    const ownerEmail = uniqueEmail('ada');
    const ownerPassword = 'copper kettle sings at dawn';

    // 1. Sign up with an organization.
    const signUp = await owner.post('/console-api/auth/sign-up').send({ email: ownerEmail, name: 'Ada Quill', password: ownerPassword, organizationName: 'Volt Works Outfitters' });
    expect(signUp.status).toBe(201);
    expect(signUp.body).toMatchObject({ user: { email: ownerEmail, emailVerified: false }, verificationSentTo: ownerEmail });
    expect(JSON.stringify(signUp.body)).not.toMatch(/argon2|passwordHash/);

    // 2. The confirmation e-mail arrives at the SMTP catcher.
    const confirmation = await kit.catcher.waitForMessage((m) => m.to.includes(ownerEmail) && /Confirm/.test(m.subject));
    expect(confirmation.text).toContain('/verify-email#token=');
    const verifyToken = tokenFrom(confirmation, '/verify-email');

    // 3. Signing in before confirming is refused, with the reason.
    const early = await owner.post('/console-api/auth/sign-in').send({ email: ownerEmail, password: ownerPassword });
    expect(early.status).toBe(403);
    expect(problem(early).reason).toBe('email_unverified');

    // 4. Confirm; the link works once.
    const verified = await owner.post('/console-api/auth/verify-email').send({ token: verifyToken });
    expect(verified.status).toBe(200);
    expect(verified.body).toEqual({ email: ownerEmail, emailVerified: true });
    const reused = await owner.post('/console-api/auth/verify-email').send({ token: verifyToken });
    expect(reused.status).toBe(422);
    expect(problem(reused).errors?.[0]).toMatchObject({ pointer: '#/token', code: 'token_used' });

    // 5. Sign in (the address may be typed in another case).
    const signIn = await owner.post('/console-api/auth/sign-in').send({ email: ownerEmail.toUpperCase(), password: ownerPassword });
    expect(signIn.status).toBe(200);
    expect(signIn.body.organization).toMatchObject({ name: 'Volt Works Outfitters', role: 'owner' });
    const cookie = signIn.headers['set-cookie']?.[0] ?? '';
    expect(cookie).toMatch(/^ohs_session=[A-Za-z0-9_-]{43};/);
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Lax/);
    expect(cookie).toMatch(/Path=\//);

    // 6. Invite a developer.
    const inviteeEmail = uniqueEmail('grace');
    const invite = await owner.post('/console-api/invitations').send({ email: inviteeEmail, role: 'developer' });
    expect(invite.status).toBe(201);
    expect(invite.body).toMatchObject({ email: inviteeEmail, role: 'developer', status: 'pending', invitedBy: { email: ownerEmail } });
    const invitationMail = await kit.catcher.waitForMessage((m) => m.to.includes(inviteeEmail));
    expect(invitationMail.subject).toContain('Volt Works Outfitters');
    const invitationToken = tokenFrom(invitationMail, '/invitations/accept');

    // 7. The invitee previews the invitation, signs up without an organization, confirms, signs in, accepts.
    const invitee = kit.agent();
    const preview = await invitee.post('/console-api/invitations/preview').send({ token: invitationToken });
    expect(preview.status).toBe(200);
    expect(preview.body).toMatchObject({ organizationName: 'Volt Works Outfitters', email: inviteeEmail, role: 'developer', invitedByName: 'Ada Quill' });
    expect((await invitee.post('/console-api/auth/sign-up').send({ email: inviteeEmail, name: 'Grace Tern', password: 'seven herons cross the estuary' })).status).toBe(201);
    const inviteeConfirmation = await kit.catcher.waitForMessage((m) => m.to.includes(inviteeEmail) && /Confirm/.test(m.subject));
    expect((await invitee.post('/console-api/auth/verify-email').send({ token: tokenFrom(inviteeConfirmation, '/verify-email') })).status).toBe(200);
    const inviteeSignIn = await invitee.post('/console-api/auth/sign-in').send({ email: inviteeEmail, password: 'seven herons cross the estuary' });
    expect(inviteeSignIn.status).toBe(200);
    expect(inviteeSignIn.body.organization).toBeNull();
    const accepted = await invitee.post('/console-api/invitations/accept').send({ token: invitationToken });
    expect(accepted.status).toBe(200);
    expect(accepted.body.organization).toMatchObject({ name: 'Volt Works Outfitters', role: 'developer' });

    // 8. The link is used up; the owner sees the new member; the audit log tells the story.
    const again = await invitee.post('/console-api/invitations/accept').send({ token: invitationToken });
    expect(again.status).toBe(422);
    expect(problem(again).errors?.[0]?.code).toBe('token_used');
    const members = await owner.get('/console-api/members');
    expect(members.body.members.map((m: { email: string; role: string }) => [m.email, m.role])).toEqual([
      [ownerEmail, 'owner'],
      [inviteeEmail, 'developer'],
    ]);
    expect((await owner.get('/console-api/invitations')).body.invitations).toEqual([]);
    const log = await owner.get('/console-api/audit-events');
    expect(log.status).toBe(200);
    const actions = log.body.events.map((e: { action: string }) => e.action);
    for (const action of ['organization.created', 'auth.signed_in', 'invitation.created', 'invitation.accepted', 'member.joined']) expect(actions).toContain(action);
    const joined = log.body.events.find((e: { action: string }) => e.action === 'member.joined');
    expect(joined).toMatchObject({ actor: { email: inviteeEmail }, targetType: 'user', details: { role: 'developer' } });
    expect(joined.ip).toMatch(/127\.0\.0\.1|::1/);
    // The developer may not read the audit log.
    expect((await invitee.get('/console-api/audit-events')).status).toBe(403);
  });
});

describe('clear 4xx problems', () => {
  it('when the password is wrong, then it is a 401 problem that does not say which part was wrong, and the failure is audited', async () => {
    const { org, members } = await (await import('../console/console.test-kit.ts')).createOrganizationWith(kit.db, 'wrongpw', ['owner']);
    const res = await kit.agent().post('/console-api/auth/sign-in').send({ email: members.owner!.email, password: 'not the right password at all' });
    expect(res.status).toBe(401);
    expect(problem(res)).toMatchObject({ type: '/problems/unauthorized', detail: 'The e-mail address or the password is not right.' });
    const unknown = await kit.agent().post('/console-api/auth/sign-in').send({ email: uniqueEmail('nobody'), password: 'not the right password at all' });
    expect(unknown.status).toBe(401);
    expect(problem(unknown).detail).toBe(res.body.detail);
    const events = await kit.db.select().from(auditEvents).where(eq(auditEvents.organizationId, org.id));
    expect(events.map((e) => e.action)).toContain('auth.sign_in_failed');
  });

  it('when an address already has an account (in any letter case), then sign-up is a 409 problem pointing at the e-mail', async () => {
    const user = await createUser(kit.db, 'dup');
    const res = await kit.agent().post('/console-api/auth/sign-up').send({ email: user.email.toUpperCase(), name: 'Someone Else', password: 'an entirely different phrase' });
    expect(res.status).toBe(409);
    expect(problem(res)).toMatchObject({ type: '/problems/conflict', errors: [{ pointer: '#/email', code: 'email_taken' }] });
  });

  it('when a state-changing request lacks the CSRF header, then it is a 403 problem naming the header, and nothing happens', async () => {
    const email = uniqueEmail('csrf');
    const res = await request(kit.app).post('/console-api/auth/sign-up').send({ email, name: 'No Header', password: 'granite kettle orbit lantern' });
    expect(res.status).toBe(403);
    expect(problem(res)).toMatchObject({ type: '/problems/forbidden', reason: 'csrf', errors: [{ header: CSRF_HEADER, code: 'csrf_header_missing' }] });
    const rows = await kit.db.execute(sql`select 1 from users where lower(email) = lower(${email})`);
    expect(rows.rowCount).toBe(0);
  });

  it('when a request comes from another site (Sec-Fetch-Site or Origin), then it is refused even with the header', async () => {
    const crossSite = await kit.agent().post('/console-api/auth/sign-in').set('Sec-Fetch-Site', 'cross-site').send({ email: 'a@b.example', password: 'x' });
    expect(crossSite.status).toBe(403);
    expect(problem(crossSite).reason).toBe('csrf');
    const foreign = await kit.agent().post('/console-api/auth/sign-in').set('Origin', 'https://attacker.example').send({ email: 'a@b.example', password: 'x' });
    expect(foreign.status).toBe(403);
    const sameOrigin = await kit.agent().post('/console-api/auth/sign-in').set('Sec-Fetch-Site', 'same-origin').send({ email: uniqueEmail('x'), password: 'x' });
    expect(sameOrigin.status).toBe(401);
  });

  it('when a console body is sent as a form, then it is a 415 problem (a cross-site form cannot send JSON)', async () => {
    const res = await kit.agent().post('/console-api/auth/sign-in').type('form').send('email=a%40b.example&password=x');
    expect(res.status).toBe(415);
    problem(res);
  });

  it('when a confirmation link has expired, then it is a 422 problem saying so', async () => {
    const user = await createUser(kit.db, 'expired', { verified: false });
    await kit.agent().post('/console-api/auth/resend-verification').send({ email: user.email }).expect(202);
    const mail = await kit.catcher.waitForMessage((m) => m.to.includes(user.email));
    await kit.db.update(emailTokens).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(emailTokens.userId, user.id));
    const res = await kit.agent().post('/console-api/auth/verify-email').send({ token: tokenFrom(mail, '/verify-email') });
    expect(res.status).toBe(422);
    expect(problem(res).errors?.[0]).toMatchObject({ pointer: '#/token', code: 'token_expired' });
    expect(res.body.detail).toMatch(/expired/);
  });

  it('when a link token is made up, then it is a 422 problem, not a 404 or 500', async () => {
    const res = await kit.agent().post('/console-api/auth/reset-password').send({ token: 'A'.repeat(43), password: 'granite kettle orbit lantern' });
    expect(res.status).toBe(422);
    expect(problem(res).errors?.[0]?.code).toBe('token_invalid');
  });

  it('when a new password is short or common, then it is a 422 problem pointing at the password', async () => {
    const short = await kit.agent().post('/console-api/auth/sign-up').send({ email: uniqueEmail('short'), name: 'Short', password: 'tooshort' });
    expect(short.status).toBe(422);
    expect(problem(short).errors?.[0]?.pointer).toBe('#/password');
    const common = await kit.agent().post('/console-api/auth/sign-up').send({ email: uniqueEmail('common'), name: 'Common', password: 'passwordpassword' });
    expect(common.status).toBe(422);
    expect(problem(common).errors?.[0]).toMatchObject({ pointer: '#/password', code: 'password_common' });
  });
});

describe('password reset', () => {
  it('when a reset link is used, then the password changes, every session ends, and the link cannot be used again', async () => {
    const user = await createUser(kit.db, 'reset');
    const browser = kit.agent();
    await browser.post('/console-api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD }).expect(200);
    await browser.get('/console-api/session').expect(200);

    const asked = await kit.agent().post('/console-api/auth/forgot-password').send({ email: user.email });
    expect(asked.status).toBe(202);
    const mail = await kit.catcher.waitForMessage((m) => m.to.includes(user.email) && /Reset/.test(m.subject));
    const token = tokenFrom(mail, '/reset-password');

    const weak = await kit.agent().post('/console-api/auth/reset-password').send({ token, password: 'qwertyuiop12345' });
    expect(weak.status).toBe(422);
    const newPassword = 'lichen grows on the north wall';
    expect((await kit.agent().post('/console-api/auth/reset-password').send({ token, password: newPassword })).status).toBe(204);
    expect((await browser.get('/console-api/session')).status).toBe(401);
    expect((await kit.agent().post('/console-api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD })).status).toBe(401);
    expect((await kit.agent().post('/console-api/auth/sign-in').send({ email: user.email, password: newPassword })).status).toBe(200);
    const reused = await kit.agent().post('/console-api/auth/reset-password').send({ token, password: 'another long phrase entirely' });
    expect(reused.status).toBe(422);
    expect(problem(reused).errors?.[0]?.code).toBe('token_used');
  });

  it('when a reset is asked for an address without an account, then the answer is the same and no mail is sent', async () => {
    const email = uniqueEmail('ghost');
    const res = await kit.agent().post('/console-api/auth/forgot-password').send({ email });
    expect(res.status).toBe(202);
    await new Promise((r) => setTimeout(r, 100));
    expect(kit.catcher.messages.some((m) => m.to.includes(email))).toBe(false);
  });
});

describe('sessions', () => {
  it('when signing in again, then a new token is issued and the one the browser had stops working (no fixation)', async () => {
    const user = await createUser(kit.db, 'fixation');
    const first = await kit.agent().post('/console-api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD });
    const planted = first.headers['set-cookie']![0]!.split(';')[0]!;
    const second = await request(kit.app).post('/console-api/auth/sign-in').set(CSRF_HEADER, '1').set('Cookie', planted).send({ email: user.email, password: TEST_PASSWORD });
    const fresh = second.headers['set-cookie']![0]!.split(';')[0]!;
    expect(fresh).not.toBe(planted);
    expect((await request(kit.app).get('/console-api/session').set('Cookie', planted)).status).toBe(401);
    expect((await request(kit.app).get('/console-api/session').set('Cookie', fresh)).status).toBe(200);
  });

  it('when a session has been idle too long or has reached its absolute end, then it is refused and removed', async () => {
    const user = await createUser(kit.db, 'idle');
    const idle = await kit.agent().post('/console-api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD });
    const idleCookie = idle.headers['set-cookie']![0]!.split(';')[0]!;
    await kit.db.update(sessions).set({ lastSeenAt: new Date(Date.now() - (kit.env.SESSION_IDLE_MINUTES + 1) * 60_000) }).where(eq(sessions.userId, user.id));
    const res = await request(kit.app).get('/console-api/session').set('Cookie', idleCookie);
    expect(res.status).toBe(401);
    expect(res.headers['set-cookie']?.[0]).toMatch(/^ohs_session=;/);
    expect((await kit.db.select().from(sessions).where(eq(sessions.userId, user.id))).length).toBe(0);

    const old = await kit.agent().post('/console-api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD });
    await kit.db.update(sessions).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(sessions.userId, user.id));
    expect((await request(kit.app).get('/console-api/session').set('Cookie', old.headers['set-cookie']![0]!.split(';')[0]!)).status).toBe(401);
  });

  it('when signing out, then that session ends; when signing out everywhere, then every browser is signed out', async () => {
    const user = await createUser(kit.db, 'signout');
    const a = kit.agent();
    const b = kit.agent();
    await a.post('/console-api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD }).expect(200);
    await b.post('/console-api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD }).expect(200);
    const list = await a.get('/console-api/account/sessions');
    expect(list.body.sessions).toHaveLength(2);
    expect(list.body.sessions.filter((s: { current: boolean }) => s.current)).toHaveLength(1);
    await a.post('/console-api/auth/sign-out').expect(204);
    expect((await a.get('/console-api/session')).status).toBe(401);
    expect((await b.get('/console-api/session')).status).toBe(200);
    await a.post('/console-api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD }).expect(200);
    await b.post('/console-api/account/sign-out-everywhere').expect(204);
    expect((await a.get('/console-api/session')).status).toBe(401);
    expect((await b.get('/console-api/session')).status).toBe(401);
  });

  it('when the password is changed, then other sessions end, this browser stays signed in, and a notice is e-mailed', async () => {
    const user = await createUser(kit.db, 'change');
    const here = kit.agent();
    const elsewhere = kit.agent();
    await here.post('/console-api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD }).expect(200);
    await elsewhere.post('/console-api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD }).expect(200);
    const wrong = await here.post('/console-api/account/password').send({ currentPassword: 'not my password at all', newPassword: 'pebbles under the old bridge' });
    expect(wrong.status).toBe(422);
    expect(problem(wrong).errors?.[0]?.pointer).toBe('#/currentPassword');
    const changed = await here.post('/console-api/account/password').send({ currentPassword: TEST_PASSWORD, newPassword: 'pebbles under the old bridge' });
    expect(changed.status).toBe(204);
    expect((await here.get('/console-api/session')).status).toBe(200);
    expect((await elsewhere.get('/console-api/session')).status).toBe(401);
    await kit.catcher.waitForMessage((m) => m.to.includes(user.email) && /password was changed/.test(m.subject));
  });
});

describe('sign-in throttling', () => {
  it('when an account has 5 failed sign-ins in a row, then the next attempt, even with the right password, is a 429 saying how long to wait', async () => {
    const user = await createUser(kit.db, 'throttle');
    for (let i = 0; i < 5; i++) {
      expect((await kit.agent().post('/console-api/auth/sign-in').send({ email: user.email, password: `wrong guess number ${i} here` })).status).toBe(401);
    }
    const res = await kit.agent().post('/console-api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD });
    expect(res.status).toBe(429);
    expect(problem(res)).toMatchObject({ type: '/problems/rate-limited' });
    expect(res.body.detail).toMatch(/Too many failed sign-ins for this account\. Wait \d+ seconds/);
    const retryAfter = Number(res.headers['retry-after']);
    expect(retryAfter).toBeGreaterThan(25);
    expect(retryAfter).toBeLessThanOrEqual(30);
  });

  it('when one address fails against many accounts, then it is throttled per address', async () => {
    const strict = await startConsoleKit({ SIGNIN_ADDRESS_MAX_FAILURES: '3', TRUST_PROXY_HOPS: '1' });
    try {
      // An address of its own (documentation range, RFC 5737), so other tests' counters do not interfere.
      const attempt = (email: string) =>
        request(strict.app).post('/console-api/auth/sign-in').set(CSRF_HEADER, '1').set('X-Forwarded-For', '198.51.100.7').send({ email, password: 'wrong password for spraying' });
      for (let i = 0; i < 3; i++) expect((await attempt(uniqueEmail(`spray${i}`))).status).toBe(401);
      const res = await attempt(uniqueEmail('spray-next'));
      expect(res.status).toBe(429);
      expect(res.body.detail).toMatch(/Too many failed sign-ins from your network address\. Wait \d+ minutes/);
      expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
      // Another address is not affected.
      const other = await request(strict.app).post('/console-api/auth/sign-in').set(CSRF_HEADER, '1').set('X-Forwarded-For', '198.51.100.8').send({ email: uniqueEmail('x'), password: 'wrong password for spraying' });
      expect(other.status).toBe(401);
    } finally {
      await strict.close();
    }
  });

  it('when one address asks for many e-mails, then it is throttled too', async () => {
    const strict = await startConsoleKit({ MAIL_REQUESTS_PER_ADDRESS_PER_HOUR: '2', TRUST_PROXY_HOPS: '1' });
    try {
      const ask = () => request(strict.app).post('/console-api/auth/forgot-password').set(CSRF_HEADER, '1').set('X-Forwarded-For', '2001:db8:aa:bb01::5').send({ email: uniqueEmail('flood') });
      expect((await ask()).status).toBe(202);
      expect((await ask()).status).toBe(202);
      const res = await ask();
      expect(res.status).toBe(429);
      expect(res.body.detail).toMatch(/requests that send e-mail/);
      // The same IPv6 /56 counts as one address.
      const neighbour = await request(strict.app).post('/console-api/auth/forgot-password').set(CSRF_HEADER, '1').set('X-Forwarded-For', '2001:db8:aa:bbff::9').send({ email: uniqueEmail('flood') });
      expect(neighbour.status).toBe(429);
    } finally {
      await strict.close();
    }
  });
});

describe('development mailbox', () => {
  it('when mail was caught, then the development-only route lists it with its links; in production the route does not exist', async () => {
    const user = await createUser(kit.db, 'mailbox', { verified: false });
    await kit.agent().post('/console-api/auth/resend-verification').send({ email: user.email }).expect(202);
    await kit.catcher.waitForMessage((m) => m.to.includes(user.email));
    const res = await request(kit.app).get('/console-api/dev/mailbox');
    expect(res.status).toBe(200);
    const message = res.body.messages.find((m: { to: string[] }) => m.to.includes(user.email));
    expect(message.subject).toMatch(/Confirm/);
    expect(message.links[0]).toMatch(/\/verify-email#token=/);

    // The accounts console router as production mounts it (the rest of a production app needs secrets
    // that other modules check).
    const production = express();
    production.use('/console-api', accountsConsoleRouter({ env: { ...kit.env, NODE_ENV: 'production' }, db: kit.db, logger: createLogger('silent') }));
    production.use(notFoundHandler);
    expect((await request(production).get('/console-api/dev/mailbox')).status).toBe(404);
  });
});
