/**
 * The only file that calls listen(). Starts the HTTP server on the configured host and port and shuts it
 * down gracefully: stop accepting, let in-flight requests finish (bounded), close the database pool.
 */
import type { Server } from 'node:http';
import { fileURLToPath } from 'node:url';
import { createApp } from './app.ts';
import { createDb } from './db/client.ts';
import { getEnv, type Env } from './env.ts';
import { createLogger } from './logger.ts';

export interface RunningServer {
  server: Server;
  url: string;
  close(): Promise<void>;
}

export async function startServer(env: Env = getEnv()): Promise<RunningServer> {
  const logger = createLogger(env.LOG_LEVEL);
  const { db, pool } = createDb(env.DATABASE_URL, { onIdleError: (err) => logger.warn({ err }, 'an idle database connection was cut; it is replaced on next use') });
  const app = createApp({ env, db, pool, logger });
  const server = app.listen(env.PORT, env.HOST);
  await new Promise<void>((resolve, reject) => {
    server.once('listening', resolve);
    server.once('error', reject);
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : env.PORT;
  const url = `http://${env.HOST}:${port}`;
  logger.info({ url }, 'listening');

  let closing: Promise<void> | undefined;
  const close = () => {
    closing ??= (async () => {
      logger.info('shutting down: finishing in-flight requests');
      const done = new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeIdleConnections();
      const timer = setTimeout(() => server.closeAllConnections(), env.SHUTDOWN_GRACE_MS);
      await done;
      clearTimeout(timer);
      await app.platform?.close();
      await pool.end();
      logger.info('stopped');
    })();
    return closing;
  };
  return { server, url, close };
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const running = await startServer();
  const stop = (signal: NodeJS.Signals) => {
    void running.close().then(() => process.exit(0));
    // A second signal forces the exit.
    process.once(signal, () => process.exit(1));
  };
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
}
