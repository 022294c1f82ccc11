import { queryOptions, useQuery } from '@tanstack/react-query';
import { CompatibilityMatrixResultSchema } from '#shared/schemas/compatibility-matrix.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { catalogPaths } from './catalog-paths.ts';

export const getMatrix = () => apiRequest(catalogPaths.matrix, { schema: CompatibilityMatrixResultSchema });
export const matrixQueryOptions = () => queryOptions({ queryKey: ['catalog', 'matrix'], queryFn: getMatrix, retry: false });
export const useMatrix = (enabled: boolean) => useQuery({ ...matrixQueryOptions(), enabled });
