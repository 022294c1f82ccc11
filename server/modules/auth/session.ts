/**
 * Console sessions: our own small layer on the `sessions` table (see DEVELOPERS.md, Decisions).
 *
 * - The cookie carries 256 random bits; only their SHA-256 is stored, so a copy of the table opens
 *   nothing. HttpOnly, SameSite=Lax, Path=/, no Domain; Secure with the `__Host-` prefix outside loopback
 *   (OWASP Session Management Cheat Sheet; MDN "Secure cookie configuration").
 * - A new token at every sign-in (no fixation; ASVS 3.2.1), an idle timeout (last request + N minutes)
 *   and an absolute one (sign-in + N hours); sign-out deletes the row.
 * - `sessionContext` loads the signed-in context for every /console-api request into `res.locals.auth`;
 *   `requireSession` and `requireRole(...)` guard routes. Nothing is written onto `req`.
 */
import { and, asc, eq, gt, lt, or, sql } from 'drizzle-orm';
import type { CookieOptions, Request, RequestHandler, Response } from 'express';
import type { Role } from '#shared/schemas/accounts.ts';
import type { Db } from '../../db/client.ts';
import { memberships, organizations, sessions, users } from '../../db/schema/index.ts';
import type { Env } from '../../env.ts';
import { AppError } from '../../http/problem.ts';
import type { Executor } from './auth.types.ts';
import { requestMeta } from './request-meta.ts';
import { hashToken, randomToken } from './tokens.ts';

/** The signed-in context of a console request, in `res.locals.auth`. */
export interface ConsoleAuth {
  user: { id: string; email: string; name: string };
  /** The active organization; null when the user belongs to none. */
  organizationId: string | null;
  /** The user's role in the active organization. */
  role: Role | null;
  /** Identifies this session (the SHA-256 of its token; not the token). */
  sessionId: string;
  /** When this session ends at the latest. */
  expiresAt: Date;
}

/** A context whose organization is known: what `requireRole` guarantees. */
export interface OrganizationAuth extends ConsoleAuth {
  organizationId: string;
  role: Role;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      auth?: ConsoleAuth;
    }
  }
}

const LOOPBACK = /^(127\.\d+\.\d+\.\d+|localhost|::1|\[::1\])$/;

/** Whether the session cookie is Secure (and so `__Host-` prefixed). */
export function cookieIsSecure(env: Env): boolean {
  if (env.SESSION_COOKIE_SECURE !== 'auto') return env.SESSION_COOKIE_SECURE === 'true';
  if (env.NODE_ENV === 'production') return true;
  const publicHost = env.PUBLIC_URL ? new URL(env.PUBLIC_URL).hostname : env.HOST;
  return !(LOOPBACK.test(env.HOST) && LOOPBACK.test(publicHost));
}

export function sessionCookieName(env: Env): string {
  return cookieIsSecure(env) ? '__Host-ohs_session' : 'ohs_session';
}

function cookieOptions(env: Env): CookieOptions {
  return { httpOnly: true, sameSite: 'lax', secure: cookieIsSecure(env), path: '/' };
}

/** Reads one cookie from the Cookie header (RFC 6265 §5.4 syntax; our token is base64url, never quoted). */
export function readCookie(req: Request, name: string): string | undefined {
  const header = req.headers.cookie;
  if (!header) return undefined;
  for (const part of header.split(';')) {
    const eq = part.indexOf('=');
    if (eq > 0 && part.slice(0, eq).trim() === name) return part.slice(eq + 1).trim();
  }
  return undefined;
}

const idleMs = (env: Env) => env.SESSION_IDLE_MINUTES * 60_000;
// Refresh last_seen_at at most once a minute per session, not on every request.
const TOUCH_EVERY_MS = 60_000;

/**
 * Starts a new session for a user: a fresh token (so a token planted before sign-in is worthless), the
 * cookie set on the response, and any session the request came with deleted.
 */
export async function startSession(
  db: Executor,
  env: Env,
  req: Request,
  res: Response,
  userId: string,
  activeOrganizationId: string | null,
): Promise<{ sessionId: string; expiresAt: Date }> {
  const previous = readCookie(req, sessionCookieName(env));
  if (previous) await db.delete(sessions).where(eq(sessions.tokenHash, hashToken(previous)));
  const token = randomToken();
  const tokenHash = hashToken(token);
  const expiresAt = new Date(Date.now() + env.SESSION_ABSOLUTE_HOURS * 3_600_000);
  const { ip, userAgent } = requestMeta(req);
  await db.insert(sessions).values({ tokenHash, userId, activeOrganizationId, expiresAt, ip, userAgent });
  // Opportunistic clean-up of this user's dead sessions.
  await db
    .delete(sessions)
    .where(and(eq(sessions.userId, userId), or(lt(sessions.expiresAt, new Date()), lt(sessions.lastSeenAt, new Date(Date.now() - idleMs(env))))));
  res.cookie(sessionCookieName(env), token, { ...cookieOptions(env), maxAge: env.SESSION_ABSOLUTE_HOURS * 3_600_000 });
  return { sessionId: tokenHash, expiresAt };
}

export function clearSessionCookie(env: Env, res: Response) {
  res.clearCookie(sessionCookieName(env), cookieOptions(env));
}

/** Ends one session (sign-out). */
export async function endSession(db: Executor, sessionId: string) {
  await db.delete(sessions).where(eq(sessions.tokenHash, sessionId));
}

