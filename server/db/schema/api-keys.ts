import { index, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { organizations } from './organizations.ts';
import { users } from './users.ts';

export const apiKeyKindEnum = pgEnum('api_key_kind', ['server', 'embed']);

/**
 * API keys. Server keys are secret: only a keyed hash of the whole key is stored. Embed keys are public
 * and usable only from `allowedOrigins`.
 */
export const apiKeys = pgTable(
  'api_keys',
  {
    id: uuid().primaryKey().defaultRandom(),
    organizationId: uuid()
      .notNull()
      .references(() => organizations.id, { onDelete: 'cascade' }),
    createdByUserId: uuid().references(() => users.id, { onDelete: 'set null' }),
    name: text().notNull(),
    kind: apiKeyKindEnum().notNull(),
    keyHash: text().notNull().unique(),
    /** Non-secret, for display: the kind prefix and the first characters. */
    displayPrefix: text().notNull(),
    last4: text().notNull(),
    allowedOrigins: text().array().notNull().default([]),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    lastUsedAt: timestamp({ withTimezone: true }),
    expiresAt: timestamp({ withTimezone: true }),
    revokedAt: timestamp({ withTimezone: true }),
    /** Set on a rotated key: the key that replaced it (the old one keeps working until expiresAt). */
    replacedByKeyId: uuid(),
  },
  (t) => [index('api_keys_org_idx').on(t.organizationId)],
);
