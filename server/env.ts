/**
 * Configuration, read once from the environment and parsed with zod. Nothing else in the server reads
 * process.env. A bad or missing value stops the start with a message naming it.
 */
import { z } from 'zod';

const bool = z
  .enum(['0', '1', 'true', 'false', ''])
  .optional()
  .transform((v) => v === '1' || v === 'true');

export const EnvSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  DATABASE_URL: z.string().regex(/^postgres(ql)?:\/\//, 'must be a postgres:// connection URL'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  /** The largest JSON body accepted, in bytes. */
  BODY_LIMIT_BYTES: z.coerce.number().int().min(1024).max(10_000_000).default(200_000),
  /** Where the built console lives; served when present. */
  CONSOLE_DIST_DIR: z.string().default('dist'),
  /** When set, the demo organization's server key (see the brief for the format). */
  OHMSTEAD_DEMO_SERVER_KEY: z
    .string()
    .regex(/^ohs_srv_[A-Za-z0-9]{32,}$/, 'must be "ohs_srv_" followed by at least 32 characters from [A-Za-z0-9]')
    .optional(),
  OHMSTEAD_DEMO_HIGH_LIMITS: bool,
  /** Secret for the keyed hash under which API keys are stored (required in production). */
  OHMSTEAD_KEY_HASH_SECRET: z.string().min(32, 'must be at least 32 characters').optional(),
  /** How long a key lookup is cached per instance, ms: a revoked key stops working within this time. */
  API_KEY_CACHE_TTL_MS: z.coerce.number().int().min(0).max(60_000).default(3_000),
  /** Port of the project's own PostgreSQL cluster (used when DATABASE_URL is not set). */
  OHMSTEAD_PG_PORT: z.coerce.number().int().min(1024).max(65535).default(54329),
  /** Time allowed for in-flight requests to finish on shutdown, in milliseconds. */
  SHUTDOWN_GRACE_MS: z.coerce.number().int().min(0).max(120_000).default(10_000),
});

export type Env = z.infer<typeof EnvSchema>;

export class EnvError extends Error {
  override name = 'EnvError';
}

/** Parses an environment; throws an EnvError listing every bad or missing variable. */
export function parseEnv(source: Record<string, string | undefined>): Env {
  const result = EnvSchema.safeParse(source);
  if (!result.success) {
    const lines = result.error.issues.map((i) => `  ${i.path.join('.') || '(root)'}: ${i.message}`);
    throw new EnvError(`Invalid configuration:\n${lines.join('\n')}`);
  }
  return result.data;
}

let cached: Env | undefined;

/** The process's configuration, parsed on first use. */
export function getEnv(): Env {
  cached ??= parseEnv(process.env);
  return cached;
}
