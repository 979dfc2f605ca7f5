/**
 * The Keelson database schema: the single source of truth for every table. After a change run
 * `npm run db:generate` (drizzle-kit) and commit the new file under `libs/db/migrations`.
 *
 * Conventions: times are ISO-8601 UTC strings (`2026-03-01T09:30:00.000Z`) in `text` columns, so
 * they sort as text and read well in the SQLite shell; booleans are integers (0/1) mapped by
 * Drizzle; e-mail addresses are stored lower-case (a CHECK enforces it).
 */
import { sql } from 'drizzle-orm';
import {
  check,
  index,
  integer,
  primaryKey,
  sqliteTable,
  text,
  uniqueIndex,
} from 'drizzle-orm/sqlite-core';

/**
 * The roles a user can hold. The same list as `ROLES` in `@keelson/contracts` (a spec checks that
 * they agree); kept here as a literal because drizzle-kit reads this file on its own.
 */
export const USER_ROLES = ['admin', 'buyer', 'risk_manager', 'plant_manager', 'viewer'] as const;

/** People who sign in to Keelson. */
export const users = sqliteTable(
  'users',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    email: text('email').notNull(),
    name: text('name').notNull(),
    /** bcrypt hash; null until the user accepts the invitation and sets a password. */
    passwordHash: text('password_hash'),
    role: text('role', { enum: USER_ROLES }).notNull(),
    isActive: integer('is_active', { mode: 'boolean' }).notNull().default(true),
    createdAt: text('created_at').notNull(),
    updatedAt: text('updated_at').notNull(),
    lastLoginAt: text('last_login_at'),
  },
  (table) => [
    uniqueIndex('users_email_unique').on(table.email),
    index('users_role_index').on(table.role),
    check('users_email_lower_case', sql`${table.email} = lower(${table.email})`),
    check(
      'users_role_known',
      sql`${table.role} in ('admin', 'buyer', 'risk_manager', 'plant_manager', 'viewer')`,
    ),
  ],
);

/** The organisation's sites (plants), to which plant managers belong. */
export const plants = sqliteTable('plants', {
  code: text('code').primaryKey(),
  name: text('name').notNull(),
  /** ISO 3166-1 alpha-2 country code. */
  country: text('country').notNull(),
});

/** Which plants a plant manager manages. */
export const userPlants = sqliteTable(
  'user_plants',
  {
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    plantCode: text('plant_code')
      .notNull()
      .references(() => plants.code, { onDelete: 'cascade', onUpdate: 'cascade' }),
  },
  (table) => [
    primaryKey({ columns: [table.userId, table.plantCode] }),
    index('user_plants_plant_index').on(table.plantCode),
  ],
);

/** Set-password invitations. Only the SHA-256 hash of the token is stored. */
export const invitations = sqliteTable(
  'invitations',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    tokenHash: text('token_hash').notNull(),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    createdAt: text('created_at').notNull(),
    expiresAt: text('expires_at').notNull(),
    usedAt: text('used_at'),
  },
  (table) => [
    uniqueIndex('invitations_token_hash_unique').on(table.tokenHash),
    index('invitations_user_index').on(table.userId),
  ],
);

/** Messages caught by the in-process SMTP sink (demo and test modes). */
export const mailMessages = sqliteTable(
  'mail_messages',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    fromAddress: text('from_address').notNull(),
    /** JSON array of recipient addresses. */
    toAddresses: text('to_addresses', { mode: 'json' }).$type<string[]>().notNull(),
    subject: text('subject').notNull(),
    text: text('text'),
    html: text('html'),
    /** Size of the raw message in bytes, as received. */
    rawSize: integer('raw_size').notNull(),
    receivedAt: text('received_at').notNull(),
  },
  (table) => [index('mail_messages_received_index').on(table.receivedAt)],
);

/** Small key/value settings of the workspace. */
export const appSettings = sqliteTable('app_settings', {
  key: text('key').primaryKey(),
  value: text('value').notNull(),
  updatedAt: text('updated_at').notNull(),
});

/** A row of `users`. */
export type UserRow = typeof users.$inferSelect;
/** A new row of `users`. */
export type NewUserRow = typeof users.$inferInsert;
/** A row of `plants`. */
export type PlantRow = typeof plants.$inferSelect;
/** A row of `invitations`. */
export type InvitationRow = typeof invitations.$inferSelect;
/** A row of `mail_messages`. */
export type MailMessageRow = typeof mailMessages.$inferSelect;
/** A new row of `mail_messages`. */
export type NewMailMessageRow = typeof mailMessages.$inferInsert;
