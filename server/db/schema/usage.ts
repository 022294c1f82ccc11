import { bigint, date, pgTable, primaryKey, text, uuid } from 'drizzle-orm/pg-core';
import { apiKeys } from './api-keys.ts';
import { organizations } from './organizations.ts';

/** Exact call counts per organization, key, endpoint and UTC day: what the bill says. */
export const usageCounters = pgTable(
  'usage_counters',
  {
    organizationId: uuid()
      .notNull()
      .references(() => organizations.id, { onDelete: 'cascade' }),
    apiKeyId: uuid()
      .notNull()
      .references(() => apiKeys.id, { onDelete: 'cascade' }),
    endpoint: text().notNull(),
    day: date({ mode: 'string' }).notNull(),
    calls: bigint({ mode: 'number' }).notNull().default(0),
  },
  (t) => [primaryKey({ columns: [t.organizationId, t.apiKeyId, t.endpoint, t.day] })],
);
