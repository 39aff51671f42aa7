import { mysqlTable, int, varchar, mysqlEnum, double, date, json, text, index, uniqueIndex } from 'drizzle-orm/mysql-core'
import { timestamps } from './common'
import { venues } from './venues'
import { PRODUCT_KINDS, PRODUCT_STATUSES, type Allergen } from '../../../shared/products'
import { LIQUID_COLOURS } from '../../../shared/liquidColours'

export const products = mysqlTable('products', {
  id: int('id').autoincrement().primaryKey(),
  venueId: int('venue_id').notNull().references(() => venues.id, { onDelete: 'cascade' }),
  /** The venue's own short code for the product (unique per venue), used by lab-sheet imports. */
  code: varchar('code', { length: 40 }).notNull(),
  kind: mysqlEnum('kind', PRODUCT_KINDS).notNull(),
  name: varchar('name', { length: 160 }).notNull(),
  producer: varchar('producer', { length: 160 }).notNull(),
  vintageOrBatch: varchar('vintage_or_batch', { length: 40 }),
  servingTempC: double('serving_temp_c').notNull(),
  allergens: json('allergens').$type<Allergen[]>().notNull(),
  bottleSizeMl: int('bottle_size_ml').notNull(),
  /** The liquid's colour in the trade's words (shared/liquidColours.ts); null: the kind's usual colour. */
  colour: mysqlEnum('colour', LIQUID_COLOURS),
  /** Integer minor units of the venue's currency. */
  costPerBottleMinor: int('cost_per_bottle_minor').notNull(),
  status: mysqlEnum('status', PRODUCT_STATUSES).notNull().default('active'),
  ...timestamps,
}, t => [uniqueIndex('products_venue_code_uq').on(t.venueId, t.code), index('products_venue_status_idx').on(t.venueId, t.status)])

/** Lab measurements are appended, never overwritten; the newest by measured date (then id) is current. */
export const productMeasurements = mysqlTable('product_measurements', {
  id: int('id').autoincrement().primaryKey(),
  productId: int('product_id').notNull().references(() => products.id, { onDelete: 'cascade' }),
  /** % vol at 20 °C, as a lab sheet reports it. */
  abvPctVol: double('abv_pct_vol').notNull(),
  residualSugarGL: double('residual_sugar_g_l').notNull(),
  lab: varchar('lab', { length: 160 }).notNull(),
  method: varchar('method', { length: 160 }).notNull(),
  measuredOn: date('measured_on', { mode: 'string' }).notNull(),
  notes: text('notes'),
  ...timestamps,
}, t => [index('product_measurements_product_idx').on(t.productId, t.measuredOn)])

export type Product = typeof products.$inferSelect
export type ProductMeasurement = typeof productMeasurements.$inferSelect
