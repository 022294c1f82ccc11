import pino, { type DestinationStream } from 'pino';

/**
 * Request and response headers that carry credentials or signatures, never written to a log: API keys
 * (Authorization), session cookies both ways, and Stripe's webhook signature (a replayable proof of a
 * signed event). E-mailed tokens travel in URL fragments and JSON bodies, which are not logged.
 */
export const REDACTED_PATHS = [
  'req.headers.authorization',
  'req.headers["proxy-authorization"]',
  'req.headers.cookie',
  'req.headers["stripe-signature"]',
  'req.headers["x-api-key"]',
  'res.headers["set-cookie"]',
];

/** One pino logger per process; request loggers are children carrying the request id. */
export function createLogger(level: string, destination?: DestinationStream) {
  return pino({ level, redact: { paths: REDACTED_PATHS, censor: '[redacted]' } }, destination);
}

export type Logger = ReturnType<typeof createLogger>;
