import { queryOptions, useQuery } from '@tanstack/react-query';
import { OrganizationSchema } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';

export const getOrganization = () => apiRequest(apiPaths.organization, { schema: OrganizationSchema });

export const organizationQueryOptions = () => queryOptions({ queryKey: ['organization'], queryFn: getOrganization });

export const useOrganization = () => useQuery(organizationQueryOptions());
