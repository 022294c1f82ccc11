/**
 * `npm start`, after the npm packages are in place: PostgreSQL (installed and started when needed),
 * database and migrations, the demo seed, the console build, then the API and console on one port.
 * Ctrl-C stops the server gracefully and then whatever this script started.
 */
import { step } from './bootstrap.mjs';
import { buildConsoleIfStale } from './lib/console-build.ts';
import { ensureDatabase, ensurePostgres } from './lib/postgres.ts';
import { runMigrations } from '../server/db/migrate.ts';
import { createDb } from '../server/db/client.ts';
import { demo, seedDemo } from '../server/db/seed.ts';
import { EnvError, parseEnv } from '../server/env.ts';
import { startServer } from '../server/index.ts';

const indent = (line: string) => console.log(`      ${line}`);

function fail(error: unknown): never {
  console.error(`\n\x1b[31mStart-up failed:\x1b[0m ${error instanceof Error ? error.message : String(error)}`);
  process.exit(1);
}

try {
  // Fail fast on a bad configuration, before anything is installed or started.
  parseEnv({ ...process.env, DATABASE_URL: process.env.DATABASE_URL ?? 'postgres://check-only' });
} catch (error) {
  if (error instanceof EnvError) fail(error);
  throw error;
}

const cleanups: Array<() => Promise<void>> = [];
let stopping = false;
async function shutdown(code: number) {
  if (stopping) return;
  stopping = true;
  console.log('\nStopping…');
  for (const cleanup of cleanups.reverse()) {
    try {
      await cleanup();
    } catch (error) {
      console.error(error);
    }
  }
  process.exit(code);
}
process.once('SIGINT', () => void shutdown(0));
process.once('SIGTERM', () => void shutdown(0));

try {
  const preliminary = parseEnv({ ...process.env, DATABASE_URL: process.env.DATABASE_URL ?? 'postgres://check-only' });
  step(2, 6, 'PostgreSQL');
  const pg = await ensurePostgres({ port: preliminary.OHMSTEAD_PG_PORT, log: indent });
  if (pg.startedHere) cleanups.push(() => pg.stop());

  step(3, 6, 'Database and migrations');
  const databaseName = process.env.DATABASE_URL ? new URL(process.env.DATABASE_URL).pathname.slice(1) : 'ohmstead';
  const databaseUrl = await ensureDatabase(pg, databaseName);
  await runMigrations(databaseUrl);
  indent(`Migrations applied to ${databaseName}.`);
  const env = parseEnv({ ...process.env, DATABASE_URL: databaseUrl });

  step(4, 6, 'Demo data (invented)');
  const seedDb = createDb(databaseUrl, { max: 1 });
  await seedDemo(seedDb.db);
  await seedDb.pool.end();
  indent(`Demo organization "${demo.organization.name}" is in place.`);

  step(5, 6, 'Console');
  await buildConsoleIfStale(indent);

  step(6, 6, 'Serving the API and the console');
  const running = await startServer(env);
  cleanups.push(() => running.close());
  console.log(`\n  Ohmstead is running at \x1b[1m${running.url}\x1b[0m`);
  console.log(`  API document: ${running.url}/openapi.json   Health: ${running.url}/healthz`);
  console.log(`  Demo organization: ${demo.organization.name} (owner ${demo.owner.email})`);
  console.log('  Press Ctrl-C to stop.\n');
} catch (error) {
  console.error(error);
  await shutdown(1);
}
