import { mysqlTable, int, varchar, mysqlEnum, double, text, index, uniqueIndex } from 'drizzle-orm/mysql-core'
import { timestamps, utcDatetime } from './common'
import { venues } from './venues'
import { products } from './products'
import { FLIGHT_STATUSES } from '../../../shared/flights'

/** Glass shapes the venue pours into; the diagram and the film predictions read them. */
export const glasses = mysqlTable('glasses', {
  id: int('id').autoincrement().primaryKey(),
  venueId: int('venue_id').notNull().references(() => venues.id, { onDelete: 'cascade' }),
  name: varchar('name', { length: 80 }).notNull(),
  /** Widest inside diameter of the bowl, mm. */
  bowlDiameterMm: double('bowl_diameter_mm').notNull(),
  /** Angle of the wall at the liquid line, degrees from horizontal (90 = a straight, upright wall). */
  wallAngleDeg: double('wall_angle_deg').notNull(),
  /** Height of the usual fill line above the bottom of the bowl, mm. */
  fillHeightMm: double('fill_height_mm').notNull(),
  ...timestamps,
}, t => [uniqueIndex('glasses_venue_name_uq').on(t.venueId, t.name)])

/**
 * A flight is an ordered list of pours. Once published and scheduled its pours are fixed; a change
 * makes a new version (a new row with the same lineage) so booked guests keep what they chose.
 */
export const flights = mysqlTable('flights', {
  id: int('id').autoincrement().primaryKey(),
  venueId: int('venue_id').notNull().references(() => venues.id, { onDelete: 'cascade' }),
  /** The first version's id; every version of one flight shares it. */
  lineageId: int('lineage_id'),
  version: int('version').notNull().default(1),
  name: varchar('name', { length: 120 }).notNull(),
  summary: varchar('summary', { length: 400 }).notNull().default(''),
  status: mysqlEnum('status', FLIGHT_STATUSES).notNull().default('draft'),
  publishedAt: utcDatetime('published_at'),
  ...timestamps,
}, t => [index('flights_venue_status_idx').on(t.venueId, t.status), index('flights_lineage_idx').on(t.lineageId)])

export const flightPours = mysqlTable('flight_pours', {
  id: int('id').autoincrement().primaryKey(),
  flightId: int('flight_id').notNull().references(() => flights.id, { onDelete: 'cascade' }),
  /** 1-based order in which the host pours. */
  position: int('position').notNull(),
  productId: int('product_id').notNull().references(() => products.id, { onDelete: 'restrict' }),
  volumeMl: double('volume_ml').notNull(),
  glassId: int('glass_id').notNull().references(() => glasses.id, { onDelete: 'restrict' }),
  servingTempC: double('serving_temp_c').notNull(),
  note: text('note'),
}, t => [uniqueIndex('flight_pours_position_uq').on(t.flightId, t.position)])

export type Glass = typeof glasses.$inferSelect
export type Flight = typeof flights.$inferSelect
export type FlightPour = typeof flightPours.$inferSelect
