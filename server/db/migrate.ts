import { drizzle } from 'drizzle-orm/node-postgres';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';

export const migrationsFolder = join(fileURLToPath(new URL('.', import.meta.url)), '..', '..', 'drizzle');

/** Applies the committed Drizzle migrations (idempotent). */
export async function runMigrations(databaseUrl: string): Promise<void> {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    // Quiet the NOTICEs PostgreSQL sends for "already exists" on the journal schema.
    await client.query("SET client_min_messages = 'warning'");
    await migrate(drizzle({ client }), { migrationsFolder });
  } finally {
    await client.end();
  }
}
