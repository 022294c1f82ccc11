import { z } from 'zod';

export const UsageQuerySchema = z.strictObject({
  month: z
    .string()
    .regex(/^\d{4}-(0[1-9]|1[0-2])$/, 'Use YYYY-MM, e.g. 2026-12')
    .optional()
    .meta({ description: 'The UTC calendar month; default: this month.', example: '2026-12' }),
});

export const UsageResultSchema = z
  .object({
    data: z.object({
      month: z.string().meta({ example: '2026-12' }),
      plan: z.string().meta({ example: 'builder' }),
      quota: z.number().int().meta({ description: 'Calls allowed this month.', example: 100000 }),
      used: z.number().int().meta({ example: 1234 }),
      remaining: z.number().int().meta({ example: 98766 }),
      resetsAt: z.string().meta({ description: 'Start of the next UTC month (ISO 8601).', example: '2027-01-01T00:00:00.000Z' }),
      days: z.array(
        z.object({
          date: z.string().meta({ example: '2026-12-02' }),
          endpoint: z.string().meta({ example: '/v1/packs/energy' }),
          calls: z.number().int().meta({ example: 17 }),
        }),
      ),
    }),
  })
  .meta({ id: 'UsageResult', description: "The calling key's organization's metered calls for a month." });

export type UsageResult = z.infer<typeof UsageResultSchema>;
