import { MutationCache, QueryCache, QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { useState, type ReactNode } from 'react';
import { isProblem } from '../lib/api-client.ts';
import { sessionQueryOptions } from '../lib/session.ts';

export function AppProvider({ children }: { children: ReactNode }) {
  const [queryClient] = useState(() => {
    // A 401 anywhere means the session ended (idle, signed out elsewhere): recheck it, which sends the
    // visitor to sign-in.
    const onError = (error: unknown) => {
      if (isProblem(error, 401)) void client.invalidateQueries(sessionQueryOptions());
    };
    const client: QueryClient = new QueryClient({
      queryCache: new QueryCache({ onError }),
      mutationCache: new MutationCache({ onError }),
      defaultOptions: {
        queries: {
          staleTime: 30_000,
          refetchOnWindowFocus: false,
          // Problems a retry cannot fix (4xx) are shown at once.
          retry: (count, error) => count < 1 && !(isProblem(error) && error.status >= 400 && error.status < 500),
        },
      },
    });
    return client;
  });
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}
