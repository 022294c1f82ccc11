import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router';
import { can, CreateInvitationInputSchema, type Member, type Role } from '#shared/schemas/accounts.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Field, SelectField } from '../../../components/ui/field.tsx';
import { Alert, EmptyState, ErrorState, LoadingState, PageHeader, Panel, Time } from '../../../components/ui/feedback.tsx';
import { TableScroll } from '../../../components/ui/table-scroll.tsx';
import { useSession } from '../../../lib/session.ts';
import { useZodForm } from '../../../lib/use-zod-form.ts';
import { useCreateInvitation } from '../api/create-invitation.ts';
import { useInvitations } from '../api/get-invitations.ts';
import { useMembers } from '../api/get-members.ts';
import { useRemoveMember } from '../api/remove-member.ts';
import { useRevokeInvitation } from '../api/revoke-invitation.ts';
import { useUpdateMemberRole } from '../api/update-member-role.ts';

export const roleLabels: Record<Role, string> = { owner: 'Owner', admin: 'Admin', developer: 'Developer', viewer: 'Viewer' };
export const roleSummaries: Record<Role, string> = {
  owner: 'Everything, including billing, deleting the organization and transferring ownership.',
  admin: 'Members, keys, catalog and settings.',
  developer: 'Keys they create, usage, playground and widgets.',
  viewer: 'Read-only.',
};
const assignable = (['admin', 'developer', 'viewer'] as const).map((r) => ({ value: r, label: roleLabels[r] }));

export function TeamPage() {
  const session = useSession();
  const role = session.data?.organization?.role;
  const manage = can.manageMembers(role);
  return (
    <div className="space-y-8">
      <PageHeader title="Team" summary="Who belongs to this organization and what each role may do. The server enforces roles; these screens only follow them." />
      <RolesLegend />
      <MembersPanel manage={manage} myUserId={session.data?.user.id ?? ''} />
      {manage ? <InvitationsPanel /> : null}
    </div>
  );
}

function RolesLegend() {
  return (
    <dl className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
      {(Object.keys(roleLabels) as Role[]).map((r) => (
        <div key={r} className="rounded-lg border border-line bg-white/60 p-3">
          <dt className="font-medium">{roleLabels[r]}</dt>
          <dd className="mt-1 text-sm text-graphite-soft">{roleSummaries[r]}</dd>
        </div>
      ))}
    </dl>
  );
}

function MembersPanel({ manage, myUserId }: { manage: boolean; myUserId: string }) {
  const members = useMembers();
  return (
    <Panel title="Members">
      {members.isPending ? <LoadingState label="Loading members…" /> : null}
      {members.isError ? <ErrorState error={members.error} onRetry={() => void members.refetch()} /> : null}
      {members.data && members.data.members.length === 0 ? <EmptyState title="No members yet." /> : null}
      {members.data && members.data.members.length > 0 ? (
        <TableScroll label="Members of this organization">
          <table className="w-full min-w-[36rem] text-left text-sm">
            <caption className="sr-only">Members of this organization</caption>
            <thead className="border-b border-line text-graphite-soft">
              <tr>
                <th scope="col" className="py-2 pr-4 font-medium">Name</th>
                <th scope="col" className="py-2 pr-4 font-medium">E-mail</th>
                <th scope="col" className="py-2 pr-4 font-medium">Role</th>
                <th scope="col" className="py-2 pr-4 font-medium">Joined</th>
                <th scope="col" className="py-2 font-medium"><span className="sr-only">Actions</span></th>
              </tr>
            </thead>
            <tbody>
              {members.data.members.map((m) => (
                <MemberRow key={m.userId} member={m} manage={manage} isMe={m.userId === myUserId} />
              ))}
            </tbody>
          </table>
        </TableScroll>
      ) : null}
    </Panel>
  );
}

