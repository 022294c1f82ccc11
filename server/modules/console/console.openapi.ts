/**
 * OpenAPI registration for console routes (tag "Console"): cookie session auth, the CSRF header on every
 * state-changing request, and problem responses. `consoleRoutes` lists every route registered here, with
 * who may call each; the accounts role × route matrix test checks itself against the accounts part of it.
 */
import { z } from 'zod';
import { CSRF_HEADER, CSRF_HEADER_VALUE, type Role } from '#shared/schemas/accounts.ts';
import { commonProblemResponses, problemResponse, registry } from '../../openapi/registry.ts';

export const consoleSessionSecurity = registry.registerComponent('securitySchemes', 'ConsoleSession', {
  type: 'apiKey',
  in: 'cookie',
  name: '__Host-ohs_session',
  description:
    'The console session cookie set by sign-in (HttpOnly, SameSite=Lax; named `ohs_session` without the `__Host-` prefix when served over plain HTTP on loopback). Console routes never accept API keys.',
});

/** Who may call a route: anyone, any signed-in user, the listed roles in the active organization, or development only. */
export type ConsoleAccess = 'public' | 'session' | 'development' | readonly Role[];

export interface ConsoleRoute {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: string;
  access: ConsoleAccess;
}

export const consoleRoutes: ConsoleRoute[] = [];

const CsrfHeaders = z.object({
  [CSRF_HEADER]: z.literal(CSRF_HEADER_VALUE).meta({ description: 'Required on every state-changing console request (cross-site request forgery defence).' }),
});

export function registerConsolePath(options: {
  method: ConsoleRoute['method'];
  /** Below /console-api, with {param} placeholders. */
  path: string;
  summary: string;
  description: string;
  access: ConsoleAccess;
  params?: z.ZodObject;
  query?: z.ZodObject;
  body?: z.ZodType;
  response: { status: 200 | 201 | 202 | 204; description: string; schema?: z.ZodType };
  problems?: Partial<Record<400 | 401 | 403 | 404 | 409 | 422 | 429, string>>;
}) {
  const path = `/console-api${options.path}`;
  consoleRoutes.push({ method: options.method, path, access: options.access });
  const changes = options.method !== 'get';
  const who =
    options.access === 'public'
      ? 'No session needed.'
      : options.access === 'session'
        ? 'Any signed-in user.'
        : options.access === 'development'
          ? 'Development only: absent in production.'
          : `Roles: ${options.access.join(', ')} (in the active organization).`;
  const problems: Partial<Record<number, string>> = {
    ...(options.access !== 'public' && options.access !== 'development' ? { 401: 'Not signed in, or the session has ended.' } : {}),
    ...(Array.isArray(options.access) ? { 403: 'Your role in the active organization does not allow this.' } : {}),
    ...(changes ? { 403: `Refused as a possible cross-site request (missing ${CSRF_HEADER}, foreign Origin or Sec-Fetch-Site)${Array.isArray(options.access) ? ', or your role does not allow this' : ''}.` } : {}),
    ...options.problems,
  };
  registry.registerPath({
    method: options.method,
    path,
    tags: ['Console'],
    summary: options.summary,
    description: `${options.description}\n\n${who}`,
    security: options.access === 'public' || options.access === 'development' ? [] : [{ [consoleSessionSecurity.name]: [] }],
    request: {
      ...(options.params ? { params: options.params } : {}),
      ...(options.query ? { query: options.query } : {}),
      ...(changes ? { headers: CsrfHeaders } : {}),
      ...(options.body ? { body: { required: true, content: { 'application/json': { schema: options.body } } } } : {}),
    },
    responses: {
      [options.response.status]: options.response.schema
        ? { description: options.response.description, content: { 'application/json': { schema: options.response.schema } } }
        : { description: options.response.description },
      ...(options.body ? { 400: commonProblemResponses[400], 415: commonProblemResponses[415], 422: commonProblemResponses[422] } : {}),
      ...Object.fromEntries(Object.entries(problems).map(([status, text]) => [status, problemResponse(text ?? '')])),
      500: commonProblemResponses[500],
    },
  });
}
