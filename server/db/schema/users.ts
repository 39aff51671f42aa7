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
  /**
   * Sealed into the session cookie and compared on every request; raising it ends every session of
   * the account at once (sign out of all devices, a new password, a role change, disabling).
   */
  sessionVersion: int('session_version').notNull().default(1),
  /** When the person proved the address by opening the e-mailed link; guests book only once it is set. */
  emailVerifiedAt: utcDatetime('email_verified_at'),
  ...timestamps,
}, t => [uniqueIndex('users_email_uq').on(t.email)])

/** One-time links (staff invitations, password resets, address checks); only a SHA-256 of the token is stored. */
export const authTokens = mysqlTable('auth_tokens', {
  id: int('id').autoincrement().primaryKey(),
  userId: int('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  purpose: mysqlEnum('purpose', ['invite', 'reset', 'verify']).notNull(),
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

/**
 * Sessions signed out on their own device: a copy of that cookie must not live on. Kept until the
 * cookie would have expired anyway, then swept.
 */
export const signedOutSessions = mysqlTable('signed_out_sessions', {
  sessionId: char('session_id', { length: 22 }).primaryKey(),
  userId: int('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  expiresAt: utcDatetime('expires_at').notNull(),
}, t => [index('signed_out_sessions_expires_idx').on(t.expiresAt)])

export type User = typeof users.$inferSelect
