import type { FormEvent } from 'react';
import { Link } from 'react-router';
import { EmailInputSchema } from '#shared/schemas/accounts.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Field } from '../../../components/ui/field.tsx';
import { Alert } from '../../../components/ui/feedback.tsx';
import { useZodForm } from '../../../lib/use-zod-form.ts';
import { useRequestPasswordReset } from '../api/request-password-reset.ts';
import { AuthLayout } from './auth-layout.tsx';

export function ForgotPasswordPage() {
  const form = useZodForm(EmailInputSchema);
  const request = useRequestPasswordReset();

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const element = event.currentTarget;
    const input = form.parse(element);
    if (input) request.mutate(input, { onError: (error) => form.applyProblem(error, element) });
  }

  return (
    <AuthLayout
      title="Reset your password"
      intro="We will e-mail you a link to choose a new password."
      footer={
        <Link className="text-copper underline underline-offset-2" to="/sign-in">
          Back to sign-in
        </Link>
      }
    >
      {request.isSuccess ? (
        <Alert tone="ok" title="Check your e-mail">
          {request.data.detail}
        </Alert>
      ) : (
        <form noValidate onSubmit={onSubmit} className="space-y-4" aria-labelledby="page-title">
          {form.formError ? <Alert tone="danger">{form.formError}</Alert> : null}
          <Field label="E-mail address" name="email" type="email" autoComplete="username" required error={form.errors.email} />
          <Button type="submit" busy={request.isPending}>
            Send the link
          </Button>
        </form>
      )}
    </AuthLayout>
  );
}
