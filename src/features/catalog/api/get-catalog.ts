import { queryOptions, useQuery } from '@tanstack/react-query';
import { CatalogSchema } from '#shared/schemas/catalog.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { catalogPaths } from './catalog-paths.ts';

export const getCatalog = () => apiRequest(catalogPaths.catalog, { schema: CatalogSchema });
export const catalogQueryOptions = () => queryOptions({ queryKey: ['catalog'], queryFn: getCatalog });
export const useCatalog = () => useQuery(catalogQueryOptions());