function MemberRow({ member, manage, isMe }: { member: Member; manage: boolean; isMe: boolean }) {
  const update = useUpdateMemberRole();
  const remove = useRemoveMember();
  const navigate = useNavigate();
  const [confirming, setConfirming] = useState(false);
  const editable = manage && !isMe && member.role !== 'owner';
  const error = update.error ?? remove.error;
  return (
    <tr className="border-b border-line/60 align-top">
      <td className="py-3 pr-4">
        {member.name || '—'} {isMe ? <span className="ml-1 rounded bg-copper-wash px-1.5 py-0.5 text-xs text-copper">you</span> : null}
      </td>
      <td className="py-3 pr-4">{member.email}</td>
      <td className="py-3 pr-4">
        {editable ? (
          <label className="block">
            <span className="sr-only">Role of {member.name || member.email}</span>
            <select
              value={member.role}
              disabled={update.isPending}
              onChange={(e) => update.mutate({ userId: member.userId, role: e.target.value as 'admin' | 'developer' | 'viewer' })}
              className="rounded-md border border-line bg-white px-2 py-1.5"
            >
              {assignable.map((o) => (
                <option key={o.value} value={o.value}>
                  {o.label}
                </option>
              ))}
            </select>
          </label>
        ) : (
          roleLabels[member.role]
        )}
        {error ? <p className="mt-1 text-danger" role="alert">{error.message}</p> : null}
      </td>
      <td className="py-3 pr-4">
        <Time iso={member.joinedAt} />
      </td>
      <td className="py-3 text-right">
        {(editable || (isMe && member.role !== 'owner')) && !confirming ? (
          <Button tone="secondary" onClick={() => setConfirming(true)}>
            {isMe ? 'Leave' : 'Remove'}
          </Button>
        ) : null}
        {confirming ? (
          <span className="inline-flex flex-wrap items-center justify-end gap-2">
            <span>{isMe ? 'Leave this organization?' : `Remove ${member.name || member.email}?`}</span>
            <Button
              tone="danger"
              busy={remove.isPending}
              onClick={() =>
                remove.mutate(member.userId, {
                  onSuccess: () => (isMe ? navigate('/', { replace: true }) : setConfirming(false)),
                  onError: () => setConfirming(false),
                })
              }
            >
              {isMe ? 'Leave' : 'Remove'}
            </Button>
            <Button tone="secondary" onClick={() => setConfirming(false)}>
              Cancel
            </Button>
          </span>
        ) : null}
      </td>
    </tr>
  );
}

function InvitationsPanel() {
  const invitations = useInvitations();
  const revoke = useRevokeInvitation();
  return (
    <Panel title="Invitations">
      <InviteForm />
      <div className="mt-6">
        <h3 className="font-medium">Open invitations</h3>
        {invitations.isPending ? <LoadingState label="Loading invitations…" /> : null}
        {invitations.isError ? <ErrorState error={invitations.error} onRetry={() => void invitations.refetch()} /> : null}
        {invitations.data && invitations.data.invitations.length === 0 ? (
          <div className="mt-2">
            <EmptyState title="No open invitations.">Invite someone above; they get an e-mail with a link valid for 7 days.</EmptyState>
          </div>
        ) : null}
        {revoke.isError ? <Alert tone="danger">{revoke.error.message}</Alert> : null}
        {invitations.data && invitations.data.invitations.length > 0 ? (
          <ul className="mt-2 divide-y divide-line/60">
            {invitations.data.invitations.map((inv) => (
              <li key={inv.id} className="flex flex-wrap items-center justify-between gap-3 py-3 text-sm">
                <div>
                  <p className="font-medium">{inv.email}</p>
                  <p className="text-graphite-soft">
                    {roleLabels[inv.role]} · {inv.status === 'expired' ? <span className="text-warn">expired</span> : 'pending'} · sent by {inv.invitedBy?.name || inv.invitedBy?.email || 'someone who left'} ·
                    expires <Time iso={inv.expiresAt} />
                  </p>
                </div>
                <Button tone="secondary" busy={revoke.isPending && revoke.variables === inv.id} onClick={() => revoke.mutate(inv.id)}>
                  Revoke
                </Button>
              </li>
            ))}
          </ul>
        ) : null}
      </div>
    </Panel>
  );
}

function InviteForm() {
  const form = useZodForm(CreateInvitationInputSchema);
  const create = useCreateInvitation();
  const [sentTo, setSentTo] = useState<string | null>(null);

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const element = event.currentTarget;
    const input = form.parse(element);
    if (!input) return;
    setSentTo(null);
    create.mutate(input, {
      onSuccess: (inv) => {
        setSentTo(inv.email);
        element.reset();
      },
      onError: (error) => form.applyProblem(error, element),
    });
  }

  return (
    <form noValidate onSubmit={onSubmit} aria-label="Invite someone" className="grid gap-4 sm:grid-cols-[1fr_12rem_auto] sm:items-start">
      <Field label="E-mail address" name="email" type="email" autoComplete="off" required error={form.errors.email} />
      <SelectField label="Role" name="role" defaultValue="developer" options={assignable} error={form.errors.role} />
      <Button type="submit" className="sm:mt-6" busy={create.isPending}>
        Send invitation
      </Button>
      <div className="sm:col-span-3" aria-live="polite">
        {form.formError ? <Alert tone="danger">{form.formError}</Alert> : null}
        {sentTo ? <Alert tone="ok">Invitation sent to {sentTo}.</Alert> : null}
      </div>
    </form>
  );
}
