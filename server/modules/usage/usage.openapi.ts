import { UsageQuerySchema, UsageResultSchema } from '#shared/schemas/usage.ts';
import { apiKeySecurity, commonProblemResponses, problemResponse, registry } from '../../openapi/registry.ts';

registry.registerPath({
  method: 'get',
  path: '/v1/usage',
  tags: ['Usage'],
  summary: 'Calls counted this month',
  description:
    "The calling key's organization's metered calls for a UTC calendar month: the plan, the quota, calls used and remaining, when it resets, and calls per day and endpoint. Needs a server key; not metered.",
  security: [{ [apiKeySecurity.name]: [] }],
  request: { query: UsageQuerySchema },
  responses: {
    200: { description: 'Usage for the month.', content: { 'application/json': { schema: UsageResultSchema } } },
    400: commonProblemResponses[400],
    401: problemResponse('Missing or invalid API key.'),
    403: problemResponse('Embed keys cannot read usage.'),
  },
});
