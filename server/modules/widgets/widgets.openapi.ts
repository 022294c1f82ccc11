import { z } from 'zod';
import { ApiKeySchema } from '#shared/schemas/keys.ts';
import { UpdateApiKeyInputSchema } from '#shared/schemas/widgets.ts';
import { commonProblemResponses, registry } from '../../openapi/registry.ts';
import { registerConsolePath } from '../console/console.openapi.ts';

registry.registerPath({
  method: 'post',
  path: '/widgets/access',
  tags: ['Widgets'],
  summary: 'May this embed key be used from this page?',
  description:
    "For widgets on a page whose origin the API refused (a refused CORS preflight shows a page only a network error): the body is the embed key as text/plain, so the request is CORS-simple; the answer names the reason. Answered to any origin; no key header, not metered. The widget bundle itself is served at `/widgets/<version>/ohmstead-widgets.js` (immutable) and `/widgets/<major>/ohmstead-widgets.js` (moving), with `ohmstead-widgets.classic.js` as a classic script.",
  request: { body: { required: true, content: { 'text/plain': { schema: z.string().meta({ example: 'ohs_emb_…' }) } } } },
  responses: {
    200: {
      description: 'Whether the key may be used from the request\'s Origin, and why not.',
      content: {
        'application/json': {
          schema: z
            .object({
              allowed: z.boolean(),
              reason: z.enum(['allowed', 'not_an_embed_key', 'unknown_key', 'key_inactive', 'origin_not_listed']),
              origin: z.string().nullable(),
              detail: z.string(),
            })
            .meta({ id: 'WidgetAccess' }),
        },
      },
    },
    413: commonProblemResponses[413],
    500: commonProblemResponses[500],
  },
});

registerConsolePath({
  method: 'patch',
  path: '/keys/{keyId}',
  summary: 'Rename a key or change its allowed origins',
  description:
    "Sets a key's name and/or, for an embed key, its whole list of allowed origins (normalized to scheme://host[:port]; at least one, at most the plan's number). Developers may change only the keys they created. Takes effect at once on this server and within the key cache time elsewhere. Audited as api_key.updated with what changed.",
  access: ['owner', 'admin', 'developer'],
  params: z.object({ keyId: z.uuid() }),
  body: UpdateApiKeyInputSchema,
  response: { status: 200, description: 'The key as it is now.', schema: z.object({ key: ApiKeySchema }).meta({ id: 'UpdatedApiKey' }) },
  problems: { 404: 'No such key in this organization.', 409: 'The key is revoked or expired.' },
});
