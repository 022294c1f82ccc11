import { Link, useNavigate } from 'react-router';
import type { SessionInfo } from '#shared/schemas/accounts.ts';
import { useSwitchOrganization } from '../api/switch-organization.ts';

/** Chooses the active organization; everything on screen then follows it. */
export function OrganizationSwitcher({ session }: { session: SessionInfo }) {
  const switchOrg = useSwitchOrganization();
  const navigate = useNavigate();
  const current = session.organization;
  return (
    <div className="px-5 pb-3">
      {session.organizations.length > 1 ? (
        <label className="block text-xs font-medium uppercase tracking-wide text-graphite-soft">
          Organization
          <select
            className="mt-1 block w-full rounded-md border border-line bg-white px-2 py-2 text-sm normal-case tracking-normal text-graphite"
            value={current?.id ?? ''}
            disabled={switchOrg.isPending}
            onChange={(e) => switchOrg.mutate(e.target.value, { onSuccess: () => navigate('/') })}
          >
            {session.organizations.map((o) => (
              <option key={o.id} value={o.id}>
                {o.name} ({o.role})
              </option>
            ))}
          </select>
        </label>
      ) : (
        <p className="text-sm">
          <span className="block text-xs font-medium uppercase tracking-wide text-graphite-soft">Organization</span>
          {current ? (
            <span className="font-medium">
              {current.name} <span className="text-graphite-soft">({current.role})</span>
            </span>
          ) : (
            <span className="text-graphite-soft">None yet</span>
          )}
        </p>
      )}
      {switchOrg.isError ? (
        <p role="alert" className="mt-1 text-sm text-danger">
          {switchOrg.error.message}
        </p>
      ) : null}
      <Link to="/organizations/new" className="mt-1 inline-block text-sm text-copper underline-offset-2 hover:underline">
        New organization…
      </Link>
    </div>
  );
}
