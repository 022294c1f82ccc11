import type { FormEvent } from 'react';
import { useNavigate } from 'react-router';
import { CreateOrganizationInputSchema } from '#shared/schemas/accounts.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Field } from '../../../components/ui/field.tsx';
import { Alert, PageHeader } from '../../../components/ui/feedback.tsx';
import { useZodForm } from '../../../lib/use-zod-form.ts';
import { useCreateOrganization } from '../api/create-organization.ts';

export function CreateOrganizationPage({ first = false }: { first?: boolean }) {
  const form = useZodForm(CreateOrganizationInputSchema);
  const create = useCreateOrganization();
  const navigate = useNavigate();

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const element = event.currentTarget;
    const input = form.parse(element);
    if (input) create.mutate(input, { onSuccess: () => navigate('/', { replace: true }), onError: (error) => form.applyProblem(error, element) });
  }

  return (
    <div className="max-w-xl">
      <PageHeader
        title={first ? 'You are not in an organization yet' : 'New organization'}
        summary={
          first
            ? 'Create one to get keys and invite your team, or open an invitation link someone sent you.'
            : 'You will own it; switch between your organizations at the top of the menu.'
        }
      />
      <form noValidate onSubmit={onSubmit} className="space-y-4" aria-labelledby="page-title">
        {form.formError ? <Alert tone="danger">{form.formError}</Alert> : null}
        <Field label="Organization name" name="name" autoComplete="organization" required error={form.errors.name} />
        <Button type="submit" busy={create.isPending}>
          Create organization
        </Button>
      </form>
    </div>
  );
}
