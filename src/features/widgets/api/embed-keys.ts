/**
 * The organization's embed keys for the Widgets page: list, create (its key is shown once and kept in this
 * browser for the snippet and the preview: embed keys are public by design), and change a key's name or
 * allowed origins (`PATCH /console-api/keys/{keyId}`).
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { ApiKeySchema, CreatedApiKeySchema, type ApiKeyView } from '#shared/schemas/keys.ts';
import type { UpdateApiKeyInput } from '#shared/schemas/widgets.ts';
import { apiRequest } from '../../../lib/api-client.ts';

const keysPath = '/console-api/keys';
const KeyListSchema = z.object({ items: z.array(ApiKeySchema) });

export const getEmbedKeys = async (): Promise<ApiKeyView[]> =>
  (await apiRequest(keysPath, { schema: KeyListSchema })).items.filter((k) => k.kind === 'embed' && (k.status === 'active' || k.status === 'expiring'));

export const embedKeysQueryOptions = () => queryOptions({ queryKey: ['keys', 'embed'], queryFn: getEmbedKeys, staleTime: 0 });
export const useEmbedKeys = () => useQuery(embedKeysQueryOptions());

export function useCreateEmbedKey() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: { name: string; allowedOrigins: string[] }) => apiRequest(keysPath, { method: 'POST', body: { ...input, kind: 'embed' }, schema: CreatedApiKeySchema }),
    onSuccess: ({ key, secret }) => {
      rememberKey(key.id, secret);
      return client.invalidateQueries({ queryKey: ['keys'] });
    },
  });
}

export function useUpdateKey() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ id, change }: { id: string; change: UpdateApiKeyInput }) =>
      apiRequest(`${keysPath}/${encodeURIComponent(id)}`, { method: 'PATCH', body: change, schema: z.object({ key: ApiKeySchema }) }),
    onSuccess: () => client.invalidateQueries({ queryKey: ['keys'] }),
  });
}

// Embed keys are public (they sit in every page that embeds a widget), so this browser may keep them.
const STORE = 'ohmstead.embedKeys';
function stored(): Record<string, string> {
  try {
    return JSON.parse(localStorage.getItem(STORE) ?? '{}') as Record<string, string>;
  } catch {
    return {};
  }
}
export function rememberKey(id: string, secret: string): void {
  try {
    localStorage.setItem(STORE, JSON.stringify({ ...stored(), [id]: secret }));
  } catch {
    // Private browsing: the key is still shown for this visit.
  }
}
export const rememberedKey = (id: string): string | undefined => stored()[id];

/** Whether a pasted key is this key: its kind prefix, first characters and last four match. */
export const matchesKey = (key: Pick<ApiKeyView, 'displayPrefix' | 'last4'>, pasted: string) =>
  /^ohs_emb_[A-Za-z0-9]{32,}$/.test(pasted) && pasted.startsWith(key.displayPrefix) && pasted.endsWith(key.last4);
