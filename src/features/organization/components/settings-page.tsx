import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router';
import { can, DeleteOrganizationInputSchema, TransferOwnershipInputSchema, UpdateOrganizationInputSchema } from '#shared/schemas/accounts.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Field, SelectField } from '../../../components/ui/field.tsx';
import { Alert, ErrorState, LoadingState, PageHeader, Panel, Time } from '../../../components/ui/feedback.tsx';
import { useSession } from '../../../lib/session.ts';
import { useZodForm } from '../../../lib/use-zod-form.ts';
import { useDeleteOrganization } from '../api/delete-organization.ts';
import { useMembersForTransfer } from '../api/get-members-for-transfer.ts';
import { useOrganization } from '../api/get-organization.ts';
import { useTransferOwnership } from '../api/transfer-ownership.ts';
import { useUpdateOrganization } from '../api/update-organization.ts';

export function SettingsPage() {
  const session = useSession();
  const organization = useOrganization();
  const role = session.data?.organization?.role;
  return (
    <div className="max-w-3xl space-y-8">
      <PageHeader title="Settings" summary="Your organization's name and its ownership." />
      {organization.isPending ? <LoadingState /> : null}
      {organization.isError ? <ErrorState error={organization.error} onRetry={() => void organization.refetch()} /> : null}
      {organization.data ? (
        <>
          <Panel title="Organization">
            <dl className="mb-4 grid grid-cols-[8rem_1fr] gap-y-1 text-sm">
              <dt className="text-graphite-soft">Short name</dt>
              <dd className="font-mono">{organization.data.slug}</dd>
              <dt className="text-graphite-soft">Plan</dt>
              <dd>{organization.data.planId}</dd>
              <dt className="text-graphite-soft">Members</dt>
              <dd className="font-mono">{organization.data.memberCount}</dd>
              <dt className="text-graphite-soft">Created</dt>
              <dd>
                <Time iso={organization.data.createdAt} />
              </dd>
            </dl>
            {can.manageSettings(role) ? <RenameForm name={organization.data.name} /> : <p className="text-sm">Name: {organization.data.name}. Owners and admins can change it.</p>}
          </Panel>
          {can.transferOwnership(role) ? <TransferPanel myUserId={session.data?.user.id ?? ''} /> : null}
          {can.deleteOrganization(role) ? <DeletePanel name={organization.data.name} /> : null}
        </>
      ) : null}
    </div>
  );
}

function RenameForm({ name }: { name: string }) {
  const form = useZodForm(UpdateOrganizationInputSchema);
  const update = useUpdateOrganization();
  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const element = event.currentTarget;
    const input = form.parse(element);
    if (input) update.mutate(input, { onError: (error) => form.applyProblem(error, element) });
  }
  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-wrap items-start gap-3" aria-label="Rename the organization">
      <Field label="Name" name="name" defaultValue={name} required error={form.errors.name} className="min-w-64 flex-1" />
      <Button type="submit" className="mt-6" busy={update.isPending}>
        Save
      </Button>
      <div className="w-full" aria-live="polite">
        {form.formError ? <Alert tone="danger">{form.formError}</Alert> : null}
        {update.isSuccess ? <Alert tone="ok">Saved.</Alert> : null}
      </div>
    </form>
  );
}

function TransferPanel({ myUserId }: { myUserId: string }) {
  const members = useMembersForTransfer(true);
  const form = useZodForm(TransferOwnershipInputSchema);
  const transfer = useTransferOwnership();
  const others = (members.data?.members ?? []).filter((m) => m.userId !== myUserId);
  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const element = event.currentTarget;
    const input = form.parse(element);
    if (input) transfer.mutate(input, { onError: (error) => form.applyProblem(error, element) });
  }
  return (
    <Panel title="Transfer ownership">
      <p className="mb-3 text-sm text-graphite-soft">The new owner gets everything, billing included; you become an admin.</p>
      {members.isPending ? <LoadingState label="Loading members…" /> : null}
      {members.isError ? <ErrorState error={members.error} onRetry={() => void members.refetch()} /> : null}
      {members.data && others.length === 0 ? <p className="text-sm">Invite someone first: there is nobody to hand the organization to.</p> : null}
      {transfer.isSuccess ? <Alert tone="ok">Ownership transferred. You are now an admin.</Alert> : null}
      {others.length > 0 && !transfer.isSuccess ? (
        <form noValidate onSubmit={onSubmit} className="flex flex-wrap items-start gap-3" aria-label="Transfer ownership">
          <SelectField label="New owner" name="userId" options={others.map((m) => ({ value: m.userId, label: `${m.name || m.email} (${m.role})` }))} error={form.errors.userId} className="min-w-64 flex-1" />
          <Button type="submit" tone="secondary" className="mt-6" busy={transfer.isPending}>
            Transfer
          </Button>
          {form.formError ? <div className="w-full"><Alert tone="danger">{form.formError}</Alert></div> : null}
        </form>
      ) : null}
    </Panel>
  );
}

function DeletePanel({ name }: { name: string }) {
  const form = useZodForm(DeleteOrganizationInputSchema);
  const remove = useDeleteOrganization();
  const navigate = useNavigate();
  const [open, setOpen] = useState(false);
  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const element = event.currentTarget;
    const input = form.parse(element);
    if (input) remove.mutate(input, { onSuccess: () => navigate('/', { replace: true }), onError: (error) => form.applyProblem(error, element) });
  }
  return (
    <Panel title="Delete the organization" tone="danger">
      <p className="text-sm">This deletes its members' access, keys, usage records and invitations, for good.</p>
      {!open ? (
        <Button tone="danger" className="mt-3" onClick={() => setOpen(true)}>
          Delete…
        </Button>
      ) : (
        <form noValidate onSubmit={onSubmit} className="mt-3 space-y-3" aria-label="Confirm deletion">
          <Field label={`Type "${name}" to confirm`} name="confirmName" autoComplete="off" required error={form.errors.confirmName} />
          {form.formError ? <Alert tone="danger">{form.formError}</Alert> : null}
          <div className="flex gap-3">
            <Button type="submit" tone="danger" busy={remove.isPending}>
              Delete for good
            </Button>
            <Button tone="secondary" onClick={() => setOpen(false)}>
              Cancel
            </Button>
          </div>
        </form>
      )}
    </Panel>
  );
}
