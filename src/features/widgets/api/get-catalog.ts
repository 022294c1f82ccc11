/** The catalog's items, to offer as preselected products in a widget's options (same query as the Catalog page). */
import { queryOptions, useQuery } from '@tanstack/react-query';
import { CatalogSchema } from '#shared/schemas/catalog.ts';
import { apiRequest } from '../../../lib/api-client.ts';

export const catalogForWidgetsQueryOptions = () => queryOptions({ queryKey: ['catalog'], queryFn: () => apiRequest('/console-api/catalog', { schema: CatalogSchema }) });
export const useCatalogForWidgets = () => useQuery(catalogForWidgetsQueryOptions());
