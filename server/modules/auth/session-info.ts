import type { SessionInfo } from '#shared/schemas/accounts.ts';
import type { Env } from '../../env.ts';
import { AppError } from '../../http/problem.ts';
import type { Executor } from './auth.types.ts';
import { findUserById, listUserOrganizations } from './auth.queries.ts';

/** Who is signed in, the active organization and the others to switch to. */
export async function buildSessionInfo(
  db: Executor,
  env: Env,
  session: { userId: string; organizationId: string | null; expiresAt: Date },
): Promise<SessionInfo> {
  const user = await findUserById(db, session.userId);
  if (!user) throw new AppError('unauthorized', 'Sign in to use the console: your session is missing or has ended.');
  const organizations = await listUserOrganizations(db, user.id);
  return {
    user: { id: user.id, email: user.email, name: user.name, emailVerified: user.emailVerifiedAt !== null },
    organization: organizations.find((o) => o.id === session.organizationId) ?? null,
    organizations,
    session: { expiresAt: session.expiresAt.toISOString(), idleTimeoutMinutes: env.SESSION_IDLE_MINUTES },
  };
}
