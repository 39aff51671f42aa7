import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import Papa from 'papaparse'
import { LAB_SHEETS } from '../../shared/labSheet'
import { DEMO_LAB, DEMO_PRODUCTS } from '../../server/demo/data'
import { withDb } from './db'

/**
 * Lab sheets for the tests: the samples the app ships, a large valid sheet, and sheets with one
 * kind of error per line (each with the line and column the check must report).
 */

export type SheetRow = Record<string, string | number>
export const PRODUCT_COLUMNS = [...LAB_SHEETS.products.required, ...LAB_SHEETS.products.optional]
export const MEASUREMENT_COLUMNS = [...LAB_SHEETS.measurements.required, ...LAB_SHEETS.measurements.optional]

export const SAMPLES_DIR = resolve(import.meta.dirname, '../../public/samples')
export const readSample = (kind: 'products' | 'measurements') => readFileSync(resolve(SAMPLES_DIR, `lab-sheet-${kind}.csv`), 'utf8')
export const sampleCodes = (kind: 'products' | 'measurements') =>
  Papa.parse<{ code: string }>(readSample(kind), { header: true, skipEmptyLines: true }).data.map(r => r.code)

export function toCsv(rows: SheetRow[], columns: readonly string[]): string {
  return Papa.unparse({ fields: [...columns], data: rows.map(r => columns.map(c => r[c] ?? '')) })
}

/** A short tag unique to this run, so codes never clash with an earlier test's rows. */
export const runTag = () => Date.now().toString(36).slice(-5).toUpperCase() + Math.random().toString(36).slice(2, 5).toUpperCase()

/** A valid products-sheet row (invented values); `over` replaces any column. */
export function productRow(code: string, over: SheetRow = {}): SheetRow {
  return {
    code, kind: 'still_wine', name: `Test Cuvée ${code}`, producer: 'Larmoir Test Cellar', vintage: '2024',
    abv_pct_vol: 12.5, residual_sugar_g_l: 2, serving_temp_c: 10, bottle_ml: 750, cost_per_bottle: '14.50',
    allergens: 'sulfites', lab: 'Test Lab', method: 'Ebulliometry', measured_on: '2026-10-01', notes: '',
    ...over,
  }
}

export function measurementRow(code: string, over: SheetRow = {}): SheetRow {
  return { code, abv_pct_vol: 12.7, residual_sugar_g_l: 2.2, lab: 'Test Lab', method: 'Ebulliometry', measured_on: '2026-11-01', notes: '', ...over }
}

/** `n` valid products with codes `<tag>-00001`…, for the streaming check. */
export function bigProductsSheet(n: number, tag: string): string {
  const kinds = ['still_wine', 'sparkling', 'fortified', 'spirit', 'beer', 'cider'] as const
  const rows = Array.from({ length: n }, (_, i) => productRow(`${tag}-${String(i + 1).padStart(5, '0')}`, {
    kind: kinds[i % kinds.length]!,
    abv_pct_vol: (4 + (i % 50)).toFixed(1),
    residual_sugar_g_l: (i % 120).toFixed(1),
    serving_temp_c: 6 + (i % 12),
  }))
  return toCsv(rows, PRODUCT_COLUMNS)
}

export interface ExpectedError { line: number, column: string, message: RegExp, what: string }

/** Tomorrow and then some, as YYYY-MM-DD: a date no lab can have measured on yet. */
const future = () => new Date(Date.now() + 3 * 86_400_000).toISOString().slice(0, 10)

/**
 * A products sheet with one valid row (line 2) and, on each later line, one kind of error. The
 * demo product's code stands for "already on the list".
 */
