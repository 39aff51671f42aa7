import { mysqlTable, int, varchar, mysqlEnum, boolean, date, char, index, uniqueIndex } from 'drizzle-orm/mysql-core'
import { timestamps, utcDatetime } from './common'
import { ROLES } from '../../../shared/roles'

export const users = mysqlTable('users', {
  id: int('id').autoincrement().primaryKey(),
  email: varchar('email', { length: 254 }).notNull(),
  name: varchar('name', { length: 120 }).notNull(),
  /** Null until an invited staff member sets a password. */
  passwordHash: varchar('password_hash', { length: 255 }),
  role: mysqlEnum('role', ROLES).notNull(),
  /** Guests only; the calendar date as entered, no time zone. */
  dateOfBirth: date('date_of_birth', { mode: 'string' }),
  disabled: boolean('disabled').notNull().default(false),
  ...timestamps,
}, t => [uniqueIndex('users_email_uq').on(t.email)])

/** One-time links (staff invitations, password resets); only a SHA-256 of the token is stored. */
export const authTokens = mysqlTable('auth_tokens', {
  id: int('id').autoincrement().primaryKey(),
  userId: int('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  purpose: mysqlEnum('purpose', ['invite', 'reset']).notNull(),
  tokenHash: char('token_hash', { length: 64 }).notNull(),
  expiresAt: utcDatetime('expires_at').notNull(),
  usedAt: utcDatetime('used_at'),
  createdById: int('created_by_id').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [uniqueIndex('auth_tokens_hash_uq').on(t.tokenHash), index('auth_tokens_user_idx').on(t.userId)])

/** Failed sign-ins counted per key ("account:<email>" or "ip:<address>") in a sliding window. */
export const signInThrottle = mysqlTable('sign_in_throttle', {
  key: varchar('throttle_key', { length: 300 }).primaryKey(),
  failures: int('failures').notNull().default(0),
  windowStartedAt: utcDatetime('window_started_at').notNull(),
  lockedUntil: utcDatetime('locked_until'),
})

export type User = typeof users.$inferSelect
