import { useMutation, useQueryClient } from '@tanstack/react-query';
import { CatalogHostSchema, CatalogPackSchema, type CatalogHostInput, type CatalogKind, type CatalogPackInput } from '#shared/schemas/catalog.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { catalogPaths } from './catalog-paths.ts';
import { catalogQueryOptions } from './get-catalog.ts';

export type SaveItemInput =
  | { kind: 'hosts'; id?: string; item: CatalogHostInput }
  | { kind: 'packs'; id?: string; item: CatalogPackInput };

/** Adds an item (no id) or replaces one. */
export function saveItem(input: SaveItemInput) {
  const schema = input.kind === 'hosts' ? CatalogHostSchema : CatalogPackSchema;
  return input.id
    ? apiRequest(catalogPaths.item(input.kind, input.id), { method: 'PUT', body: input.item, schema })
    : apiRequest(catalogPaths.items(input.kind), { method: 'POST', body: input.item, schema });
}

export function useSaveItem() {
  const client = useQueryClient();
  return useMutation({ mutationFn: saveItem, onSuccess: () => client.invalidateQueries({ queryKey: catalogQueryOptions().queryKey }) });
}

export const deleteItem = (input: { kind: CatalogKind; id: string }) => apiRequest(catalogPaths.item(input.kind, input.id), { method: 'DELETE' });

export function useDeleteItem() {
  const client = useQueryClient();
  return useMutation({ mutationFn: deleteItem, onSuccess: () => client.invalidateQueries({ queryKey: catalogQueryOptions().queryKey }) });
}
