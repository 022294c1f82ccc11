import { queryOptions, useQuery } from '@tanstack/react-query';
import { MailboxSchema } from '#shared/schemas/accounts.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { apiPaths } from '../../../lib/api-paths.ts';

export const getMailbox = () => apiRequest(apiPaths.devMailbox, { schema: MailboxSchema });

export const mailboxQueryOptions = () => queryOptions({ queryKey: ['dev', 'mailbox'], queryFn: getMailbox, refetchInterval: 5_000, retry: false });

export const useMailbox = () => useQuery(mailboxQueryOptions());
