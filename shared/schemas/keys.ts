/** Console contract for API keys and usage: the same schemas validate the server and the console forms. */
import { z } from 'zod';

export const ApiKeyKindSchema = z.enum(['server', 'embed']).meta({ id: 'ApiKeyKind' });

export const CreateApiKeyInputSchema = z
  .strictObject({
    name: z.string().trim().min(1, 'Give the key a name').max(80).meta({ example: 'Checkout service' }),
    kind: ApiKeyKindSchema,
    allowedOrigins: z
      .array(z.string().trim().max(200))
      .max(50)
      .optional()
      .meta({ description: 'Embed keys only: the sites (scheme://host[:port]) the key may be used from.', example: ['https://shop.example'] }),
    expiresInDays: z.number().int().min(1).max(3650).optional().meta({ description: 'Optional expiry, in days from now.' }),
  })
  .superRefine((v, ctx) => {
    if (v.kind === 'embed' && !(v.allowedOrigins ?? []).length) {
      ctx.addIssue({ code: 'custom', path: ['allowedOrigins'], message: 'An embed key needs at least one allowed origin' });
    }
    if (v.kind === 'server' && (v.allowedOrigins ?? []).length) {
      ctx.addIssue({ code: 'custom', path: ['allowedOrigins'], message: 'Only embed keys list origins' });
    }
  })
  .meta({ id: 'CreateApiKeyInput' });

export const RotateApiKeyInputSchema = z
  .strictObject({
    overlapHours: z.number().min(0).max(24 * 30).default(24).meta({ description: 'How long the old key keeps working, hours.', example: 24 }),
  })
  .meta({ id: 'RotateApiKeyInput' });

export const ApiKeySchema = z
  .object({
    id: z.string(),
    name: z.string(),
    kind: ApiKeyKindSchema,
    displayPrefix: z.string().meta({ example: 'ohs_srv_Ab3x' }),
    last4: z.string(),
    allowedOrigins: z.array(z.string()),
    createdByUserId: z.string().nullable(),
    createdAt: z.string(),
    lastUsedAt: z.string().nullable(),
    expiresAt: z.string().nullable(),
    revokedAt: z.string().nullable(),
    replacedByKeyId: z.string().nullable(),
    status: z.enum(['active', 'expiring', 'expired', 'revoked']),
  })
  .meta({ id: 'ApiKey', description: 'An API key as the console shows it: never the secret.' });

export const CreatedApiKeySchema = z
  .object({ key: ApiKeySchema, secret: z.string().meta({ description: 'The whole key. Shown once: store it now.' }) })
  .meta({ id: 'CreatedApiKey' });

export const ConsoleUsageQuerySchema = z.strictObject({
  month: z
    .string()
    .regex(/^\d{4}-(0[1-9]|1[0-2])$/, 'Use YYYY-MM')
    .optional(),
});

export const ConsoleUsageSchema = z
  .object({
    month: z.string(),
    plan: z.string(),
    quota: z.number().int(),
    ratePerMinute: z.number().int(),
    used: z.number().int(),
    remaining: z.number().int(),
    resetsAt: z.string(),
    byDay: z.array(z.object({ date: z.string(), calls: z.number().int() })),
    byEndpoint: z.array(z.object({ endpoint: z.string(), calls: z.number().int() })),
    byKey: z.array(z.object({ keyId: z.string(), name: z.string(), displayPrefix: z.string(), calls: z.number().int() })),
    byDayAndEndpoint: z.array(z.object({ date: z.string(), endpoint: z.string(), calls: z.number().int() })),
  })
  .meta({ id: 'ConsoleUsage' });

export const RequestLogQuerySchema = z.strictObject({
  limit: z.coerce.number().int().min(1).max(200).default(50),
  before: z.coerce.number().int().positive().optional(),
  keyId: z.uuid().optional(),
  endpoint: z.string().max(100).optional(),
  status: z.enum(['2xx', '4xx', '5xx']).optional(),
});

export const RequestLogPageSchema = z
  .object({
    items: z.array(
      z.object({
        id: z.number().int(),
        createdAt: z.string(),
        apiKeyId: z.string().nullable(),
        keyName: z.string().nullable(),
        method: z.string(),
        endpoint: z.string(),
        status: z.number().int(),
        durationMs: z.number().int(),
        requestId: z.string().nullable(),
      }),
    ),
    nextBefore: z.number().int().nullable(),
  })
  .meta({ id: 'RequestLogPage' });

export type ApiKeyView = z.infer<typeof ApiKeySchema>;
export type CreateApiKeyInput = z.infer<typeof CreateApiKeyInputSchema>;
export type ConsoleUsage = z.infer<typeof ConsoleUsageSchema>;
export type RequestLogPage = z.infer<typeof RequestLogPageSchema>;
