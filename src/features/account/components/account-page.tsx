import type { FormEvent } from 'react';
import { useNavigate } from 'react-router';
import { ChangePasswordInputSchema, PASSWORD_MIN_CHARS, UpdateAccountInputSchema } from '#shared/schemas/accounts.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Field, PasswordField } from '../../../components/ui/field.tsx';
import { Alert, EmptyState, ErrorState, LoadingState, PageHeader, Panel, Time } from '../../../components/ui/feedback.tsx';
import { useSession } from '../../../lib/session.ts';
import { useZodForm } from '../../../lib/use-zod-form.ts';
import { useChangePassword } from '../api/change-password.ts';
import { useAccountSessions } from '../api/get-account-sessions.ts';
import { useSignOutEverywhere } from '../api/sign-out-everywhere.ts';
import { useUpdateAccount } from '../api/update-account.ts';

export function AccountPage() {
  const session = useSession();
  const user = session.data?.user;
  return (
    <div className="max-w-3xl space-y-8">
      <PageHeader title="Your account" summary={user ? `Signed in as ${user.email}.` : undefined} />
      {user ? <NameForm name={user.name} /> : null}
      <PasswordPanel />
      <SessionsPanel />
    </div>
  );
}

function NameForm({ name }: { name: string }) {
  const form = useZodForm(UpdateAccountInputSchema);
  const update = useUpdateAccount();
  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const element = event.currentTarget;
    const input = form.parse(element);
    if (input) update.mutate(input, { onError: (error) => form.applyProblem(error, element) });
  }
  return (
    <Panel title="Name">
      <form noValidate onSubmit={onSubmit} className="flex flex-wrap items-start gap-3" aria-label="Change your name">
        <Field label="Your name" name="name" autoComplete="name" defaultValue={name} required error={form.errors.name} className="min-w-64 flex-1" />
        <Button type="submit" className="mt-6" busy={update.isPending}>
          Save
        </Button>
        <div className="w-full" aria-live="polite">
          {form.formError ? <Alert tone="danger">{form.formError}</Alert> : null}
          {update.isSuccess ? <Alert tone="ok">Saved.</Alert> : null}
        </div>
      </form>
    </Panel>
  );
}

function PasswordPanel() {
  const form = useZodForm(ChangePasswordInputSchema);
  const change = useChangePassword();
  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const element = event.currentTarget;
    const input = form.parse(element);
    if (input) change.mutate(input, { onSuccess: () => element.reset(), onError: (error) => form.applyProblem(error, element) });
  }
  return (
    <Panel title="Password">
      <form noValidate onSubmit={onSubmit} className="space-y-4" aria-label="Change your password">
        {form.formError ? <Alert tone="danger">{form.formError}</Alert> : null}
        {change.isSuccess ? <Alert tone="ok">Password changed. Your other browsers were signed out.</Alert> : null}
        <PasswordField label="Current password" name="currentPassword" autoComplete="current-password" required error={form.errors.currentPassword} />
        <PasswordField
          label="New password"
          name="newPassword"
          autoComplete="new-password"
          required
          minLength={PASSWORD_MIN_CHARS}
          error={form.errors.newPassword}
          hint={`At least ${PASSWORD_MIN_CHARS} characters; common and leaked passwords are refused. Changing it signs out your other browsers.`}
        />
        <Button type="submit" busy={change.isPending}>
          Change password
        </Button>
      </form>
    </Panel>
  );
}

function SessionsPanel() {
  const sessions = useAccountSessions();
  const everywhere = useSignOutEverywhere();
  const navigate = useNavigate();
  return (
    <Panel title="Signed-in browsers">
      {sessions.isPending ? <LoadingState label="Loading sessions…" /> : null}
      {sessions.isError ? <ErrorState error={sessions.error} onRetry={() => void sessions.refetch()} /> : null}
      {sessions.data && sessions.data.sessions.length === 0 ? <EmptyState title="No live sessions." /> : null}
      {sessions.data && sessions.data.sessions.length > 0 ? (
        <ul className="divide-y divide-line/60 text-sm">
          {sessions.data.sessions.map((s) => (
            <li key={s.id} className="py-3">
              <p className="font-medium">
                {s.userAgent ? s.userAgent.slice(0, 90) : 'Unknown browser'}
                {s.current ? <span className="ml-2 rounded bg-copper-wash px-1.5 py-0.5 text-xs text-copper">this browser</span> : null}
              </p>
              <p className="text-graphite-soft">
                <span className="font-mono">{s.ip ?? 'unknown address'}</span> · signed in <Time iso={s.createdAt} /> · last active <Time iso={s.lastSeenAt} />
              </p>
            </li>
          ))}
        </ul>
      ) : null}
      {everywhere.isError ? <Alert tone="danger">{everywhere.error.message}</Alert> : null}
      <Button tone="secondary" className="mt-4" busy={everywhere.isPending} onClick={() => everywhere.mutate(undefined, { onSuccess: () => navigate('/sign-in?notice=signed-out-everywhere', { replace: true }) })}>
        Sign out everywhere
      </Button>
    </Panel>
  );
}
