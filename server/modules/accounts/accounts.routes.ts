import { Router } from 'express';
import { AccountSessionListSchema, ChangePasswordInputSchema, UpdateAccountInputSchema, UserSchema } from '#shared/schemas/accounts.ts';
import { parseJsonBody } from '../../http/validate.ts';
import { updateUserName } from '../auth/auth.queries.ts';
import type { AccountsDeps } from '../auth/auth.types.ts';
import { clearSessionCookie, requireSession, sessionAuth } from '../auth/session.ts';
import { changePassword, listSessions, signOutEverywhere } from './accounts.service.ts';

/** /account: the signed-in person's own name, password and sessions. */
export function accountsRouter(deps: AccountsDeps) {
  const router = Router();
  router.use('/account', requireSession);

  router.patch('/account', async (req, res) => {
    const { name } = parseJsonBody(UpdateAccountInputSchema, req);
    const user = await updateUserName(deps.db, sessionAuth(res).user.id, name);
    res.json(UserSchema.parse({ id: user.id, email: user.email, name: user.name, emailVerified: user.emailVerifiedAt !== null }));
  });

  router.post('/account/password', async (req, res) => {
    const input = parseJsonBody(ChangePasswordInputSchema, req);
    await changePassword(deps, req, res, sessionAuth(res), input);
    res.status(204).end();
  });

  router.get('/account/sessions', async (_req, res) => {
    res.json(AccountSessionListSchema.parse({ sessions: await listSessions(deps, sessionAuth(res)) }));
  });

  router.post('/account/sign-out-everywhere', async (req, res) => {
    await signOutEverywhere(deps, req, sessionAuth(res));
    clearSessionCookie(deps.env, res);
    res.status(204).end();
  });
  return router;
}
