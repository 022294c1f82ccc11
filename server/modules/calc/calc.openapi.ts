import type { z } from 'zod';
import { apiKeySecurity, commonProblemResponses, problemResponse, registry } from '../../openapi/registry.ts';

/** Registers a calculation endpoint: POST, JSON body, the envelope response, the problem responses. */
export function registerCalcPath(options: {
  path: string;
  tag: string;
  summary: string;
  description: string;
  request: z.ZodType;
  response: z.ZodType;
  requestExample: unknown;
  responseExample?: unknown;
  extraRequestContent?: Record<string, { schema: z.ZodType | { type: string }; example?: unknown }>;
}) {
  registry.registerPath({
    method: 'post',
    path: options.path,
    tags: [options.tag],
    summary: options.summary,
    description: options.description,
    security: [{ [apiKeySecurity.name]: [] }],
    request: {
      body: {
        required: true,
        content: {
          'application/json': { schema: options.request, examples: { worked: { summary: 'Worked example', value: options.requestExample } } },
          ...(options.extraRequestContent as object),
        },
      },
    },
    responses: {
      200: {
        description: 'The result, with checks, cautions and the basis it was worked out on.',
        content: {
          'application/json': {
            schema: options.response,
            ...(options.responseExample ? { examples: { worked: { summary: 'Worked example', value: options.responseExample } } } : {}),
          },
        },
      },
      ...commonProblemResponses,
      401: problemResponse('Missing, malformed, unknown, revoked or expired API key.'),
      403: problemResponse('The key may not call this endpoint from here (embed key origin or scope).'),
      429: problemResponse('Rate limit or monthly quota reached; see Retry-After and the RateLimit headers.'),
    },
  });
}

/** Registers a GET reference endpoint (key required, not metered). */
export function registerReferencePath(options: { path: string; tag: string; summary: string; description: string; response: z.ZodType }) {
  registry.registerPath({
    method: 'get',
    path: options.path,
    tags: [options.tag],
    summary: options.summary,
    description: options.description,
    security: [{ [apiKeySecurity.name]: [] }],
    responses: {
      200: { description: 'The reference data.', content: { 'application/json': { schema: options.response } } },
      401: problemResponse('Missing or invalid API key.'),
      500: commonProblemResponses[500],
    },
  });
}
