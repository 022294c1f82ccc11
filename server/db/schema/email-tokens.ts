import { index, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { users } from './users.ts';

export const emailTokenPurposeEnum = pgEnum('email_token_purpose', ['verify_email', 'reset_password']);

/**
 * Single-use, expiring links sent by e-mail (address verification, password reset). The link carries a
 * random token; only its SHA-256 is stored, so a copy of this table opens no account.
 */
export const emailTokens = pgTable(
  'email_tokens',
  {
    id: uuid().primaryKey().defaultRandom(),
    tokenHash: text().notNull().unique(),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    purpose: emailTokenPurposeEnum().notNull(),
    /** The address the link was sent to (a verification proves this address, not a later one). */
    email: text().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    usedAt: timestamp({ withTimezone: true }),
  },
  (t) => [index('email_tokens_user_idx').on(t.userId, t.purpose)],
);
