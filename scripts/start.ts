/**
 * `npm start`, after the npm packages are in place: PostgreSQL (installed and started when needed),
 * database and migrations, the demo seed, the console build, then the API and console on one port.
 * Ctrl-C stops the server gracefully and then whatever this script started.
 */
import { join } from 'node:path';
import { step } from './bootstrap.mjs';
import { buildConsoleIfStale } from './lib/console-build.ts';
import { ensureDatabase, ensurePostgres, repoRoot } from './lib/postgres.ts';
import { runMigrations } from '../server/db/migrate.ts';
import { createDb } from '../server/db/client.ts';
import { demo, seedDemo } from '../server/db/seed.ts';
import { demoServerKey, seedDemoApiAccess } from '../server/modules/keys/keys.seed.ts';
import { keyHashSecret } from '../server/modules/metering/platform.ts';
import { EnvError, parseEnv } from '../server/env.ts';
import { startSmtpCatcher } from '../server/fakes/smtp-catcher.ts';
import { startDevelopmentStripeFake } from '../server/fakes/stripe-fake.ts';
import { startDemoSampleSite } from '../server/fakes/sample-site.ts';
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
  const seeded = await seedDemo(seedDb.db);
  const demoKey = demoServerKey(env.OHMSTEAD_DEMO_SERVER_KEY, join(repoRoot, '.data', 'demo-server-key'));
  await seedDemoApiAccess(seedDb.db, { ...seeded, serverKey: demoKey, hashSecret: keyHashSecret(env), highLimits: env.OHMSTEAD_DEMO_HIGH_LIMITS });
  await seedDb.pool.end();
  indent(`Demo organization "${demo.organization.name}" is in place.`);

  step(5, 6, 'Console');
  await buildConsoleIfStale(indent);

  step(6, 6, 'Serving the API and the console');
  // Development: a local SMTP catcher receives the mail the server sends (sign-up, reset, invitations);
  // the console's development mailbox shows it. In production SMTP_HOST/SMTP_PORT name a real server.
  let mailbox = '';
  if (env.NODE_ENV !== 'production') {
    try {
      const catcher = await startSmtpCatcher({ host: env.SMTP_HOST, port: env.SMTP_PORT, mailboxDir: env.DEV_MAILBOX_DIR });
      cleanups.push(() => catcher.close());
      indent(`Mail catcher listening on ${catcher.host}:${catcher.port} (SMTP).`);
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== 'EADDRINUSE') throw error;
      indent(`Port ${env.SMTP_PORT} is taken: mail goes to whatever SMTP server listens there (another Ohmstead's catcher?).`);
    }
    mailbox = '/dev/mailbox';
  }
  // Development: the local Stripe-shaped server the default billing configuration points at.
  const stripeFake = env.NODE_ENV !== 'production' ? await startDevelopmentStripeFake(env, indent) : null;
  if (stripeFake) cleanups.push(() => stripeFake.close());
  const running = await startServer(env);
  cleanups.push(() => running.close());
  stripeFake?.setWebhookUrl(`${running.url}/v1/webhooks/stripe`);
  // Development: a sample "third-party" page on another port (SAMPLE_SITE_PORT, default PORT + 1) embedding the widgets.
  const sampleSite = env.NODE_ENV !== 'production' ? await startDemoSampleSite({ env, apiUrl: running.url, port: Number(process.env.SAMPLE_SITE_PORT ?? Number(new URL(running.url).port) + 1), keyFile: join(repoRoot, '.data', 'demo-embed-key'), log: indent }) : null;
  if (sampleSite) cleanups.push(() => sampleSite.close());
  console.log(`\n  Ohmstead is running at \x1b[1m${running.url}\x1b[0m`);
  console.log(`  API document: ${running.url}/openapi.json   Health: ${running.url}/healthz`);
  console.log(`  Demo organization: ${demo.organization.name} (invented)`);
  console.log(`  Demo sign-in: \x1b[1m${demo.owner.email}\x1b[0m with passphrase \x1b[1m${demo.password}\x1b[0m (owner)`);
  console.log(`    also ${demo.team.map((m) => `${m.email} (${m.role})`).join(', ')}, same passphrase`);
  console.log(`  Demo server key: \x1b[1m${demoKey}\x1b[0m${env.OHMSTEAD_DEMO_HIGH_LIMITS ? ' (high limits for benchmarks)' : ''}`);
  if (mailbox) console.log(`  Development mailbox (mail the server sent): ${running.url}${mailbox}`);
  if (sampleSite) console.log(`  Sample third-party page with the widgets (another origin): \x1b[1m${sampleSite.url}\x1b[0m`);
  console.log('  Press Ctrl-C to stop.\n');
} catch (error) {
  console.error(error);
  await shutdown(1);
}
