import type { FormEvent } from 'react';
import { Link, useNavigate } from 'react-router';
import { PASSWORD_MIN_CHARS, ResetPasswordInputSchema } from '#shared/schemas/accounts.ts';
import { Button } from '../../../components/ui/button.tsx';
import { PasswordField } from '../../../components/ui/field.tsx';
import { Alert } from '../../../components/ui/feedback.tsx';
import { useZodForm } from '../../../lib/use-zod-form.ts';
import { useResetPassword } from '../api/reset-password.ts';
import { AuthLayout } from './auth-layout.tsx';
import { useLinkToken } from './verify-email-page.tsx';

export function ResetPasswordPage() {
  const token = useLinkToken();
  const navigate = useNavigate();
  const form = useZodForm(ResetPasswordInputSchema);
  const reset = useResetPassword();

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const element = event.currentTarget;
    const input = form.parse(element, { token });
    if (!input) return;
    reset.mutate(input, {
      onSuccess: () => navigate('/sign-in?notice=password-reset', { replace: true }),
      onError: (error) => form.applyProblem(error, element),
    });
  }

  return (
    <AuthLayout
      title="Choose a new password"
      intro="Setting it signs you out on every browser."
      footer={
        <Link className="text-copper underline underline-offset-2" to="/forgot-password">
          Ask for a new link
        </Link>
      }
    >
      {!token ? (
        <Alert tone="danger">This page needs the link from the reset e-mail. Open it again, copying all of it.</Alert>
      ) : (
        <form noValidate onSubmit={onSubmit} className="space-y-4" aria-labelledby="page-title">
          {form.formError || form.errors.token ? <Alert tone="danger">{form.formError ?? form.errors.token}</Alert> : null}
          <PasswordField
            label="New password"
            name="password"
            autoComplete="new-password"
            required
            minLength={PASSWORD_MIN_CHARS}
            error={form.errors.password}
            hint={`At least ${PASSWORD_MIN_CHARS} characters. A few unrelated words work well; common and leaked passwords are refused.`}
          />
          <Button type="submit" busy={reset.isPending}>
            Set the password
          </Button>
        </form>
      )}
    </AuthLayout>
  );
}
