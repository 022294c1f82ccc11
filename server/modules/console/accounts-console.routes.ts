/**
 * The accounts part of the console API, mounted at /console-api behind `consoleSecurity` (CSRF checks,
 * no-store, the session context). Other console modules mount their own routers beside it and guard their
 * routes with `requireSession` / `requireRole(...)` from server/modules/auth/index.ts.
 */
import { Router, type RequestHandler } from 'express';
import type { Db } from '../../db/client.ts';
import type { Env } from '../../env.ts';
import type { Logger } from '../../logger.ts';
import { accountsRouter } from '../accounts/accounts.routes.ts';
import { auditRouter } from '../audit/audit.routes.ts';
import { authRouter } from '../auth/auth.routes.ts';
import type { AccountsDeps } from '../auth/auth.types.ts';
import { csrfProtection, noStore } from '../auth/csrf.ts';
import { sessionContext } from '../auth/session.ts';
import { devMailboxRouter } from '../dev-mailbox/dev-mailbox.routes.ts';
import { invitationsRouter } from '../invitations/invitations.routes.ts';
import { createMailer, type Mailer } from '../mail/mailer.ts';
import { membersRouter } from '../members/members.routes.ts';
import { organizationsRouter } from '../organizations/organizations.routes.ts';

/** For all of /console-api, before any console router: no-store, CSRF defence, the session context. */
export function consoleSecurity(deps: { env: Env; db: Db }): RequestHandler[] {
  return [noStore, csrfProtection(deps.env), sessionContext(deps)];
}

export function accountsConsoleRouter(deps: { env: Env; db: Db; logger: Logger; mailer?: Mailer }) {
  const full: AccountsDeps = { ...deps, mailer: deps.mailer ?? createMailer(deps.env, deps.logger) };
  const router = Router();
  router.use(authRouter(full));
  router.use(accountsRouter(full));
  router.use(organizationsRouter(full));
  router.use(membersRouter(full));
  router.use(invitationsRouter(full));
  router.use(auditRouter(full));
  if (full.env.NODE_ENV !== 'production') router.use(devMailboxRouter(full));
  return router;
}
