/** The signed-in user (shared by every feature: the role decides what the screens offer; the server decides what is allowed). */
import { queryOptions, useQuery } from '@tanstack/react-query';
import { SessionInfoSchema, type SessionInfo } from '#shared/schemas/accounts.ts';
import { apiRequest, isProblem } from './api-client.ts';
import { apiPaths } from './api-paths.ts';

/** The signed-in user, or null when signed out. */
export async function getSession(): Promise<SessionInfo | null> {
  try {
    return await apiRequest(apiPaths.session, { schema: SessionInfoSchema });
  } catch (error) {
    if (isProblem(error, 401)) return null;
    throw error;
  }
}

export const sessionQueryOptions = () => queryOptions({ queryKey: ['session'], queryFn: getSession, staleTime: 60_000 });

export const useSession = () => useQuery(sessionQueryOptions());