/** Ends every session of a user, or every one but `keepSessionId`. Returns how many ended. */
export async function endUserSessions(db: Executor, userId: string, keepSessionId?: string): Promise<number> {
  const rows = await db
    .delete(sessions)
    .where(and(eq(sessions.userId, userId), keepSessionId ? sql`${sessions.tokenHash} <> ${keepSessionId}` : undefined))
    .returning({ id: sessions.tokenHash });
  return rows.length;
}

/** Makes another organization the session's active one. */
export async function setActiveOrganization(db: Executor, sessionId: string, organizationId: string | null) {
  await db.update(sessions).set({ activeOrganizationId: organizationId }).where(eq(sessions.tokenHash, sessionId));
}

/** Looks a cookie token up: the live session, its user and the active membership, or null. */
export async function loadSession(db: Db, env: Env, token: string): Promise<ConsoleAuth | null> {
  const tokenHash = hashToken(token);
  const now = new Date();
  const [row] = await db
    .select({
      userId: users.id,
      email: users.email,
      name: users.name,
      activeOrganizationId: sessions.activeOrganizationId,
      lastSeenAt: sessions.lastSeenAt,
      expiresAt: sessions.expiresAt,
      role: memberships.role,
    })
    .from(sessions)
    .innerJoin(users, eq(users.id, sessions.userId))
    .leftJoin(memberships, and(eq(memberships.userId, sessions.userId), eq(memberships.organizationId, sessions.activeOrganizationId)))
    .where(and(eq(sessions.tokenHash, tokenHash), gt(sessions.expiresAt, now), gt(sessions.lastSeenAt, new Date(now.getTime() - idleMs(env)))));
  if (!row) {
    await db.delete(sessions).where(eq(sessions.tokenHash, tokenHash));
    return null;
  }
  let organizationId = row.role ? row.activeOrganizationId : null;
  let role: Role | null = row.role ?? null;
  if (!role) {
    // The active organization is gone or the user left it: fall back to the oldest membership.
    const [first] = await db
      .select({ organizationId: memberships.organizationId, role: memberships.role })
      .from(memberships)
      .innerJoin(organizations, eq(organizations.id, memberships.organizationId))
      .where(eq(memberships.userId, row.userId))
      .orderBy(asc(memberships.createdAt))
      .limit(1);
    organizationId = first?.organizationId ?? null;
    role = first?.role ?? null;
    await db.update(sessions).set({ activeOrganizationId: organizationId, lastSeenAt: now }).where(eq(sessions.tokenHash, tokenHash));
  } else if (now.getTime() - row.lastSeenAt.getTime() > TOUCH_EVERY_MS) {
    await db.update(sessions).set({ lastSeenAt: now }).where(eq(sessions.tokenHash, tokenHash));
  }
  return {
    user: { id: row.userId, email: row.email, name: row.name },
    organizationId,
    role,
    sessionId: tokenHash,
    expiresAt: row.expiresAt,
  };
}

/**
 * Mounted once in front of every /console-api router: when the request carries a live session cookie,
 * puts its context in `res.locals.auth`; a dead cookie is cleared. Never refuses a request by itself.
 */
export function sessionContext(deps: { db: Db; env: Env }): RequestHandler {
  const name = sessionCookieName(deps.env);
  return async (req, res, next) => {
    const token = readCookie(req, name);
    if (token) {
      const auth = /^[A-Za-z0-9_-]{43}$/.test(token) ? await loadSession(deps.db, deps.env, token) : null;
      if (auth) res.locals.auth = auth;
      else clearSessionCookie(deps.env, res);
    }
    next();
  };
}

/** 401 unless the request is signed in. Use after `sessionContext` (mounted for all of /console-api). */
export const requireSession: RequestHandler = (_req, res, next) => {
  if (!res.locals.auth) throw new AppError('unauthorized', 'Sign in to use the console: your session is missing or has ended.');
  next();
};

/**
 * 401 unless signed in; 403 unless the user's role in the active organization is one of `allowed`.
 * Afterwards `organizationAuth(res)` returns the context with a non-null organization and role.
 */
export function requireRole(...allowed: Role[]): RequestHandler {
  return (_req, res, next) => {
    const auth = res.locals.auth;
    if (!auth) throw new AppError('unauthorized', 'Sign in to use the console: your session is missing or has ended.');
    if (!auth.organizationId || !auth.role) {
      throw new AppError('forbidden', 'You do not belong to an organization yet: create one, or accept an invitation.');
    }
    if (!allowed.includes(auth.role)) {
      throw new AppError('forbidden', `Your role in this organization (${auth.role}) cannot do this; it needs ${allowed.join(' or ')}. Ask an owner or admin.`, {
        extensions: { role: auth.role, requiredRoles: allowed },
      });
    }
    next();
  };
}

/** The signed-in context (after `requireSession`). */
export function sessionAuth(res: Response): ConsoleAuth {
  const auth = res.locals.auth;
  if (!auth) throw new AppError('unauthorized', 'Sign in to use the console: your session is missing or has ended.');
  return auth;
}

/** The signed-in context with its organization (after `requireRole`). */
export function organizationAuth(res: Response): OrganizationAuth {
  const auth = sessionAuth(res);
  if (!auth.organizationId || !auth.role) throw new AppError('forbidden', 'You do not belong to an organization yet: create one, or accept an invitation.');
  return auth as OrganizationAuth;
}
