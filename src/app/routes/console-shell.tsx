import { Link, Outlet, useNavigate } from 'react-router';
import { ConsoleLayout } from '../../components/layout/console-layout.tsx';
import { useSignOut } from '../../features/auth/api/sign-out.ts';
import { RequireSession } from '../../features/auth/components/require-session.tsx';
import { CreateOrganizationPage } from '../../features/organization/components/create-organization-page.tsx';
import { OrganizationSwitcher } from '../../features/organization/components/organization-switcher.tsx';
import { useSession } from '../../lib/session.ts';
import { visibleSections } from '../sections.ts';

function AccountMenu() {
  const session = useSession();
  const signOut = useSignOut();
  const navigate = useNavigate();
  const user = session.data?.user;
  if (!user) return null;
  return (
    <div className="text-sm">
      <p className="truncate font-medium" title={user.email}>
        {user.name || user.email}
      </p>
      <p className="truncate text-graphite-soft">{user.email}</p>
      <div className="mt-2 flex flex-wrap gap-x-4">
        <Link to="/account" className="text-copper underline-offset-2 hover:underline">
          Account
        </Link>
        <button
          type="button"
          className="text-copper underline-offset-2 hover:underline disabled:opacity-60"
          disabled={signOut.isPending}
          onClick={() => signOut.mutate(undefined, { onSettled: () => navigate('/sign-in', { replace: true }) })}
        >
          Sign out
        </button>
      </div>
    </div>
  );
}

/** Signed in: the console frame; without an organization: the way to get one. */
function Shell() {
  const session = useSession();
  const data = session.data!;
  return (
    <ConsoleLayout sections={data.organization ? visibleSections(data.organization.role) : []} organization={<OrganizationSwitcher session={data} />} account={<AccountMenu />} />
    
  );
}

export function ConsoleShell() {
  return (
    <RequireSession>
      <Shell />
    </RequireSession>
  );
}

/** Pages that need an organization show how to get one when there is none. */
export function RequireOrganization() {
  const session = useSession();
  if (!session.data?.organization) return <CreateOrganizationPage first />;
  return <Outlet />;
}
