import type { FormEvent } from 'react';
import { Link } from 'react-router';
import { PASSWORD_MIN_CHARS, SignUpInputSchema } from '#shared/schemas/accounts.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Field, PasswordField } from '../../../components/ui/field.tsx';
import { Alert } from '../../../components/ui/feedback.tsx';
import { DevMailboxLink } from '../../../components/dev-mailbox-link.tsx';
import { pendingInvitation } from '../../../lib/pending-invitation.ts';
import { useZodForm } from '../../../lib/use-zod-form.ts';
import { useSignUp } from '../api/sign-up.ts';
import { AuthLayout } from './auth-layout.tsx';

export function SignUpPage() {
  const form = useZodForm(SignUpInputSchema);
  const signUp = useSignUp();
  // Someone arriving from an invitation joins that organization instead of creating one.
  const invited = pendingInvitation() !== null;

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const element = event.currentTarget;
    const input = form.parse(element);
    if (input) signUp.mutate(input, { onError: (error) => form.applyProblem(error, element) });
  }

  if (signUp.isSuccess) {
    return (
      <AuthLayout title="Check your e-mail">
        <Alert tone="ok" title="One more step">
          <p>
            We sent a confirmation link to <strong>{signUp.data.verificationSentTo}</strong>. It works once and for 24 hours. Follow it, then sign
            in.
          </p>
        </Alert>
        <p className="mt-4 text-sm">
          <DevMailboxLink>Read it in the development mailbox</DevMailboxLink>
        </p>
        <p className="mt-4">
          <Link className="text-copper underline underline-offset-2" to="/sign-in">
            Go to sign-in
          </Link>
        </p>
      </AuthLayout>
    );
  }

  return (
    <AuthLayout
      title="Create your account"
      intro={invited ? 'Create an account with the address your invitation was sent to; you will join that organization.' : 'Start with an organization of your own: you can invite your team later.'}
      footer={
        <p>
          Already have an account?{' '}
          <Link className="text-copper underline underline-offset-2" to="/sign-in">
            Sign in
          </Link>
        </p>
      }
    >
      <form noValidate onSubmit={onSubmit} className="space-y-4" aria-labelledby="page-title">
        {form.formError ? <Alert tone="danger">{form.formError}</Alert> : null}
        <Field label="Your name" name="name" autoComplete="name" required error={form.errors.name} />
        <Field label="E-mail address" name="email" type="email" autoComplete="email" required error={form.errors.email} />
        <PasswordField
          label="Password"
          name="password"
          autoComplete="new-password"
          required
          minLength={PASSWORD_MIN_CHARS}
          error={form.errors.password}
          hint={`At least ${PASSWORD_MIN_CHARS} characters. A few unrelated words work well; common and leaked passwords are refused.`}
        />
        {invited ? null : (
          <Field label="Organization name" name="organizationName" autoComplete="organization" required error={form.errors.organizationName} hint="Your shop, company or team." />
        )}
        <Button type="submit" busy={signUp.isPending}>
          Create account
        </Button>
      </form>
    </AuthLayout>
  );
}