export function productsErrorSheet(tag: string): { csv: string, expected: ExpectedError[], validLines: number[] } {
  const existing = DEMO_PRODUCTS[0]!.code
  const c = (n: number) => `${tag}-E${n}`
  const rows: [SheetRow, ExpectedError | null][] = [
    [productRow(c(1)), null],
    [productRow(c(2), { abv_pct_vol: 120 }), { line: 3, column: 'abv_pct_vol', message: /between 0 and 100/, what: 'ABV above 100 % vol' }], // ABV cannot exceed 100 % by definition of the quantity
    [productRow(c(3), { kind: 'kombucha' }), { line: 4, column: 'kind', message: /Unknown kind/, what: 'unknown kind' }],
    [productRow(c(1)), { line: 5, column: 'code', message: /Duplicate code: line 2/, what: 'code repeated in the sheet' }],
    [productRow(existing), { line: 6, column: 'code', message: /already on the list/, what: 'code already in the database' }],
    [productRow(c(6), { residual_sugar_g_l: 'sweet' }), { line: 7, column: 'residual_sugar_g_l', message: /as a number/, what: 'sugar not a number' }],
    [productRow(c(7), { measured_on: '2026-02-30' }), { line: 8, column: 'measured_on', message: /does not exist/, what: 'impossible date' }],
    [productRow(c(8), { measured_on: future() }), { line: 9, column: 'measured_on', message: /future/, what: 'date in the future' }],
    [productRow(c(9), { name: '' }), { line: 10, column: 'name', message: /Enter the name/, what: 'missing name' }],
    [productRow(c(10), { cost_per_bottle: '$14' }), { line: 11, column: 'cost_per_bottle', message: /plain number/, what: 'cost with a currency sign' }],
    [productRow(c(11), { allergens: 'sulfites;pollen' }), { line: 12, column: 'allergens', message: /Unknown allergen/, what: 'unknown allergen' }],
    [productRow(c(12), { serving_temp_c: 55 }), { line: 13, column: 'serving_temp_c', message: /between 0 and 40/, what: 'serving temperature out of range' }],
    [productRow(c(13), { bottle_ml: 12.5 }), { line: 14, column: 'bottle_ml', message: /whole millilitres/, what: 'fractional bottle size' }],
    [productRow(c(14), { residual_sugar_g_l: -1 }), { line: 15, column: 'residual_sugar_g_l', message: /between 0 and 400/, what: 'negative sugar' }],
  ]
  return {
    csv: toCsv(rows.map(r => r[0]), PRODUCT_COLUMNS),
    expected: rows.flatMap(r => (r[1] ? [r[1]] : [])),
    validLines: [2],
  }
}

/** A products sheet without the `lab` column and with one the importer does not know. */
export function productsSheetMissingColumn(tag: string): string {
  const columns = [...PRODUCT_COLUMNS.filter(c => c !== 'lab'), 'closure']
  return toCsv([productRow(`${tag}-M1`, { closure: 'cork' }), productRow(`${tag}-M2`, { closure: 'screwcap' })], columns)
}

/** A measurements sheet: a valid row (line 2), then one error per line. */
export function measurementsErrorSheet(tag: string): { csv: string, expected: ExpectedError[], validLines: number[] } {
  const demo = DEMO_PRODUCTS[1]!.code
  const rows: [SheetRow, ExpectedError | null][] = [
    [measurementRow(demo, { measured_on: '2026-11-02', lab: `Lab ${tag}` }), null],
    [measurementRow(`${tag}-NOPE`), { line: 3, column: 'code', message: /No product on the list/, what: 'unknown code' }],
    [measurementRow(demo, { measured_on: '2026-11-02', lab: `Lab ${tag}` }), { line: 4, column: 'code', message: /Duplicate measurement: line 2/, what: 'measurement repeated in the sheet' }],
    [measurementRow(DEMO_PRODUCTS[0]!.code, { measured_on: '2026-09-15', lab: DEMO_LAB.lab }), { line: 5, column: 'measured_on', message: /already has a measurement/, what: 'measurement already on record' }],
    [measurementRow(demo, { abv_pct_vol: -2, measured_on: '2026-11-03' }), { line: 6, column: 'abv_pct_vol', message: /between 0 and 100/, what: 'negative ABV' }], // ABV cannot be below 0 % by definition
    [measurementRow(demo, { lab: '', measured_on: '2026-11-04' }), { line: 7, column: 'lab', message: /Name the lab/, what: 'missing lab' }],
  ]
  return {
    csv: toCsv(rows.map(r => r[0]), MEASUREMENT_COLUMNS),
    expected: rows.flatMap(r => (r[1] ? [r[1]] : [])),
    validLines: [2],
  }
}

/** Reads the preview's NDJSON answer into its lines. */
export function ndjsonLines(body: unknown): { type: string, [k: string]: any }[] {
  return String(body).split('\n').filter(l => l.trim()).map(l => JSON.parse(l))
}

/** Removes products (and, by cascade, their measurements) that a test added. */
export async function removeProducts(codes: string[]): Promise<void> {
  if (!codes.length) return
  await withDb(c => c.query('DELETE FROM products WHERE code IN (?)', [codes]))
}

/** Removes measurements recorded after `afterId`, so demo products get their own numbers back. */
export async function removeMeasurementsAfter(afterId: number): Promise<void> {
  await withDb(c => c.query('DELETE FROM product_measurements WHERE id > ?', [afterId]))
}

export async function lastMeasurementId(): Promise<number> {
  return withDb(async (c) => {
    const [rows] = await c.query('SELECT COALESCE(MAX(id), 0) AS id FROM product_measurements')
    return Number((rows as { id: number }[])[0]?.id ?? 0)
  })
}
