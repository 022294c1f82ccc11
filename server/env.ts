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
  // --- Abuse limits, per instance and per minute (server/modules/abuse/abuse-guard.ts)
  /** /v1 answers 4xx without an authenticated key, and console 401s, per client address. */
  ABUSE_ADDRESS_FAILURES_PER_MINUTE: z.coerce.number().int().min(1).max(10_000_000).default(120),
  /** 4xx answers to one API key's calculation calls. */
  ABUSE_KEY_FAILURES_PER_MINUTE: z.coerce.number().int().min(1).max(10_000_000).default(120),
  /** One API key's unmetered calls (reference data, usage). */
  ABUSE_KEY_READS_PER_MINUTE: z.coerce.number().int().min(1).max(10_000_000).default(300),
  /** Console API requests per client address. */
  ABUSE_CONSOLE_REQUESTS_PER_MINUTE: z.coerce.number().int().min(1).max(10_000_000).default(600),
  // --- Accounts: links, mail, sessions, sign-in throttling
  /** The console's public address, used in e-mailed links (default: http://HOST:PORT). Never taken from the request's Host. */
  PUBLIC_URL: z.url({ protocol: /^https?$/ }).optional(),
  /** Other origins allowed to send state-changing console requests (comma-separated), beyond PUBLIC_URL and the server's own. */
  CONSOLE_ORIGINS: z.string().default(''),
  /** Proxies in front of the server whose X-Forwarded-For is believed (0: none; never "true"). */
  TRUST_PROXY_HOPS: z.coerce.number().int().min(0).max(5).default(0),
  SMTP_HOST: z.string().min(1).default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(1025),
  /** Implicit TLS (port 465 style); otherwise STARTTLS is used when the server offers it. */
  SMTP_SECURE: bool,
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  MAIL_FROM: z.string().min(3).default('Ohmstead <no-reply@ohmstead.example>'),
  /** Where the development mail catcher stores what it receives; the development mailbox page reads it. */
  DEV_MAILBOX_DIR: z.string().default('.data/mailbox'),
  /** A console session ends after this long without a request… */
  SESSION_IDLE_MINUTES: z.coerce.number().int().min(1).max(24 * 60).default(60),
  /** …and in any case this long after sign-in. */
  SESSION_ABSOLUTE_HOURS: z.coerce.number().int().min(1).max(24 * 30).default(12),
  /** auto: Secure cookie (with the __Host- prefix) unless the server listens on loopback outside production. */
  SESSION_COOKIE_SECURE: z.enum(['auto', 'true', 'false']).default('auto'),
  /** Consecutive failed sign-ins an account gets before delays start (30 s, doubling, at most 15 min). */
  SIGNIN_ACCOUNT_FREE_FAILURES: z.coerce.number().int().min(1).max(100).default(5),
  /** Failed sign-ins one address (IPv4, or IPv6 /56) may make per window before it must wait for the window to end. */
  SIGNIN_ADDRESS_MAX_FAILURES: z.coerce.number().int().min(1).max(10_000).default(30),
  SIGNIN_ADDRESS_WINDOW_MINUTES: z.coerce.number().int().min(1).max(24 * 60).default(15),
  /** Requests that send e-mail (sign-up, resend, password reset) per address per hour. */
  MAIL_REQUESTS_PER_ADDRESS_PER_HOUR: z.coerce.number().int().min(1).max(100_000).default(30),
  // --- Billing (Stripe, test mode). The defaults reach the local Stripe-shaped server `npm start` runs in development.
  STRIPE_SECRET_KEY: z.string().regex(/^(sk|rk)_(test|live)_[A-Za-z0-9_]+$/, 'must be a Stripe secret or restricted key (sk_test_…)').default('sk_test_ohmstead_development'),
  STRIPE_WEBHOOK_SECRET: z.string().regex(/^whsec_[A-Za-z0-9_]+$/, 'must be a webhook signing secret (whsec_…)').default('whsec_ohmstead_development'),
  STRIPE_API_HOST: z.string().min(1).default('127.0.0.1'),
  STRIPE_API_PORT: z.coerce.number().int().min(1).max(65535).default(12111),
  STRIPE_API_PROTOCOL: z.enum(['http', 'https']).default('http'),
  /** The recurring monthly price of each paid plan. */
  STRIPE_PRICE_BUILDER: z.string().regex(/^price_[A-Za-z0-9_]+$/).default('price_ohmstead_builder_monthly'),
  STRIPE_PRICE_SCALE: z.string().regex(/^price_[A-Za-z0-9_]+$/).default('price_ohmstead_scale_monthly'),
  /** Days a paid plan keeps working after a failed payment before the organization falls back to the free plan. */
  BILLING_GRACE_DAYS: z.coerce.number().min(0).max(60).default(7),
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
