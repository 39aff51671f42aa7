import { mysqlTable, int, varchar, mysqlEnum, char, decimal, index, uniqueIndex } from 'drizzle-orm/mysql-core'
import { timestamps, utcDatetime } from './common'
import { venues } from './venues'
import { flights } from './flights'
import { users } from './users'
import { SESSION_STATUSES } from '../../../shared/sessions'

/** A paid, seated sitting of one flight. Start is a UTC instant; pages show it in the venue's zone. */
export const tastingSessions = mysqlTable('tasting_sessions', {
  id: int('id').autoincrement().primaryKey(),
  venueId: int('venue_id').notNull().references(() => venues.id, { onDelete: 'cascade' }),
  flightId: int('flight_id').notNull().references(() => flights.id, { onDelete: 'restrict' }),
  startsAt: utcDatetime('starts_at').notNull(),
  durationMinutes: int('duration_minutes').notNull(),
  seats: int('seats').notNull(),
  /** Integer minor units of `currency`, per guest. */
  priceMinor: int('price_minor').notNull(),
  currency: char('currency', { length: 3 }).notNull(),
  hostId: int('host_id').references(() => users.id, { onDelete: 'set null' }),
  /** Bookings close this many minutes before the start. */
  bookingCutoffMinutes: int('booking_cutoff_minutes').notNull().default(60),
  status: mysqlEnum('status', SESSION_STATUSES).notNull().default('open'),
  /** Sessions created together as a recurring series share this id. */
  seriesId: varchar('series_id', { length: 36 }),
  /**
   * The host's reading of the room for this session (relative humidity %, air °C to a tenth), when
   * and by whom: cards printed after it assume this air; until then the venue's usual reading.
   */
  roomHumidityPct: int('room_humidity_pct'),
  roomAirTempC: decimal('room_air_temp_c', { precision: 4, scale: 1, mode: 'number' }),
  roomReadAt: utcDatetime('room_read_at'),
  roomReadBy: int('room_read_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [
  index('sessions_venue_start_idx').on(t.venueId, t.startsAt),
  // Sessions by start alone, across venues: the booking sweep's "starts in 24–25 hours" (reminders).
  index('sessions_start_idx').on(t.startsAt),
  // One flight cannot be scheduled twice at the same instant (a double click on Schedule).
  uniqueIndex('sessions_flight_start_uq').on(t.flightId, t.startsAt),
  index('sessions_flight_idx').on(t.flightId),
  index('sessions_series_idx').on(t.seriesId),
])

export type TastingSession = typeof tastingSessions.$inferSelect
