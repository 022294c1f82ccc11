import { useState } from 'react';
import type { AuditEvent } from '#shared/schemas/accounts.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField } from '../../../components/ui/field.tsx';
import { EmptyState, ErrorState, LoadingState, PageHeader, Time } from '../../../components/ui/feedback.tsx';
import { TableScroll } from '../../../components/ui/table-scroll.tsx';
import { useAuditEvents } from '../api/get-audit-events.ts';

const filters = [
  { value: '', label: 'All actions' },
  { value: 'auth.', label: 'Sign-ins and sign-outs' },
  { value: 'auth.sign_in_failed', label: 'Failed sign-ins' },
  { value: 'member.', label: 'Members and roles' },
  { value: 'invitation.', label: 'Invitations' },
  { value: 'account.', label: 'Passwords and addresses' },
  { value: 'organization.', label: 'Organization' },
  { value: 'api_key.', label: 'Keys' },
  { value: 'plan.', label: 'Plan' },
];

const describe: Record<string, string> = {
  'auth.signed_in': 'Signed in',
  'auth.sign_in_failed': 'Failed sign-in',
  'auth.signed_out': 'Signed out',
  'auth.signed_out_everywhere': 'Signed out everywhere',
  'account.email_verified': 'Confirmed e-mail address',
  'account.password_changed': 'Changed password',
  'account.password_reset': 'Reset password by e-mail',
  'organization.created': 'Created the organization',
  'organization.renamed': 'Renamed the organization',
  'organization.ownership_transferred': 'Transferred ownership',
  'member.joined': 'Joined',
  'member.role_changed': 'Changed a role',
  'member.removed': 'Removed a member',
  'member.left': 'Left',
  'invitation.created': 'Invited',
  'invitation.revoked': 'Revoked an invitation',
  'invitation.accepted': 'Accepted an invitation',
};

function summary(e: AuditEvent): string {
  const d = e.details as Record<string, unknown>;
  const parts: string[] = [];
  if (typeof d.email === 'string') parts.push(d.email);
  if (typeof d.from === 'string' && typeof d.to === 'string') parts.push(`${d.from} → ${d.to}`);
  else if (typeof d.role === 'string') parts.push(d.role);
  if (typeof d.reason === 'string') parts.push(d.reason.replaceAll('_', ' '));
  return parts.join(' · ');
}

export function AuditPage() {
  const [action, setAction] = useState('');
  const events = useAuditEvents(action);
  const rows = events.data?.pages.flatMap((p) => p.events) ?? [];
  return (
    <div className="space-y-6">
      <PageHeader title="Audit log" summary="Security-relevant actions in this organization: who did what, when and from where. Visible to owners and admins." />
      <SelectField label="Show" name="action" value={action} onChange={(e) => setAction(e.target.value)} options={filters} className="max-w-xs" />
      {events.isPending ? <LoadingState label="Loading the audit log…" /> : null}
      {events.isError ? <ErrorState error={events.error} onRetry={() => void events.refetch()} /> : null}
      {events.isSuccess && rows.length === 0 ? <EmptyState title="Nothing recorded yet.">Actions appear here as people sign in, invite and change roles.</EmptyState> : null}
      {rows.length > 0 ? (
        <TableScroll label="Audit events" className="rounded-lg border border-line bg-white/60">
          <table className="w-full min-w-[48rem] text-left text-sm">
            <caption className="sr-only">Audit events, newest first</caption>
            <thead className="border-b border-line text-graphite-soft">
              <tr>
                <th scope="col" className="px-4 py-2 font-medium">When</th>
                <th scope="col" className="px-4 py-2 font-medium">Who</th>
                <th scope="col" className="px-4 py-2 font-medium">What</th>
                <th scope="col" className="px-4 py-2 font-medium">Details</th>
                <th scope="col" className="px-4 py-2 font-medium">Address</th>
              </tr>
            </thead>
            <tbody>
              {rows.map((e) => (
                <tr key={e.id} className="border-b border-line/60 align-top">
                  <td className="whitespace-nowrap px-4 py-2">
                    <Time iso={e.createdAt} />
                  </td>
                  <td className="px-4 py-2">{e.actor ? e.actor.name || e.actor.email : <span className="text-graphite-soft">—</span>}</td>
                  <td className="px-4 py-2">
                    <span className={e.action === 'auth.sign_in_failed' ? 'font-medium text-danger' : ''}>{describe[e.action] ?? e.action}</span>
                    <span className="block font-mono text-xs text-graphite-soft">{e.action}</span>
                  </td>
                  <td className="px-4 py-2">{summary(e)}</td>
                  <td className="px-4 py-2">
                    <span className="font-mono text-xs">{e.ip ?? '—'}</span>
                    {e.userAgent ? <span className="block max-w-56 truncate text-xs text-graphite-soft" title={e.userAgent}>{e.userAgent}</span> : null}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </TableScroll>
      ) : null}
      {events.hasNextPage ? (
        <Button tone="secondary" busy={events.isFetchingNextPage} onClick={() => void events.fetchNextPage()}>
          Show older
        </Button>
      ) : null}
    </div>
  );
}
