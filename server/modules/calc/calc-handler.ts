/**
 * The one way a calculation endpoint is served: parse the JSON body with the shared schema, run the pure
 * calculator, send `{ data, checks, cautions, basis }`. A CalcError becomes a 422 `calculation-error`
 * problem. Key checks, metering and rate limits sit in front of these handlers (see the v1 router); the
 * answer goes out through `sendCalcResult`, which counts the call before it is answered.
 */
import type { Request, RequestHandler, Response } from 'express';
import type { z } from 'zod';
import { CalcError } from '#shared/calc/errors.ts';
import type { CalcOutput } from '#shared/calc/types.ts';
import { AppError } from '../../http/problem.ts';
import { parseJsonBody } from '../../http/validate.ts';

/** Runs a calculator, turning its CalcError into a problem. */
export function runCalc<I, O>(compute: (input: I) => CalcOutput<O>, input: I): CalcOutput<O> {
  try {
    return compute(input);
  } catch (error) {
    if (error instanceof CalcError) {
      throw new AppError('calculation-error', error.message, {
        errors: [{ detail: error.message, code: error.code, ...(error.pointer ? { pointer: error.pointer } : {}) }],
      });
    }
    throw error;
  }
}

export function calcHandler<S extends z.ZodType, O>(
  schema: S,
  compute: (input: z.output<S>) => CalcOutput<O>,
  readInput: (schema: S, req: Request) => z.output<S> = parseJsonBody,
): RequestHandler {
  // Not async: a synchronous failure (validation, CalcError) throws straight to the error handlers, and a
  // counted answer is one promise.
  return (req, res) => sendCalcResult(res, runCalc(compute, readInput(schema, req)));
}

/** Sends a calculation result: metered (counted, then answered with RateLimit headers) behind the v1 gateway. */
export function sendCalcResult(res: Response, body: unknown): Promise<void> {
  if (!res.locals.sendMetered) throw new Error('calculation handlers must be mounted behind the metering middleware');
  return res.locals.sendMetered(body);
}
