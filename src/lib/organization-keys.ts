/**
 * The organization's API keys as the console lists them (never a secret), for pages that pick or count
 * keys (playground, overview). Always refetched on mount, so a key made on the Keys page shows at once.
 */
import { queryOptions, useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { z } from 'zod';
import { ApiKeySchema, type ApiKeyView } from '#shared/schemas/keys.ts';
import { apiRequest } from './api-client.ts';

const KeyListSchema = z.object({ items: z.array(ApiKeySchema) });

export async function getOrganizationKeys(): Promise<ApiKeyView[]> {
  return (await apiRequest('/console-api/keys', { schema: KeyListSchema })).items;
}

export const organizationKeysQueryOptions = () =>
  queryOptions({ queryKey: ['organization-keys'], queryFn: getOrganizationKeys, staleTime: 0, refetchOnMount: 'always' });

export const useOrganizationKeys = () => useQuery(organizationKeysQueryOptions());

export const isUsable = (key: ApiKeyView) => key.status === 'active' || key.status === 'expiring';

/** How a key is written where its secret would be: prefix, a run of dots, the last four characters. */
export const maskedKey = (key: Pick<ApiKeyView, 'displayPrefix' | 'last4'>) => `${key.displayPrefix}••••••••${key.last4}`;

const CHOSEN_KEY = 'ohmstead.chosenServerKeyId';

/**
 * The server key the viewer works with in the playground and in code snippets: the one chosen last in
 * this browser when it is still usable, else the most recently created usable server key.
 */
export function useChosenServerKey() {
  const keys = useOrganizationKeys();
  const usable = (keys.data ?? []).filter((k) => k.kind === 'server' && isUsable(k));
  const [chosenId, setChosenId] = useState<string | null>(() => {
    try {
      return localStorage.getItem(CHOSEN_KEY);
    } catch {
      return null;
    }
  });
  const chosen = usable.find((k) => k.id === chosenId) ?? usable[0];
  const choose = (id: string) => {
    setChosenId(id);
    try {
      localStorage.setItem(CHOSEN_KEY, id);
    } catch {
      // Private mode: remembered for this page only.
    }
  };
  return { keys, usable, chosen, choose };
}
