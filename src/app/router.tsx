import type { ReactNode } from 'react';
import { createBrowserRouter, Navigate, RouterProvider } from 'react-router';
import { CreateOrganizationPage } from '../features/organization/components/create-organization-page.tsx';
import { useSession } from '../lib/session.ts';
import { ConsoleShell, RequireOrganization } from './routes/console-shell.tsx';
import { NotBuiltYet } from './routes/not-built.tsx';
import { NotFoundPage } from './routes/not-found.tsx';
import { sections } from './sections.ts';

// Pages load on first visit (one chunk per feature).
const lazyPage = (load: () => Promise<{ Component: () => ReactNode }>) => ({ lazy: load });
const auth = () => import('../features/auth/index.ts');

/** Signed-in visitors skip the sign-in and sign-up pages. */
function SignedOutOnly({ children }: { children: ReactNode }) {
  const session = useSession();
  if (session.data) return <Navigate to="/" replace />;
  return <>{children}</>;
}

const built: Record<string, ReturnType<typeof lazyPage>> = {
  '/team': lazyPage(async () => ({ Component: (await import('../features/team/components/team-page.tsx')).TeamPage })),
  '/audit': lazyPage(async () => ({ Component: (await import('../features/audit/components/audit-page.tsx')).AuditPage })),
  '/settings': lazyPage(async () => ({ Component: (await import('../features/organization/components/settings-page.tsx')).SettingsPage })),
  '/keys': lazyPage(async () => ({ Component: (await import('../features/keys/components/keys-page.tsx')).KeysPage })),
  '/usage': lazyPage(async () => ({ Component: (await import('../features/usage/components/usage-page.tsx')).UsagePage })),
  '/billing': lazyPage(async () => ({ Component: (await import('../features/billing/components/billing-page.tsx')).BillingPage })),
  '/catalog': lazyPage(async () => ({ Component: (await import('../features/catalog/components/catalog-page.tsx')).CatalogPage })),
  '/widgets': lazyPage(async () => ({ Component: (await import('../features/widgets/components/widgets-page.tsx')).WidgetsPage })),
  '/': lazyPage(async () => ({ Component: (await import('../features/overview/components/overview-page.tsx')).OverviewPage })),
  '/playground': Object.assign(lazyPage(async () => ({ Component: (await import('../features/playground/components/playground-page.tsx')).PlaygroundPage })), { path: 'playground/*' }),
  '/reference': lazyPage(async () => ({ Component: (await import('../features/reference/components/reference-page.tsx')).ReferencePage })),
};

const router = createBrowserRouter([
  {
    path: '/sign-in',
    lazy: async () => {
      const { SignInPage } = await auth();
      return { Component: () => <SignedOutOnly><SignInPage /></SignedOutOnly> };
    },
  },
  {
    path: '/sign-up',
    lazy: async () => {
      const { SignUpPage } = await auth();
      return { Component: () => <SignedOutOnly><SignUpPage /></SignedOutOnly> };
    },
  },
  { path: '/verify-email', lazy: async () => ({ Component: (await auth()).VerifyEmailPage }) },
  { path: '/forgot-password', lazy: async () => ({ Component: (await auth()).ForgotPasswordPage }) },
  { path: '/reset-password', lazy: async () => ({ Component: (await auth()).ResetPasswordPage }) },
  {
    path: '/invitations/accept',
    lazy: async () => ({ Component: (await import('../features/invitations/components/accept-invitation-page.tsx')).AcceptInvitationPage }),
  },
  { path: '/dev/mailbox', lazy: async () => ({ Component: (await import('../features/dev-mailbox/components/mailbox-page.tsx')).MailboxPage }) },
  {
    path: '/',
    element: <ConsoleShell />,
    children: [
      { path: 'account', lazy: async () => ({ Component: (await import('../features/account/components/account-page.tsx')).AccountPage }) },
      { path: 'organizations/new', element: <CreateOrganizationPage /> },
      {
        element: <RequireOrganization />,
        children: sections.map((s) => {
          const page = built[s.path] ?? { element: <NotBuiltYet /> };
          return s.path === '/' ? { index: true, ...page } : { path: s.path.slice(1), ...page };
        }),
      },
      { path: '*', element: <NotFoundPage /> },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
