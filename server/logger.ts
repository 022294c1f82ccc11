import pino from 'pino';

/** One pino logger per process; request loggers are children carrying the request id. */
export function createLogger(level: string) {
  return pino({
    level,
    redact: { paths: ['req.headers.authorization', 'req.headers.cookie', 'res.headers["set-cookie"]'], censor: '[redacted]' },
  });
}

export type Logger = ReturnType<typeof createLogger>;
