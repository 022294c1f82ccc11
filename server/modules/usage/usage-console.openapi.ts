/** OpenAPI registration of the console's usage routes (usage-console.routes.ts): the month's use and the recent-calls log. */
import { ConsoleUsageQuerySchema, ConsoleUsageSchema, RequestLogPageSchema, RequestLogQuerySchema } from '#shared/schemas/keys.ts';
import { registerConsolePath } from '../console/console.openapi.ts';

registerConsolePath({
  method: 'get',
  path: '/usage',
  summary: "The organization's usage for a month",
  description: 'Calls counted for a UTC calendar month (default: this one) against the plan: by day, by endpoint, by key, and by day and endpoint. These are the counts the bill is made from.',
  access: ['owner', 'admin', 'developer', 'viewer'],
  query: ConsoleUsageQuerySchema,
  response: { status: 200, description: 'Usage for the month.', schema: ConsoleUsageSchema },
  problems: { 400: 'The month is not YYYY-MM.' },
});

registerConsolePath({
  method: 'get',
  path: '/requests',
  summary: 'Recent API calls',
  description: "The organization's recent /v1 calls (time, key, endpoint, status, duration, request id), newest first, filtered by key, endpoint or status class and paged by `before`. A diagnostic view kept 30 days; the counts are the bill.",
  access: ['owner', 'admin', 'developer', 'viewer'],
  query: RequestLogQuerySchema,
  response: { status: 200, description: 'A page of calls.', schema: RequestLogPageSchema },
  problems: { 400: 'A filter is not valid.' },
});
