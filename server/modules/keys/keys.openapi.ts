/**
 * OpenAPI registration of the console's key routes (keys.routes.ts): list, create (the secret in this one
 * answer), revoke and rotate. Registering them also puts them in the role × route matrix and the fuzzers,
 * which read the document. `PATCH /keys/{keyId}` is registered with the widgets, whose page uses it.
 */
import { z } from 'zod';
import { ApiKeySchema, CreateApiKeyInputSchema, CreatedApiKeySchema, RotateApiKeyInputSchema } from '#shared/schemas/keys.ts';
import { registerConsolePath } from '../console/console.openapi.ts';

const KeyIdParams = z.object({ keyId: z.uuid() });

registerConsolePath({
  method: 'get',
  path: '/keys',
  summary: "The organization's API keys",
  description: 'Every server and embed key of the active organization, newest first: name, kind, display prefix and last four characters, origins, who created it, last use, expiry and status. Never the secret or its hash.',
  access: ['owner', 'admin', 'developer', 'viewer'],
  response: { status: 200, description: 'The keys.', schema: z.object({ items: z.array(ApiKeySchema) }).meta({ id: 'ApiKeyList' }) },
});

registerConsolePath({
  method: 'post',
  path: '/keys',
  summary: 'Create an API key',
  description: 'Creates a server key, or an embed key with the origins it may be used from. The whole key is in this answer only: it is stored as a keyed hash. Audited as api_key.created.',
  access: ['owner', 'admin', 'developer'],
  body: CreateApiKeyInputSchema,
  response: { status: 201, description: 'The key, with its secret shown this once.', schema: CreatedApiKeySchema },
  problems: { 409: 'The plan allows no more keys or origins.' },
});

registerConsolePath({
  method: 'post',
  path: '/keys/{keyId}/revoke',
  summary: 'Revoke an API key',
  description: 'Stops the key at once on this server and within the key cache time elsewhere. Developers may revoke only the keys they created. Audited as api_key.revoked.',
  access: ['owner', 'admin', 'developer'],
  params: KeyIdParams,
  response: { status: 200, description: 'The key as it is now.', schema: z.object({ key: ApiKeySchema }).meta({ id: 'RevokedApiKey' }) },
  problems: { 404: 'No such key in this organization.', 409: 'The key is already revoked or expired.' },
});

registerConsolePath({
  method: 'post',
  path: '/keys/{keyId}/rotate',
  summary: 'Rotate an API key',
  description: 'Creates a replacement key (its secret in this answer only) and lets the old one keep working for the overlap, then expire. Developers may rotate only the keys they created. Audited as api_key.rotated.',
  access: ['owner', 'admin', 'developer'],
  params: KeyIdParams,
  body: RotateApiKeyInputSchema,
  response: {
    status: 201,
    description: 'The new key with its secret, and the old key with its expiry.',
    schema: z.object({ key: ApiKeySchema, secret: z.string(), previous: ApiKeySchema }).meta({ id: 'RotatedApiKey' }),
  },
  problems: { 404: 'No such key in this organization.', 409: 'The key is revoked or expired.' },
});
