import { queryOptions, useQuery } from '@tanstack/react-query';
import { InvoiceListSchema } from '#shared/schemas/billing.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { billingPaths } from './billing-paths.ts';

export const getInvoices = () => apiRequest(billingPaths.invoices, { schema: InvoiceListSchema });

export const invoicesQueryOptions = () => queryOptions({ queryKey: ['billing', 'invoices'], queryFn: getInvoices });

export const useInvoices = () => useQuery(invoicesQueryOptions());
