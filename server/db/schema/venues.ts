import { mysqlTable, int, varchar, char, text, mysqlEnum, double, json, decimal, boolean } from 'drizzle-orm/mysql-core'
import type { OpeningHours } from '../../../shared/venue'
import { timestamps } from './common'
import { CARD_PAPERS } from '../../../shared/paper'

/** One venue today; every venue-scoped table will carry venue_id. */
export const venues = mysqlTable('venues', {
  id: int('id').autoincrement().primaryKey(),
  name: varchar('name', { length: 120 }).notNull(),
  address: varchar('address', { length: 400 }).notNull(),
  /** IANA zone, e.g. Europe/Lisbon: every instant is stored in UTC and shown in this zone. */
  timeZone: varchar('time_zone', { length: 64 }).notNull(),
  /** BCP 47 locale the venue's dates, times and numbers are written in (en-US: "Oct 3, 2:00 PM"; en-GB: "3 Oct, 14:00"). */
  locale: varchar('locale', { length: 35 }).notNull().default('en-US'),
  /** ISO 3166-1 alpha-2 country the venue is in: chooses the cards' paper unless card_paper is set. */
  country: char('country', { length: 2 }).notNull().default('US'),
  /** The cards' paper, when the manager has chosen one; null: the usual paper of the venue's country (shared/cards.ts). */
  cardPaper: mysqlEnum('card_paper', CARD_PAPERS),
  /** ISO 4217 code; amounts elsewhere are integer minor units of it. */
  currency: char('currency', { length: 3 }).notNull(),
  legalAge: int('legal_age').notNull(),
  volumeUnit: mysqlEnum('volume_unit', ['ml', 'floz']).notNull().default('ml'),
  temperatureUnit: mysqlEnum('temperature_unit', ['c', 'f']).notNull().default('c'),
  standardDrinkKind: mysqlEnum('standard_drink_kind', ['us', 'uk', 'au', 'custom']).notNull(),
  /** Grams of ethanol in one standard drink under the chosen definition. */
  standardDrinkGrams: double('standard_drink_grams').notNull(),
  /** Per-guest ceiling for one flight, grams of ethanol. */
  guestEthanolLimitGrams: double('guest_ethanol_limit_grams').notNull(),
  cancellationCutoffHours: int('cancellation_cutoff_hours').notNull().default(24),
  /**
   * The venue's own caution lines, shown after the fixed block the product keeps (legal age, no
   * driving, pregnancy, medicines, local law: shared/cautions.ts), which a manager cannot remove.
   */
  cautions: text('cautions').notNull(),
  /** How guests reach the venue: shown in the footer, the booking e-mails and wherever a guest is told to contact it. */
  phone: varchar('phone', { length: 40 }).notNull().default(''),
  email: varchar('email', { length: 254 }).notNull().default(''),
  website: varchar('website', { length: 300 }).notNull().default(''),
  /** Opening hours per weekday in local time (shared/venue.ts); null until the manager sets them. */
  openingHours: json('opening_hours').$type<OpeningHours>(),
  /**
   * The room's usual air, as a hygrometer on the wall reads it: what the glass model assumes for
   * every pour unless a host has read the room for the session (tasting_sessions.room_*).
   */
  roomHumidityPct: int('room_humidity_pct').notNull().default(50),
  /** °C to a tenth; pages show it in the venue's temperature unit. */
  roomAirTempC: decimal('room_air_temp_c', { precision: 4, scale: 1, mode: 'number' }).notNull().default(21),
  /**
   * Whether predictions and cards may use the glass model's parameters calibrated from this venue's
   * observations (docs/science.md, "Calibration"); off: the published defaults, always.
   */
  calibrationEnabled: boolean('calibration_enabled').notNull().default(true),
  ...timestamps,
})

export type Venue = typeof venues.$inferSelect
