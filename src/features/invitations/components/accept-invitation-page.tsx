import { useEffect } from 'react';
import { Link, useLocation, useNavigate } from 'react-router';
import { Button } from '../../../components/ui/button.tsx';
import { Alert, LoadingState } from '../../../components/ui/feedback.tsx';
import { forgetInvitation, rememberInvitation } from '../../../lib/pending-invitation.ts';
import { useSession } from '../../../lib/session.ts';
import { useAcceptInvitation } from '../api/accept-invitation.ts';
import { useInvitationPreview } from '../api/preview-invitation.ts';
import { useSignOutToSwitch } from '../api/sign-out-to-switch.ts';

const article = (role: string) => (role === 'admin' ? 'an' : 'a');

export function AcceptInvitationPage() {
  const { hash } = useLocation();
  const token = new URLSearchParams(hash.replace(/^#/, '')).get('token') ?? '';
  const preview = useInvitationPreview(token);
  const session = useSession();
  const accept = useAcceptInvitation();
  const signOut = useSignOutToSwitch();
  const navigate = useNavigate();

  // Remember the link while signed out, so sign-up → confirm → sign-in comes back here.
  useEffect(() => {
    if (token && preview.isSuccess) rememberInvitation(token);
    if (preview.isError) forgetInvitation();
  }, [token, preview.isSuccess, preview.isError]);

  const user = session.data?.user;
  const invited = preview.data;
  const sameAddress = user && invited && user.email.toLowerCase() === invited.email.toLowerCase();

  return (
    <div className="flex min-h-screen flex-col items-center bg-paper px-4 py-10">
      <main id="main" className="w-full max-w-md rounded-xl border border-line bg-white/70 p-6 shadow-sm sm:p-8">
        <h1 id="page-title" className="text-2xl font-semibold tracking-tight">
          Invitation
        </h1>
        <div className="mt-4 space-y-4">
          {!token ? <Alert tone="danger">This page needs the link from the invitation e-mail. Open it again, copying all of it.</Alert> : null}
          {preview.isPending && token ? <LoadingState label="Reading the invitation…" /> : null}
          {preview.isError ? <Alert tone="danger">{preview.error.message}</Alert> : null}
          {invited ? (
            <>
              <p>
                {invited.invitedByName ?? 'Someone'} invited <strong>{invited.email}</strong> to join <strong>{invited.organizationName}</strong> as {article(invited.role)}{' '}
                <strong>{invited.role}</strong>.
              </p>
              {accept.isError ? <Alert tone="danger">{accept.error.message}</Alert> : null}
              {session.isPending ? <LoadingState label="Checking your session…" /> : null}
              {session.isSuccess && !user ? (
                <div className="flex flex-wrap gap-3">
                  <Link className="inline-flex min-h-9 items-center rounded-md bg-copper px-4 py-2 text-sm font-medium text-white hover:bg-[#8f4b1c]" to="/sign-in">
                    Sign in to accept
                  </Link>
                  <Link className="inline-flex min-h-9 items-center rounded-md border border-line px-4 py-2 text-sm font-medium hover:bg-paper-deep" to="/sign-up">
                    Create an account
                  </Link>
                </div>
              ) : null}
              {user && sameAddress ? (
                <Button
                  busy={accept.isPending}
                  onClick={() =>
                    accept.mutate(token, {
                      onSuccess: () => {
                        forgetInvitation();
                        navigate('/team', { replace: true });
                      },
                    })
                  }
                >
                  Join {invited.organizationName}
                </Button>
              ) : null}
              {user && !sameAddress ? (
                <Alert tone="warn" title="Another address">
                  <p>
                    You are signed in as {user.email}, but this invitation is for {invited.email}.
                  </p>
                  <Button tone="quiet" className="mt-1 px-0" busy={signOut.isPending} onClick={() => signOut.mutate(undefined, { onSettled: () => navigate('/sign-in') })}>
                    Sign out and use {invited.email}
                  </Button>
                </Alert>
              ) : null}
            </>
          ) : null}
        </div>
      </main>
    </div>
  );
}
