import { useEffect, useRef, type FormEvent } from 'react';
import { Link, useLocation } from 'react-router';
import { EmailInputSchema } from '#shared/schemas/accounts.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Field } from '../../../components/ui/field.tsx';
import { Alert, LoadingState } from '../../../components/ui/feedback.tsx';
import { useZodForm } from '../../../lib/use-zod-form.ts';
import { useResendVerification } from '../api/resend-verification.ts';
import { useVerifyEmail } from '../api/verify-email.ts';
import { AuthLayout } from './auth-layout.tsx';

/** The token of an e-mailed link travels after "#token=", never in the query string. */
export function useLinkToken(): string {
  const { hash } = useLocation();
  return new URLSearchParams(hash.replace(/^#/, '')).get('token') ?? '';
}

export function VerifyEmailPage() {
  const token = useLinkToken();
  const verify = useVerifyEmail();
  const started = useRef(false);
  const resend = useResendVerification();
  const form = useZodForm(EmailInputSchema);

  useEffect(() => {
    if (token && !started.current) {
      started.current = true;
      verify.mutate(token);
    }
  }, [token, verify]);

  function onResend(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const element = event.currentTarget;
    const input = form.parse(element);
    if (input) resend.mutate(input, { onError: (error) => form.applyProblem(error, element) });
  }

  return (
    <AuthLayout title="Confirm your e-mail address">
      {!token ? <Alert tone="danger">This page needs the link from the confirmation e-mail. Open it again, copying all of it.</Alert> : null}
      {verify.isPending ? <LoadingState label="Confirming…" /> : null}
      {verify.isSuccess ? (
        <div className="space-y-4">
          <Alert tone="ok" title="Address confirmed">
            {verify.data.email} is confirmed.
          </Alert>
          <Link className="inline-flex min-h-9 items-center rounded-md bg-copper px-4 py-2 text-sm font-medium text-white hover:bg-[#8f4b1c]" to="/sign-in">
            Sign in
          </Link>
        </div>
      ) : null}
      {verify.isError || !token ? (
        <div className="space-y-4">
          {verify.isError ? <Alert tone="danger">{verify.error.message}</Alert> : null}
          {resend.isSuccess ? (
            <Alert tone="ok">{resend.data.detail}</Alert>
          ) : (
            <form noValidate onSubmit={onResend} className="space-y-3" aria-label="Ask for a new confirmation link">
              {form.formError ? <Alert tone="danger">{form.formError}</Alert> : null}
              <Field label="E-mail address" name="email" type="email" autoComplete="email" error={form.errors.email} />
              <Button type="submit" tone="secondary" busy={resend.isPending}>
                Send a new link
              </Button>
            </form>
          )}
        </div>
      ) : null}
    </AuthLayout>
  );
}
