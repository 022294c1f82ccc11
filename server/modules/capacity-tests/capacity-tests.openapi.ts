import { z } from 'zod';
import { computeCapacityTest } from '#shared/calc/capacity-test/capacity-test.ts';
import {
  CapacityTestInputSchema,
  CapacityTestResultSchema,
  capacityTestCsvExample,
  capacityTestInputExample,
} from '#shared/schemas/capacity-test.ts';
import { ChemistrySchema } from '#shared/schemas/common.ts';
import { apiKeySecurity, commonProblemResponses, problemResponse, registry } from '../../openapi/registry.ts';

// Registered directly rather than through registerCalcPath because this endpoint also takes a text/csv body
// with query parameters.
registry.registerPath({
  method: 'post',
  path: '/v1/capacity-tests/evaluate',
  tags: ['Capacity tests'],
  summary: 'Evaluate a capacity test',
  description:
    'State of health = measured Ah ÷ rated Ah × 100 (not capped at 100), C-rate = discharge current ÷ rated Ah, and a verdict: `pass` at 90 % or more, `marginal` 80–90 %, `fail` below 80 % (the usual end-of-life line). Send figures (`ratedAh`, `measuredAh`, `dischargeCurrentA`) or `samples` as JSON, or a CSV log as `text/csv`: a header row naming `tS`, `currentA` and optionally `voltageV`, one sample per row, with `ratedAh` (and optionally `chemistry`, `label`) in the query string. Samples are integrated with the trapezoidal rule; the magnitude of the current counts. Bad CSV rows give one 422 problem listing each row by number (the header is row 1).',
  security: [{ [apiKeySecurity.name]: [] }],
  request: {
    query: z.object({
      ratedAh: z.number().positive().optional().meta({ description: 'With a text/csv body (required then): rated capacity, Ah.', example: 100 }),
      chemistry: ChemistrySchema.optional().meta({ description: 'With a text/csv body: the chemistry, for the rating-rate check.' }),
      label: z.string().optional().meta({ description: 'With a text/csv body: your name for the test.' }),
    }),
    body: {
      required: true,
      content: {
        'application/json': { schema: CapacityTestInputSchema, examples: { worked: { summary: 'Worked example', value: capacityTestInputExample } } },
        'text/csv': {
          schema: { type: 'string', description: 'A CSV log: header row tS,currentA[,voltageV], then one sample per row.' },
          examples: { worked: { summary: 'A one-hour log at 20 A (with ?ratedAh=100)', value: capacityTestCsvExample } },
        },
      },
    },
  },
  responses: {
    200: {
      description: 'The result, with checks, cautions and the basis it was worked out on.',
      content: {
        'application/json': {
          schema: CapacityTestResultSchema,
          examples: { worked: { summary: 'Worked example', value: computeCapacityTest(CapacityTestInputSchema.parse(capacityTestInputExample)) } },
        },
      },
    },
    ...commonProblemResponses,
    415: problemResponse('The body is neither JSON nor text/csv.'),
    422: problemResponse('The body failed validation; `errors[]` lists each field by JSON Pointer, or for a CSV log each bad row (also in `rows[]`).'),
    401: problemResponse('Missing, malformed, unknown, revoked or expired API key.'),
    403: problemResponse('The key may not call this endpoint from here (embed key origin or scope).'),
    429: problemResponse('Rate limit or monthly quota reached; see Retry-After and the RateLimit headers.'),
  },
});
