/** `npm run db:up`: start the project's PostgreSQL and leave it running (for repeated test runs). */
import { ensurePostgres } from './lib/postgres.ts';

const port = Number(process.env.OHMSTEAD_PG_PORT ?? 54329);
await ensurePostgres({ port, log: console.log });
console.log(`PostgreSQL is up on 127.0.0.1:${port}. Stop it with: runuser -u postgres -- pg_ctl stop -D .data/pg (or as your user).`);
