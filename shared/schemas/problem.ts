import { z } from 'zod';

/** RFC 9457 problem details, as every error response of the API carries them. */
export const FieldErrorSchema = z
  .object({
    pointer: z.string().optional().meta({ description: 'JSON Pointer (RFC 6901) into the request body, as a URI fragment.', example: '#/pack/seriesCells' }),
    parameter: z.string().optional().meta({ description: 'Query or path parameter at fault.' }),
    header: z.string().optional().meta({ description: 'Request header at fault.' }),
    detail: z.string().meta({ example: 'Too small: expected number to be >=1' }),
    code: z.string().optional().meta({ example: 'too_small' }),
  })
  .meta({ id: 'FieldError' });

export const ProblemDetailsSchema = z
  .object({
    type: z.string().meta({ description: 'A URI reference naming the problem type; resolves to a page describing it.', example: '/problems/validation-error' }),
    title: z.string().meta({ example: 'The request did not pass validation' }),
    status: z.number().int().meta({ example: 422 }),
    detail: z.string().meta({ example: '1 field is invalid: #/pack/seriesCells (Too small: expected number to be >=1)' }),
    instance: z.string().optional().meta({ example: '/requests/3f0c1b8e-8a0e-4d1e-9d59-4f7f3f0f5a11' }),
    requestId: z.string().optional(),
    errors: z.array(FieldErrorSchema).optional(),
  })
  .catchall(z.unknown())
  .meta({ id: 'ProblemDetails', description: 'RFC 9457 problem details.' });

export type ProblemDetails = z.infer<typeof ProblemDetailsSchema>;
export type FieldErrorBody = z.infer<typeof FieldErrorSchema>;
