import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { AppError, problemBody, problemTypes, toJsonPointer, type FieldError, type ProblemSlug } from './problem.ts';

function send(res: Parameters<RequestHandler>[1], status: number, body: object) {
  res.status(status).type('application/problem+json').send(JSON.stringify(body));
}

/** Unknown routes: a 404 problem. */
export const notFoundHandler: RequestHandler = (req, res) => {
  send(res, 404, problemBody('not-found', `No route matches ${req.method} ${req.path}.`, requestRefs(req)));
};

function requestRefs(req: Parameters<RequestHandler>[0]) {
  const id = String(req.id ?? '');
  return id ? { instance: `/requests/${id}`, requestId: id } : {};
}

export function zodIssuesToFieldErrors(error: ZodError, location: 'body' | 'query' = 'body'): FieldError[] {
  return error.issues.map((issue) =>
    location === 'body'
      ? { pointer: toJsonPointer(issue.path), detail: issue.message, code: issue.code }
      : { parameter: issue.path.join('.'), detail: issue.message, code: issue.code },
  );
}

export function describeFieldErrors(errors: FieldError[]): string {
  const where = (e: FieldError) => e.pointer ?? e.parameter ?? e.header ?? '';
  const listed = errors.slice(0, 5).map((e) => `${where(e)} (${e.detail})`).join('; ');
  const more = errors.length > 5 ? `; and ${errors.length - 5} more` : '';
  return `${errors.length} ${errors.length === 1 ? 'field is' : 'fields are'} invalid: ${listed}${more}`;
}

interface BodyParserError extends Error {
  type?: string;
  status?: number;
  limit?: number;
}

const bodyParserProblems: Record<string, ProblemSlug> = {
  'entity.parse.failed': 'malformed-request',
  'entity.too.large': 'payload-too-large',
  'encoding.unsupported': 'unsupported-media-type',
  'charset.unsupported': 'unsupported-media-type',
  'request.aborted': 'malformed-request',
  'request.size.invalid': 'malformed-request',
  'stream.encoding.set': 'internal-error',
};

/**
 * Errors that mean the database cannot be reached right now (refused or cut connections, a server shutting
 * down or starting up: SQLSTATE classes 08 and 57P), looked for along the `cause` chain (Drizzle wraps the
 * driver's error). They are a 503 with Retry-After, not a 500: nothing is wrong with the request, and a
 * load balancer or client should simply try again.
 */
const UNAVAILABLE_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'EPIPE', '57P01', '57P02', '57P03', '08000', '08001', '08003', '08004', '08006']);
export function isDatabaseUnavailable(err: unknown): boolean {
  for (let e = err as { code?: unknown; message?: unknown; cause?: unknown } | undefined, depth = 0; e && depth < 5; e = e.cause as typeof e, depth += 1) {
    if (typeof e.code === 'string' && UNAVAILABLE_CODES.has(e.code)) return true;
    if (typeof e.message === 'string' && /^Connection terminated|timeout exceeded when trying to connect/.test(e.message)) return true;
  }
  return false;
}

/** The one error handler, mounted last: every error becomes RFC 9457 problem details. */
export const errorHandler: ErrorRequestHandler = (err: unknown, req, res, next) => {
  if (res.headersSent) {
    next(err);
    return;
  }
  const refs = requestRefs(req);
  if (err instanceof AppError) {
    for (const [name, value] of Object.entries(err.headers ?? {})) res.setHeader(name, value);
    send(res, err.status, {
      ...problemBody(err.slug, err.message, refs),
      status: err.status,
      ...(err.errors ? { errors: err.errors } : {}),
      ...err.extensions,
    });
    return;
  }
  if (err instanceof ZodError) {
    const errors = zodIssuesToFieldErrors(err);
    send(res, 422, { ...problemBody('validation-error', describeFieldErrors(errors), refs), errors });
    return;
  }
  const bodyError = err as BodyParserError;
  const slug = bodyError?.type ? bodyParserProblems[bodyError.type] : undefined;
  if (slug && slug !== 'internal-error') {
    const detail =
      slug === 'malformed-request'
        ? `The body is not valid JSON: ${bodyError.message}`
        : slug === 'payload-too-large'
          ? `The body is larger than the ${bodyError.limit ?? ''} bytes accepted.`.replace('the  bytes', 'the bytes')
          : bodyError.message;
    send(res, problemTypes[slug].status, problemBody(slug, detail, refs));
    return;
  }
  // The router refuses a path parameter that is not valid percent-encoded UTF-8 (a URIError marked 400).
  if (err instanceof URIError && (err as BodyParserError).status === 400) {
    send(res, 400, problemBody('malformed-request', 'A path segment of the URL is not valid percent-encoded UTF-8.', refs));
    return;
  }
  // A body that claims a content coding it does not have (zlib refuses it) is the client's error.
  if (typeof (err as { code?: unknown })?.code === 'string' && /^Z_/.test((err as { code: string }).code)) {
    send(res, 400, problemBody('malformed-request', `The body could not be decoded with its Content-Encoding: ${(err as Error).message}.`, refs));
    return;
  }
  if (isDatabaseUnavailable(err)) {
    req.log?.warn({ err }, 'database unavailable');
    res.setHeader('Retry-After', '2');
    send(res, 503, problemBody('service-unavailable', 'The service cannot reach its database at the moment. Retry in a few seconds.', refs));
    return;
  }
  req.log?.error({ err }, 'unhandled error');
  send(res, 500, problemBody('internal-error', 'Something went wrong on our side. Quote the request id when you report it.', refs));
};
