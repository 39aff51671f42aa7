import { mysqlTable, int, mysqlEnum, double, decimal, boolean, char, json, index } from 'drizzle-orm/mysql-core'
import { OBSERVATION_SOURCES, OBSERVED_SINCE, ROOM_SOURCES, TEARS_FORMED, TEAR_COUNTS, TEAR_SPEEDS } from '../../../shared/observations'
import { utcDatetime } from './common'
import { venues } from './venues'
import { flights, flightPours, glasses } from './flights'
import { products, productMeasurements } from './products'
import { tastingSessions } from './sessions'

/**
 * What one guest or host saw in one glass. Tied to the pour, the product's measurement, the glass,
 * the session and the room reading it was seen in — never to a guest's identity: the device key is
 * a keyed hash of a random per-browser cookie, used only to limit and weigh a device's entries.
 * Implausible values are kept and flagged (`flags`), and the calibration leaves flagged rows out.
 */
export const observations = mysqlTable('observations', {
  id: int('id').autoincrement().primaryKey(),
  venueId: int('venue_id').notNull().references(() => venues.id, { onDelete: 'cascade' }),
  flightId: int('flight_id').notNull().references(() => flights.id, { onDelete: 'cascade' }),
  flightPourId: int('flight_pour_id').notNull().references(() => flightPours.id, { onDelete: 'cascade' }),
  productId: int('product_id').notNull().references(() => products.id, { onDelete: 'cascade' }),
  measurementId: int('measurement_id').notNull().references(() => productMeasurements.id, { onDelete: 'cascade' }),
  glassId: int('glass_id').notNull().references(() => glasses.id, { onDelete: 'cascade' }),
  /** The session it was seen at; null when the pour page was opened without one. */
  sessionId: int('session_id').references(() => tastingSessions.id, { onDelete: 'set null' }),
  source: mysqlEnum('source', OBSERVATION_SOURCES).notNull(),
  /** Keyed hash (hex) of the device's random cookie; null for a host's entry (staff are accountable by role, not stored here). */
  deviceKey: char('device_key', { length: 64 }),
  /** The pour's numbers when it was seen (a later lab sheet does not rewrite what this glass held). */
  abvPctVol: double('abv_pct_vol').notNull(),
  residualSugarGL: double('residual_sugar_g_l').notNull(),
  servingTempC: double('serving_temp_c').notNull(),
  /** The clear band's height read against the card's scale, mm; null with noClearBand or when not read. */
  bandHeightMm: double('band_height_mm'),
  noClearBand: boolean('no_clear_band').notNull().default(false),
  tearsFormed: mysqlEnum('tears_formed', TEARS_FORMED).notNull(),
  tearCount: mysqlEnum('tear_count', TEAR_COUNTS),
  tearSpeed: mysqlEnum('tear_speed', TEAR_SPEEDS),
  minutesSince: int('minutes_since').notNull(),
  since: mysqlEnum('since', OBSERVED_SINCE).notNull(),
  /** The room the glass stood in: the host's reading on this entry, the session's, or the venue's usual air. */
  roomHumidityPct: int('room_humidity_pct').notNull(),
  roomAirTempC: decimal('room_air_temp_c', { precision: 4, scale: 1, mode: 'number' }).notNull(),
  roomSource: mysqlEnum('room_source', ROOM_SOURCES).notNull(),
  /** Why the values look implausible (kept, shown, left out of the calibration); empty when none. */
  flags: json('flags').$type<string[]>().notNull(),
  /** Invented observations shipped with the demo venue. */
  demo: boolean('demo').notNull().default(false),
  recordedAt: utcDatetime('recorded_at').notNull(),
}, t => [
  index('observations_venue_time_idx').on(t.venueId, t.recordedAt),
  index('observations_pour_idx').on(t.flightPourId, t.sessionId, t.deviceKey),
  index('observations_product_idx').on(t.productId),
  index('observations_glass_idx').on(t.glassId),
])

export type Observation = typeof observations.$inferSelect
