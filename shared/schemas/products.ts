import { z } from './zod'
import { ALLERGENS, PRODUCT_KINDS, PRODUCT_STATUSES } from '../products'
import { LIQUID_COLOURS } from '../liquidColours'
import { ABV_RANGE_PCT_VOL, SUGAR_RANGE_G_L, TEMP_RANGE_C } from '../science/ranges'
import { isoDateField } from './common'

const num = (label: string, min: number, max: number, unit: string) =>
  z.number({ error: `Enter ${label} as a number.` }).refine(Number.isFinite, { error: `Enter ${label} as a number.` })
    .min(min, { error: `${cap(label)} must be between ${min} and ${max} ${unit}.` })
    .max(max, { error: `${cap(label)} must be between ${min} and ${max} ${unit}.` })
const cap = (s: string) => s.charAt(0).toUpperCase() + s.slice(1)

const productCodeField = z.string({ error: 'Enter a product code.' }).trim()
  .min(1, { error: 'Enter a product code.' }).max(40, { error: 'Use at most 40 characters for the code.' })
  .regex(/^[\w.-]+$/, { error: 'Use letters, digits, dots, dashes or underscores in the code.' })

/**
 * Today's date where the day is furthest along (UTC+14), so that "today" in the venue's own zone is
 * never taken for the future, wherever the venue is.
 */
const EARLIEST_ZONE_OFFSET_MS = 14 * 60 * 60 * 1000
const latestTodayIso = () => new Date(Date.now() + EARLIEST_ZONE_OFFSET_MS).toISOString().slice(0, 10)

/** One lab measurement: ABV at 20 °C as reported, residual sugar, who measured it, how and when. */
export const measurementSchema = z.object({
  abvPctVol: num('ABV', ABV_RANGE_PCT_VOL.min, ABV_RANGE_PCT_VOL.max, '% vol'),
  residualSugarGL: num('residual sugar', SUGAR_RANGE_G_L.min, SUGAR_RANGE_G_L.max, 'g/L'),
  lab: z.string({ error: 'Name the lab.' }).trim().min(1, { error: 'Name the lab.' }).max(160, { error: 'Use at most 160 characters.' }),
  method: z.string({ error: 'Name the method.' }).trim().min(1, { error: 'Name the method.' }).max(160, { error: 'Use at most 160 characters.' }),
  measuredOn: isoDateField.refine(s => s <= latestTodayIso(), { error: 'The measurement date cannot be in the future.' }),
  notes: z.string().trim().max(2000, { error: 'Use at most 2000 characters.' }).nullish(),
})
export type MeasurementInput = z.input<typeof measurementSchema>

const productFields = {
  code: productCodeField,
  kind: z.enum(PRODUCT_KINDS, { error: `Choose a kind: ${PRODUCT_KINDS.join(', ')}.` }),
  name: z.string({ error: 'Enter the name.' }).trim().min(1, { error: 'Enter the name.' }).max(160, { error: 'Use at most 160 characters.' }),
  producer: z.string({ error: 'Enter the producer.' }).trim().min(1, { error: 'Enter the producer.' }).max(160, { error: 'Use at most 160 characters.' }),
  vintageOrBatch: z.string().trim().max(40, { error: 'Use at most 40 characters.' }).nullish().transform(v => v || null),
  colour: z.enum(LIQUID_COLOURS, { error: `Choose a colour: ${LIQUID_COLOURS.join(', ')}, or none for the kind's usual colour.` })
    .nullish().transform(v => v ?? null),
  servingTempC: num('the serving temperature', TEMP_RANGE_C.min, TEMP_RANGE_C.max, '°C'),
  allergens: z.array(z.enum(ALLERGENS, { error: `Allergens must be among: ${ALLERGENS.join(', ')}.` }), { error: 'List the allergens.' })
    .max(ALLERGENS.length).transform(a => [...new Set(a)]),
  bottleSizeMl: z.number({ error: 'Enter the bottle size in mL.' }).int({ error: 'Use whole millilitres.' }).min(50, { error: 'The bottle size must be between 50 and 20000 mL.' }).max(20000, { error: 'The bottle size must be between 50 and 20000 mL.' }),
  costPerBottleMinor: z.number({ error: 'Enter the cost.' }).int({ error: 'The cost is in minor units (whole cents).' }).min(0, { error: 'The cost cannot be negative.' }).max(100_000_00, { error: 'That cost is too large.' }),
  status: z.enum(PRODUCT_STATUSES, { error: 'Choose active or retired.' }),
}

/** A product's descriptive fields; a new product is active unless it says otherwise. */
const productFieldsSchema = z.object({ ...productFields, status: productFields.status.default('active') })

/** A new product arrives with its first measurement. */
export const productCreateSchema = productFieldsSchema.extend({ measurement: measurementSchema })

/**
 * A change to some of the fields. Built without the status default: zod 4 applies defaults inside
 * optional fields, which would quietly bring a retired product back on every edit.
 */
export const productPatchSchema = z.object(productFields).partial().refine(v => Object.keys(v).length > 0, { error: 'Change at least one field.' })

/** The columns the products list sorts by on the server (film activity is derived, not stored). */
export const PRODUCT_SORTS = ['name', 'code', 'kind', 'abv', 'sugar', 'temp', 'status', 'updated'] as const
export type ProductSort = typeof PRODUCT_SORTS[number]
const PRODUCT_PAGE_SIZE_DEFAULT = 25
const PRODUCT_PAGE_SIZE_MAX = 100

/**
 * GET /api/products: a page of the catalogue. `q` finds words in the name, producer, vintage or
 * code; `ids` asks for named products (the flight builder's pours); the glass model runs for the
 * page only, so a catalogue of thousands costs what a page costs.
 */
export const productListQuerySchema = z.object({
  q: z.string({ error: 'q must be text.' }).trim().max(80, { error: 'Search with at most 80 characters.' }).optional().transform(v => v || undefined),
  status: z.enum([...PRODUCT_STATUSES, 'all'], { error: 'status is active, retired or all.' }).default('all'),
  kind: z.enum(PRODUCT_KINDS, { error: `kind is one of ${PRODUCT_KINDS.join(', ')}.` }).optional(),
  ids: z.string({ error: 'ids must be a list of product ids.' })
    .regex(/^\d{1,9}(,\d{1,9}){0,99}$/, { error: 'ids is up to 100 product ids separated by commas.' })
    .transform(s => [...new Set(s.split(',').map(Number))]).optional(),
  sort: z.enum(PRODUCT_SORTS, { error: `sort is one of ${PRODUCT_SORTS.join(', ')}.` }).default('name'),
  dir: z.enum(['asc', 'desc'], { error: 'dir is asc or desc.' }).default('asc'),
  page: z.coerce.number({ error: 'page must be a number.' }).int({ error: 'page must be a whole number.' }).min(1, { error: 'Pages are numbered from 1.' }).max(10_000, { error: 'page is at most 10000.' }).default(1),
  pageSize: z.coerce.number({ error: 'pageSize must be a number.' }).int({ error: 'pageSize must be a whole number.' })
    .min(1, { error: 'pageSize is at least 1.' }).max(PRODUCT_PAGE_SIZE_MAX, { error: `pageSize is at most ${PRODUCT_PAGE_SIZE_MAX}.` }).default(PRODUCT_PAGE_SIZE_DEFAULT),
})
export type ProductListQuery = z.output<typeof productListQuerySchema>
