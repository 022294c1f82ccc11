import type { Request } from 'express';
import { computeCapacityTest, parseCapacityLogCsv } from '#shared/calc/capacity-test/capacity-test.ts';
import { CapacityTestCsvQuerySchema, CapacityTestInputSchema } from '#shared/schemas/capacity-test.ts';
import { AppError } from '../../http/problem.ts';
import { parseJsonBody, parseQuery, parseWith } from '../../http/validate.ts';
import { calcHandler } from '../calc/calc-handler.ts';
import { v1Post, type V1Route } from '../v1-route.ts';

/** The largest CSV log accepted, bytes: about 200 000 rows of "tS,currentA,voltageV". */
export const CSV_LIMIT_BYTES = 5_000_000;

/**
 * Reads the input from a JSON body, or from a `text/csv` log plus `ratedAh` (and optional `chemistry`,
 * `label`) in the query string. Bad CSV rows become one 422 problem listing each row; anything else is 415.
 */
export function readCapacityTestInput(schema: typeof CapacityTestInputSchema, req: Request) {
  if (req.is('text/csv')) {
    const query = parseQuery(CapacityTestCsvQuerySchema, req);
    const parsed = parseCapacityLogCsv(typeof req.body === 'string' ? req.body : '');
    if (!parsed.ok) {
      const listed = parsed.errors.filter((e) => e.row !== undefined).length;
      throw new AppError('validation-error', `The CSV log has ${listed === 1 ? 'a bad row' : 'bad rows'}: ${parsed.errors.map((e) => e.detail).join(' ')}`, {
        errors: parsed.errors.map((e) => ({ detail: e.detail, code: 'csv_row_invalid' })),
        extensions: { rows: parsed.errors.filter((e) => e.row !== undefined).map((e) => ({ row: e.row, ...(e.column ? { column: e.column } : {}), detail: e.detail })) },
      });
    }
    return parseWith(schema, { ...query, samples: parsed.samples }, 'body');
  }
  if (!req.is('application/json')) {
    throw new AppError('unsupported-media-type', 'Send the capacity test as JSON (Content-Type: application/json) or as a CSV log (Content-Type: text/csv).', {
      headers: { 'Accept-Post': 'application/json, text/csv' },
    });
  }
  return parseJsonBody(schema, req);
}

/**
 * POST /v1/capacity-tests/evaluate: JSON, or a text/csv log (the v1 gateway reads text/csv bodies up to
 * CSV_LIMIT_BYTES for every calculation; the other calculations answer such a body with 415).
 */
export function capacityTestsRoutes(): V1Route[] {
  return [v1Post('/capacity-tests/evaluate', calcHandler(CapacityTestInputSchema, computeCapacityTest, readCapacityTestInput))];
}
