/**
 * Vitest global setup: provisions PostgreSQL like `npm start` does, creates a throwaway database for this
 * run, applies the migrations, and drops the database afterwards (stopping the server if this run started it).
 */
import { randomBytes } from 'node:crypto';
import type { TestProject } from 'vitest/node';
import { ensureChromium } from '../../scripts/lib/chromium.ts';
import { dropDatabase, ensureDatabase, ensurePostgres } from '../../scripts/lib/postgres.ts';
import { runMigrations } from '../../server/db/migrate.ts';

declare module 'vitest' {
  export interface ProvidedContext {
    databaseUrl: string;
  }
}

export default async function setup(project: TestProject) {
  // Browser test files start in parallel: install Debian's Chromium (when missing) once, here, so two apt
  // runs never race for the package lock.
  ensureChromium((line) => console.log(`[test browser] ${line}`));
  const port = Number(process.env.OHMSTEAD_PG_PORT ?? 54329);
  const pg = await ensurePostgres({ port, log: (line) => console.log(`[test db] ${line}`) });
  const name = `ohmstead_test_${process.pid}_${randomBytes(3).toString('hex')}`;
  const url = await ensureDatabase(pg, name);
  await runMigrations(url);
  project.provide('databaseUrl', url);
  return async () => {
    await dropDatabase(pg, name);
    if (pg.startedHere) await pg.stop();
  };
}
