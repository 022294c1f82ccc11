import { integer, pgEnum, pgTable, primaryKey, text, uuid, index } from 'drizzle-orm/pg-core';
import { timestamps } from './columns.ts';
import { users } from './users.ts';

export const organizations = pgTable('organizations', {
  id: uuid().primaryKey().defaultRandom(),
  name: text().notNull(),
  slug: text().notNull().unique(),
  /** The plan id from the plan catalogue in code; "free" by default. */
  planId: text().notNull().default('free'),
  /** Negotiated limits that override the plan's when set. */
  customMonthlyQuotaCalls: integer(),
  customRatePerMinuteCalls: integer(),
  ...timestamps,
});

export const roleEnum = pgEnum('member_role', ['owner', 'admin', 'developer', 'viewer']);

export const memberships = pgTable(
  'memberships',
  {
    organizationId: uuid()
      .notNull()
      .references(() => organizations.id, { onDelete: 'cascade' }),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    role: roleEnum().notNull(),
    ...timestamps,
  },
  (t) => [primaryKey({ columns: [t.organizationId, t.userId] }), index('memberships_user_idx').on(t.userId)],
);
