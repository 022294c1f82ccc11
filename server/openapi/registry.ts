/**
 * The one OpenAPI registry. Modules register their paths in their own `*.openapi.ts`; shared zod schemas
 * carry their component id, description and example in `.meta()`, which the generator reads.
 */
import { OpenAPIRegistry, extendZodWithOpenApi } from '@asteasolutions/zod-to-openapi';
import { z } from 'zod';
import { ProblemDetailsSchema } from '#shared/schemas/problem.ts';

// Shared schemas describe themselves with zod's own `.meta()`; the extension is only for registry helpers.
extendZodWithOpenApi(z);

export const registry = new OpenAPIRegistry();

export const apiKeySecurity = registry.registerComponent('securitySchemes', 'ApiKey', {
  type: 'http',
  scheme: 'bearer',
  description: 'An Ohmstead API key: a server key (`ohs_srv_…`) from your own servers, or an embed key (`ohs_emb_…`) from a listed origin.',
});

const problem = (description: string) => ({
  description,
  content: { 'application/problem+json': { schema: ProblemDetailsSchema } },
});

/** Problem responses every JSON endpoint can give. */
export const commonProblemResponses = {
  400: problem('The request could not be read (malformed JSON or parameters).'),
  413: problem('The body is larger than accepted.'),
  415: problem('The body is not JSON.'),
  422: problem('The body failed validation; `errors[]` lists each field by JSON Pointer.'),
  500: problem('An unexpected error; quote the request id.'),
} as const;

export const problemResponse = problem;
