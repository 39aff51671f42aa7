import { z } from '#shared/schemas/zod'
import type { Allergen, ProductKind, ProductStatus } from '#shared/products'
import { measurementSchema, productCreateSchema, productPatchSchema } from '#shared/schemas/products'
import { fromDisplayTemp, temperatureFigure } from '#shared/pours'
import { TEMP_RANGE_C } from '#shared/science/ranges'
import type { ProductView } from '#shared/types/products'
import type { LiquidColour } from '#shared/liquidColours'
import { currencyDigits, minorToDecimal, parseMoney } from '#shared/money'

// The transforms below hand the schema values it has yet to check (an empty box is undefined); the
// casts only tell TypeScript so, and the piped schema refuses them with a message per field.

/**
 * What the product form holds: the serving temperature in the venue's unit and the cost in major
 * units as typed. `productBody` turns it into the API's shape (°C, integer minor units), and the
 * form schemas pipe that into the very schema the route parses, so field messages keep the API's
 * field names (servingTempC, costPerBottleMinor) and the server's answers land on the same inputs.
 */
export interface ProductFormValues {
  code: string
  kind: ProductKind | ''
  name: string
  producer: string
  vintageOrBatch: string
  /** '' : the kind's usual colour. */
  colour: LiquidColour | ''
  servingTemp: number | ''
  allergens: Allergen[]
  bottleSizeMl: number | ''
  cost: string
  status: ProductStatus
}

/** The measurement form: numbers stay '' until typed, so an empty box reads as "missing". */
export interface MeasurementFormValues {
  abvPctVol: number | ''
  residualSugarGL: number | ''
  lab: string
  method: string
  measuredOn: string
  notes: string
}

export interface FormUnits { temperatureUnit: 'c' | 'f', currency: string }

const numberOrNothing = (v: number | string | '') => (v === '' || v === null || v === undefined ? undefined : Number(v))

export function productBody(v: ProductFormValues, units: FormUnits) {
  const temp = numberOrNothing(v.servingTemp)
  return {
    code: v.code,
    kind: v.kind || undefined,
    name: v.name,
    producer: v.producer,
    vintageOrBatch: v.vintageOrBatch,
    colour: v.colour || null,
    servingTempC: temp === undefined ? undefined : fromDisplayTemp(temp, units.temperatureUnit),
    allergens: v.allergens,
    bottleSizeMl: numberOrNothing(v.bottleSizeMl),
    costPerBottleMinor: parseMoney(v.cost, units.currency),
    status: v.status,
  }
}

function measurementBody(v: MeasurementFormValues) {
  return {
    abvPctVol: numberOrNothing(v.abvPctVol),
    residualSugarGL: numberOrNothing(v.residualSugarGL),
    lab: v.lab,
    method: v.method,
    measuredOn: v.measuredOn,
    notes: v.notes || null,
  }
}

export const productCreateForm = (units: FormUnits) => z.custom<ProductFormValues & { measurement: MeasurementFormValues }>()
  .transform(v => ({ ...productBody(v, units), measurement: measurementBody(v.measurement) }) as z.input<typeof productCreateSchema>)
  .pipe(productCreateSchema)

export const productEditForm = (units: FormUnits) => z.custom<ProductFormValues>()
  .transform(v => productBody(v, units) as z.input<typeof productPatchSchema>)
  .pipe(productPatchSchema)

export const measurementForm = z.custom<MeasurementFormValues>()
  .transform(v => measurementBody(v) as z.input<typeof measurementSchema>)
  .pipe(measurementSchema)

/** The form's starting values: a blank product, or this product in the venue's units. */
export function productFormValues(p: ProductView | null, units: FormUnits): ProductFormValues {
  if (!p) {
    return { code: '', kind: '', name: '', producer: '', vintageOrBatch: '', colour: '', servingTemp: '', allergens: [], bottleSizeMl: 750, cost: '', status: 'active' }
  }
  return {
    code: p.code,
    kind: p.kind,
    name: p.name,
    producer: p.producer,
    vintageOrBatch: p.vintageOrBatch ?? '',
    colour: p.colour ?? '',
    // The figure every page shows; the edit form sends only what changed, so an untouched one stays exact.
    servingTemp: Number(temperatureFigure(p.servingTempC, units.temperatureUnit)),
    allergens: [...p.allergens],
    bottleSizeMl: p.bottleSizeMl,
    cost: p.costPerBottleMinor === null ? '' : minorToDecimal(p.costPerBottleMinor, units.currency),
    status: p.status,
  }
}

/** Today in the venue's zone, as YYYY-MM-DD. */
function venueDateToday(timeZone: string): string {
  return new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(new Date())
}

export function blankMeasurement(timeZone: string, from?: { lab: string, method: string }): MeasurementFormValues {
  return { abvPctVol: '', residualSugarGL: '', lab: from?.lab ?? '', method: from?.method ?? '', measuredOn: venueDateToday(timeZone), notes: '' }
}

/** The schema speaks °C; a venue that reads °F gets the same range in °F. */
export function temperatureMessage(message: string | undefined, unit: 'c' | 'f'): string | undefined {
  if (!message || unit === 'c' || !/between/.test(message)) return message
  const f = (c: number) => temperatureFigure(c, 'f')
  return `The serving temperature must be between ${f(TEMP_RANGE_C.min)} and ${f(TEMP_RANGE_C.max)} °F.`
}

/** The schema speaks minor units; the form asks for the price as printed on an invoice. */
export function costMessage(message: string | undefined, currency: string): string | undefined {
  if (!message || !/minor units/.test(message)) return message
  const digits = currencyDigits(currency)
  return digits > 0 ? `Use at most ${digits} decimals, like ${(14.5).toFixed(digits)}.` : 'Use a whole number.'
}
