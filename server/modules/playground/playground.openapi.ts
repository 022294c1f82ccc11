import { registerConsolePath } from '../console/console.openapi.ts';
import { PLAYGROUND_ROLES, playgroundCalculations } from './playground.calcs.ts';

for (const calc of playgroundCalculations) {
  registerConsolePath({
    method: 'post',
    path: calc.path,
    summary: `Playground: ${calc.summary.charAt(0).toLowerCase()}${calc.summary.slice(1)}`,
    description: `Runs \`POST ${calc.endpoint}\` for the console's playground under one of the organization's server keys, named by \`keyId\` (the console never holds a key's secret). The call is checked like a /v1 call (the key must be an active server key of this organization), metered and counted against that key and the organization's quota under ${calc.endpoint}, and shown in the request log. The answer is the v1 answer, with the RateLimit headers.`,
    access: PLAYGROUND_ROLES,
    body: calc.body,
    response: { status: 200, description: 'The calculation result, as the v1 endpoint answers it.', schema: calc.result },
    problems: {
      404: 'No key with this id in the organization.',
      422: 'The input failed validation, the calculation cannot be solved, or the key is revoked, expired or not a server key (`errors[].code`: key_revoked, key_expired, key_not_server).',
      429: "The organization's rate limit or monthly quota is reached; see Retry-After.",
    },
  });
}
