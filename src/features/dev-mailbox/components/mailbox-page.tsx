import { Link } from 'react-router';
import { Button } from '../../../components/ui/button.tsx';
import { Alert, EmptyState, ErrorState, LoadingState, Time } from '../../../components/ui/feedback.tsx';
import { isProblem } from '../../../lib/api-client.ts';
import { useClearMailbox } from '../api/clear-mailbox.ts';
import { useMailbox } from '../api/get-mailbox.ts';

/** Development only: the mail the local SMTP catcher received, with its links to follow. */
export function MailboxPage() {
  const mailbox = useMailbox();
  const clear = useClearMailbox();
  return (
    <div className="min-h-screen bg-paper px-4 py-8 sm:px-10">
      <main id="main" className="mx-auto max-w-4xl space-y-6">
        <header className="flex flex-wrap items-end justify-between gap-4">
          <div>
            <h1 id="page-title" className="text-2xl font-semibold tracking-tight">
              Development mailbox
            </h1>
            <p className="mt-1 max-w-2xl text-graphite-soft">
              Mail the server sent while running locally, caught by the local SMTP catcher instead of being delivered. It refreshes every few
              seconds. Not available in production.
            </p>
          </div>
          <div className="flex gap-3">
            <Link className="inline-flex min-h-9 items-center rounded-md border border-line px-4 py-2 text-sm font-medium hover:bg-paper-deep" to="/">
              Console
            </Link>
            <Button tone="secondary" busy={clear.isPending} onClick={() => clear.mutate()} disabled={!mailbox.data?.messages.length}>
              Empty the mailbox
            </Button>
          </div>
        </header>
        {mailbox.isPending ? <LoadingState label="Loading mail…" /> : null}
        {mailbox.isError && isProblem(mailbox.error, 404) ? <Alert tone="warn">This server does not offer the development mailbox (it runs in production mode).</Alert> : null}
        {mailbox.isError && !isProblem(mailbox.error, 404) ? <ErrorState error={mailbox.error} onRetry={() => void mailbox.refetch()} /> : null}
        {mailbox.data && mailbox.data.messages.length === 0 ? (
          <EmptyState title="No mail yet.">Sign up, ask for a password reset or invite someone, and the message appears here.</EmptyState>
        ) : null}
        {mailbox.data && mailbox.data.messages.length > 0 ? (
          <ul className="space-y-3" aria-label="Messages, newest first">
            {mailbox.data.messages.map((m, i) => (
              <li key={m.id}>
                <details open={i === 0} className="rounded-lg border border-line bg-white/70 p-4">
                  <summary className="cursor-pointer">
                    <span className="font-medium">{m.subject || '(no subject)'}</span>
                    <span className="block text-sm text-graphite-soft">
                      to {m.to.join(', ')} · <Time iso={m.receivedAt} />
                    </span>
                  </summary>
                  {m.links.length ? (
                    <ul className="mt-3 space-y-1 text-sm">
                      {m.links.map((link) => (
                        <li key={link}>
                          <a className="break-all text-copper underline underline-offset-2" href={link}>
                            {link}
                          </a>
                        </li>
                      ))}
                    </ul>
                  ) : null}
                  <pre className="mt-3 whitespace-pre-wrap break-words rounded bg-paper-deep p-3 font-mono text-xs">{m.text}</pre>
                </details>
              </li>
            ))}
          </ul>
        ) : null}
      </main>
    </div>
  );
}
