import { useState, type FormEvent } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { SignInInputSchema } from '#shared/schemas/accounts.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Field, PasswordField } from '../../../components/ui/field.tsx';
import { Alert } from '../../../components/ui/feedback.tsx';
import { isProblem } from '../../../lib/api-client.ts';
import { invitationPath, pendingInvitation } from '../../../lib/pending-invitation.ts';
import { useZodForm } from '../../../lib/use-zod-form.ts';
import { useResendVerification } from '../api/resend-verification.ts';
import { useSignIn } from '../api/sign-in.ts';
import { AuthLayout } from './auth-layout.tsx';
import { PricingSection } from '../../billing/components/pricing-section.tsx';

/** Only same-site paths are followed after sign-in (no open redirect). */
export function safeNext(next: string | null): string {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : '/';
}

export function SignInPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const form = useZodForm(SignInInputSchema);
  const signIn = useSignIn();
  const resend = useResendVerification();
  const [unverifiedEmail, setUnverifiedEmail] = useState<string | null>(null);
  const notice = params.get('notice');

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const element = event.currentTarget;
    const input = form.parse(element);
    if (!input) return;
    setUnverifiedEmail(null);
    signIn.mutate(input, {
      onSuccess: () => {
        const invitation = pendingInvitation();
        navigate(invitation ? invitationPath(invitation) : safeNext(params.get('next')), { replace: true });
      },
      onError: (error) => {
        if (isProblem(error, 403) && error.extension('reason') === 'email_unverified') setUnverifiedEmail(input.email);
        form.applyProblem(error, element);
      },
    });
  }

  return (
    <AuthLayout
      title="Sign in"
      intro="Sign in to manage keys, usage, your team and billing."
      footer={
        <p>
          New here?{' '}
          <Link className="text-copper underline underline-offset-2" to="/sign-up">
            Create an account
          </Link>
        </p>
      }
    >
      <form noValidate onSubmit={onSubmit} className="space-y-4" aria-labelledby="page-title">
        {notice === 'password-reset' ? <Alert tone="ok">Your password is set. Sign in with it.</Alert> : null}
        {notice === 'signed-out-everywhere' ? <Alert tone="ok">You are signed out on every browser.</Alert> : null}
        {form.formError ? <Alert tone="danger">{form.formError}</Alert> : null}
        {unverifiedEmail ? (
          <Alert tone="warn" title="Confirm your address first">
            <p>Follow the link in the e-mail we sent to {unverifiedEmail}.</p>
            {resend.isSuccess ? (
              <p className="mt-2">{resend.data.detail}</p>
            ) : (
              <Button tone="quiet" className="mt-1 px-0" busy={resend.isPending} onClick={() => resend.mutate({ email: unverifiedEmail })}>
                Send a new confirmation link
              </Button>
            )}
          </Alert>
        ) : null}
        <Field label="E-mail address" name="email" type="email" autoComplete="username" required error={form.errors.email} />
        <PasswordField label="Password" name="password" autoComplete="current-password" required error={form.errors.password} />
        <div className="flex items-center justify-between gap-4">
          <Button type="submit" busy={signIn.isPending}>
            Sign in
          </Button>
          <Link className="text-sm text-copper underline underline-offset-2" to="/forgot-password">
            Forgot your password?
          </Link>
        </div>
      </form>
      <PricingSection />
    </AuthLayout>
  );
}
