import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { apiPaths } from '../lib/api-paths.ts';

/** Shown only where the server offers the development mailbox (never in production). */
export function DevMailboxLink({ children = 'Open the development mailbox' }: { children?: string }) {
  const { data: available } = useQuery({
    queryKey: ['dev', 'mailbox', 'available'],
    queryFn: async () => (await fetch(apiPaths.devMailbox, { credentials: 'same-origin' })).ok,
    staleTime: Infinity,
    retry: false,
  });
  if (!available) return null;
  return (
    <Link to="/dev/mailbox" className="text-copper underline underline-offset-2">
      {children}
    </Link>
  );
}
