// Organisations and the people who sign in: accounts, sessions and one-time links.
// Times are ISO-8601 strings (UTC); ids are random UUIDs.
import { createdAt, id } from './columns';
import { index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';

export const organisations = sqliteTable('organisations', {
  id: id(),
  name: text('name').notNull(),
  createdAt: createdAt(),
});

export const users = sqliteTable(
  'users',
  {
    id: id(),
    orgId: text('org_id')
      .notNull()
      .references(() => organisations.id),
    email: text('email').notNull(),
    name: text('name').notNull(),
    role: text('role', { enum: ['admin', 'organiser', 'director', 'technician'] }).notNull(),
    // Null until an invited person sets a password.
    passwordHash: text('password_hash'),
    disabled: integer('disabled', { mode: 'boolean' }).notNull().default(false),
    unitSystem: text('unit_system', { enum: ['metric', 'imperial'] })
      .notNull()
      .default('metric'),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('users_email_unique').on(t.email)],
);

export const sessions = sqliteTable(
  'sessions',
  {
    id: id(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
    lastSeenAt: text('last_seen_at').notNull(),
    expiresAt: text('expires_at').notNull(),
    revokedAt: text('revoked_at'),
    userAgent: text('user_agent'),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
);

// One-time links: invitations and password resets. Only the SHA-256 of the token is kept.
export const userTokens = sqliteTable('user_tokens', {
  id: id(),
  userId: text('user_id')
    .notNull()
    .references(() => users.id),
  purpose: text('purpose', { enum: ['invite', 'reset'] }).notNull(),
  tokenHash: text('token_hash').notNull().unique(),
  expiresAt: text('expires_at').notNull(),
  usedAt: text('used_at'),
  createdAt: createdAt(),
});
