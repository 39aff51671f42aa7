import { mysqlTable, int, varchar, mysqlEnum, char, boolean, index, uniqueIndex } from 'drizzle-orm/mysql-core'
import { timestamps, utcDatetime } from './common'
import { venues } from './venues'
import { users } from './users'
import { tastingSessions } from './sessions'
import { BOOKING_END_REASONS, BOOKING_STATES } from '../../../shared/bookings'

/**
 * Seats a guest booked in one session. Seats left = seats − party sizes of held (while the hold
 * lasts), confirmed and checked-in bookings (the rule: shared/seats.ts); every change of `state`
 * happens in one transaction with the session row locked. Amounts are integer minor units of `currency`.
 */
export const bookings = mysqlTable('bookings', {
  id: int('id').autoincrement().primaryKey(),
  venueId: int('venue_id').notNull().references(() => venues.id, { onDelete: 'cascade' }),
  sessionId: int('session_id').notNull().references(() => tastingSessions.id, { onDelete: 'restrict' }),
  userId: int('user_id').notNull().references(() => users.id, { onDelete: 'restrict' }),
  /** Ten characters of Crockford base32 from a random source: shown to the guest, not guessable. */
  reference: char('reference', { length: 10 }).notNull(),
  state: mysqlEnum('state', BOOKING_STATES).notNull(),
  partySize: int('party_size').notNull(),
  contactName: varchar('contact_name', { length: 120 }).notNull(),
  contactEmail: varchar('contact_email', { length: 254 }).notNull(),
  contactPhone: varchar('contact_phone', { length: 30 }).notNull(),
  /** Anything the host should know (allergies, an occasion); shown on the host's list. */
  notes: varchar('notes', { length: 500 }),
  /** Booked online, or seated by a host at the door (then `userId` is that host). */
  source: mysqlEnum('source', ['online', 'walk_in']).notNull().default('online'),
  /** The booker confirmed that everyone in the party is of legal age and will bring ID. */
  ageConfirmed: boolean('age_confirmed').notNull(),
  unitPriceMinor: int('unit_price_minor').notNull(),
  amountMinor: int('amount_minor').notNull(),
  currency: char('currency', { length: 3 }).notNull(),
  holdExpiresAt: utcDatetime('hold_expires_at').notNull(),
  checkoutSessionId: varchar('checkout_session_id', { length: 255 }),
  checkoutUrl: varchar('checkout_url', { length: 1000 }),
  paymentIntentId: varchar('payment_intent_id', { length: 255 }),
  amountPaidMinor: int('amount_paid_minor').notNull().default(0),
  amountRefundedMinor: int('amount_refunded_minor').notNull().default(0),
  refundId: varchar('refund_id', { length: 255 }),
  /** Why the booking ended (cancelled, refunded or expired); null while it is live. */
  endReason: mysqlEnum('end_reason', BOOKING_END_REASONS),
  confirmedAt: utcDatetime('confirmed_at'),
  cancelledAt: utcDatetime('cancelled_at'),
  refundedAt: utcDatetime('refunded_at'),
  expiredAt: utcDatetime('expired_at'),
  checkedInAt: utcDatetime('checked_in_at'),
  reminderSentAt: utcDatetime('reminder_sent_at'),
  ...timestamps,
}, t => [
  uniqueIndex('bookings_reference_uq').on(t.reference),
  uniqueIndex('bookings_checkout_session_uq').on(t.checkoutSessionId),
  // A session's bookings by state, and everything the seat rule and a report's money totals read
  // (source, hold end, party, paid, refunded): those grouped reads come from the index alone.
  index('bookings_session_facts_idx').on(t.sessionId, t.state, t.source, t.holdExpiresAt, t.partySize, t.amountPaidMinor, t.amountRefundedMinor),
  index('bookings_user_idx').on(t.userId),
  index('bookings_state_hold_idx').on(t.state, t.holdExpiresAt),
  // Bookings by when they were made (takings and bookings over a range of days, the report's order).
  index('bookings_venue_created_idx').on(t.venueId, t.createdAt),
  // Ended bookings whose refund may still be owed: cancelled and not refunded, or expired with a
  // payment and not refunded. The sweep's retry reads these few rows, not every expired hold.
  index('bookings_refund_due_idx').on(t.state, t.refundedAt, t.paymentIntentId),
])

/**
 * Every payment-provider event the webhook accepted, once: a replay of the same event id finds
 * its row and changes nothing. Written in the same transaction as the change the event caused.
 */
export const paymentEvents = mysqlTable('payment_events', {
  id: int('id').autoincrement().primaryKey(),
  provider: varchar('provider', { length: 20 }).notNull(),
  providerEventId: varchar('provider_event_id', { length: 255 }).notNull(),
  type: varchar('type', { length: 100 }).notNull(),
  /** SHA-256 of the raw body as received. */
  payloadHash: char('payload_hash', { length: 64 }).notNull(),
  bookingId: int('booking_id').references(() => bookings.id, { onDelete: 'set null' }),
  /** What the event did, in a few words (for the people who read the table). */
  outcome: varchar('outcome', { length: 200 }).notNull(),
  processedAt: utcDatetime('processed_at').notNull(),
}, t => [uniqueIndex('payment_events_provider_event_uq').on(t.provider, t.providerEventId), index('payment_events_booking_idx').on(t.bookingId)])

export type Booking = typeof bookings.$inferSelect
export type PaymentEvent = typeof paymentEvents.$inferSelect
