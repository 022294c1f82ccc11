import type { Request } from 'express';
import type { z } from 'zod';
import { AppError } from './problem.ts';
import { describeFieldErrors, zodIssuesToFieldErrors } from './error-handler.ts';

/** Parses a JSON body with a schema; a non-JSON body is 415, a failing one 422 with field pointers. */
export function parseJsonBody<S extends z.ZodType>(schema: S, req: Request): z.output<S> {
  if (!req.is('application/json')) {
    throw new AppError('unsupported-media-type', 'Send the request body as JSON with Content-Type: application/json.', {
      headers: { 'Accept-Post': 'application/json' },
    });
  }
  return parseWith(schema, req.body, 'body');
}

/** Parses query parameters with a schema; failures are 400 with the parameter names. */
export function parseQuery<S extends z.ZodType>(schema: S, req: Request): z.output<S> {
  const result = schema.safeParse(req.query);
  if (!result.success) {
    const errors = zodIssuesToFieldErrors(result.error, 'query');
    throw new AppError('malformed-request', describeFieldErrors(errors), { errors, status: 400 });
  }
  return result.data;
}

export function parseWith<S extends z.ZodType>(schema: S, value: unknown, location: 'body' | 'query'): z.output<S> {
  const result = schema.safeParse(value);
  if (!result.success) {
    const errors = zodIssuesToFieldErrors(result.error, location);
    throw new AppError('validation-error', describeFieldErrors(errors), { errors });
  }
  return result.data;
}
