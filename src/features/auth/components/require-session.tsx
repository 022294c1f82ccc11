import type { ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router';
import { ErrorState, LoadingState } from '../../../components/ui/feedback.tsx';
import { useSession } from '../../../lib/session.ts';

/** Signed-out visitors are sent to sign-in, which brings them back here afterwards. */
export function RequireSession({ children }: { children: ReactNode }) {
  const session = useSession();
  const location = useLocation();
  if (session.isPending) {
    return (
      <div className="p-8">
        <LoadingState label="Checking your session…" />
      </div>
    );
  }
  if (session.isError) {
    return (
      <div className="p-8">
        <ErrorState error={session.error} onRetry={() => void session.refetch()} />
      </div>
    );
  }
  if (!session.data) {
    const next = `${location.pathname}${location.search}${location.hash}`;
    return <Navigate to={`/sign-in?next=${encodeURIComponent(next)}`} replace />;
  }
  return <>{children}</>;
}
