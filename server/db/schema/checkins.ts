import { mysqlTable, int, varchar, mysqlEnum, uniqueIndex, index } from 'drizzle-orm/mysql-core'
import { BOOKING_HISTORY_EVENTS, BOOKING_STATES } from '../../../shared/bookings'
import { utcDatetime } from './common'
import { bookings } from './bookings'
import { users } from './users'

/**
 * What the host recorded at the door for one party: how many were seated with their ID seen, or
 * that the party was turned away, and why. One row per booking.
 */
export const checkIns = mysqlTable('check_ins', {
  id: int('id').autoincrement().primaryKey(),
  bookingId: int('booking_id').notNull().references(() => bookings.id, { onDelete: 'cascade' }),
  hostId: int('host_id').references(() => users.id, { onDelete: 'set null' }),
  outcome: mysqlEnum('outcome', ['arrived', 'turned_away', 'no_show']).notNull(),
  /** Guests seated (each with ID seen); 0 when turned away or absent. */
  seated: int('seated').notNull(),
  idsSeen: int('ids_seen').notNull(),
  /** Why some or all of the party were not served (required then). */
  reason: varchar('reason', { length: 300 }),
  recordedAt: utcDatetime('recorded_at').notNull(),
}, t => [uniqueIndex('check_ins_booking_uq').on(t.bookingId), index('check_ins_host_idx').on(t.hostId)])

export type CheckIn = typeof checkIns.$inferSelect

/**
 * A booking's history: every change of state and every door decision (seated, turned away, did
 * not come, and undoing one of those), with who made it, when and why. Never updated; only added to.
 */
export const bookingEvents = mysqlTable('booking_events', {
  id: int('id').autoincrement().primaryKey(),
  bookingId: int('booking_id').notNull().references(() => bookings.id, { onDelete: 'cascade' }),
  event: mysqlEnum('event', BOOKING_HISTORY_EVENTS).notNull(),
  fromState: mysqlEnum('from_state', BOOKING_STATES).notNull(),
  toState: mysqlEnum('to_state', BOOKING_STATES).notNull(),
  actorId: int('actor_id').references(() => users.id, { onDelete: 'set null' }),
  reason: varchar('reason', { length: 300 }),
  at: utcDatetime('at').notNull(),
}, t => [index('booking_events_booking_idx').on(t.bookingId, t.at)])

export type BookingEventRow = typeof bookingEvents.$inferSelect
