// Runs in every test worker before the tests: points the server's configuration at this run's database.
import { inject } from 'vitest';

process.env.DATABASE_URL = inject('databaseUrl');
process.env.NODE_ENV = 'test';
process.env.LOG_LEVEL ??= 'silent';
