import Papa from 'papaparse'
import { eq } from 'drizzle-orm'
import type { z } from 'zod'
import { LAB_SHEETS, LAB_SHEET_MAX_ROWS, type LabSheetCheck, type LabSheetKind, type LabSheetRow } from '../../shared/labSheet'
import { PRODUCT_KINDS, PRODUCT_KIND_LABELS, ALLERGENS, type ProductKind } from '../../shared/products'
import { measurementSchema, productCreateSchema } from '../../shared/schemas/products'
import { fieldErrorsFromZod } from '../../shared/utils/fieldErrors'
import { currencyDigits, parseMoney } from '../../shared/money'
import { LIQUID_COLOURS, LIQUID_COLOUR_LABELS, type LiquidColour } from '../../shared/liquidColours'

/** Which CSV column each schema field comes from, so errors point at the column the manager sees. */
const COLUMN_OF: Record<string, string> = {
  'code': 'code', 'kind': 'kind', 'name': 'name', 'producer': 'producer', 'vintageOrBatch': 'vintage', 'colour': 'colour',
  'servingTempC': 'serving_temp_c', 'allergens': 'allergens', 'bottleSizeMl': 'bottle_ml', 'costPerBottleMinor': 'cost_per_bottle',
  'measurement.abvPctVol': 'abv_pct_vol', 'measurement.residualSugarGL': 'residual_sugar_g_l', 'measurement.lab': 'lab',
  'measurement.method': 'method', 'measurement.measuredOn': 'measured_on', 'measurement.notes': 'notes',
  'abvPctVol': 'abv_pct_vol', 'residualSugarGL': 'residual_sugar_g_l', 'lab': 'lab', 'method': 'method', 'measuredOn': 'measured_on', 'notes': 'notes',
}

const BATCH = 250

function toNumber(s: string | undefined): number | undefined {
  if (s === undefined || s.trim() === '') return undefined
  const n = Number(s.trim().replace(',', '.'))
  return Number.isFinite(n) ? n : Number.NaN
}

function toKind(s: string | undefined): ProductKind | string | undefined {
  if (!s) return undefined
  const t = s.trim().toLowerCase()
  return PRODUCT_KINDS.find(k => k === t.replace(/[\s-]+/g, '_') || PRODUCT_KIND_LABELS[k].toLowerCase() === t) ?? s
}

/** A colour cell: the trade word as stored ("ruby") or as labelled ("Pale straw"); empty: none. */
function toColour(s: string | undefined): LiquidColour | string | null {
  const t = s?.trim().toLowerCase()
  if (!t) return null
  return LIQUID_COLOURS.find(c => c === t.replace(/[\s-]+/g, '_') || LIQUID_COLOUR_LABELS[c].toLowerCase() === t) ?? s!
}

/** A sheet's cost cell in minor units: a plain, non-negative number with at most the currency's decimals, else NaN. */
function sheetMinor(cell: string | undefined, currency: string): number | undefined {
  const v = parseMoney(cell, currency)
  return v === undefined || (Number.isInteger(v) && v >= 0 && /^\d/.test(String(cell).trim())) ? v : Number.NaN
}

function productInput(r: Record<string, string>, currency: string) {
  return {
    code: r.code,
    kind: toKind(r.kind),
    name: r.name,
    producer: r.producer,
    vintageOrBatch: r.vintage || null,
    colour: toColour(r.colour),
    servingTempC: toNumber(r.serving_temp_c),
    allergens: (r.allergens ?? '').split(/[;|]/).map(a => a.trim().toLowerCase()).filter(Boolean),
    bottleSizeMl: toNumber(r.bottle_ml),
    costPerBottleMinor: sheetMinor(r.cost_per_bottle, currency),
    measurement: measurementInput(r),
  }
}

function measurementInput(r: Record<string, string>) {
  return {
    abvPctVol: toNumber(r.abv_pct_vol),
    residualSugarGL: toNumber(r.residual_sugar_g_l),
    lab: r.lab,
    method: r.method,
    measuredOn: r.measured_on?.trim(),
    notes: r.notes || null,
  }
}

function messagesByColumn(error: z.ZodError, r: Record<string, string>, currency: string): Record<string, string> {
  const digits = currencyDigits(currency)
  const out: Record<string, string> = {}
  for (const [path, message] of Object.entries(fieldErrorsFromZod(error))) {
    const column = COLUMN_OF[path] ?? COLUMN_OF[path.replace(/\.\d+$/, '')] ?? path
    if (column === 'kind') out[column] = r.kind ? `Unknown kind "${r.kind}". Use one of: ${PRODUCT_KINDS.join(', ')}.` : `Enter the kind: ${PRODUCT_KINDS.join(', ')}.`
    else if (column === 'cost_per_bottle' && r.cost_per_bottle && Number.isNaN(sheetMinor(r.cost_per_bottle, currency))) {
      out[column] = digits > 0 ? `Enter the cost as a plain number with at most ${digits} decimals, like 14.50.` : 'Enter the cost as a whole number.'
    }
    else if (column === 'allergens') out[column] = `Unknown allergen. Use: ${ALLERGENS.join(', ')} (separate with ;).`
    else out[column] ??= message
  }
  return out
}

export interface CheckedSheet {
  check: LabSheetCheck
  /** Validated values by line, for rows without errors. */
  valid: Map<number, { code: string, product?: z.output<typeof productCreateSchema>, measurement?: z.output<typeof measurementSchema> }>
}

interface SheetRecord { line: number, row: Record<string, string>, problem?: string }

/**
 * Parses the CSV row by row and keeps, for each row, the line of the file it starts on, so that
 * blank rows left in a spreadsheet and quoted values spanning lines do not shift the line numbers
 * the preview shows. In step mode papaparse's cursor is the offset just past each row; a row starts
 * where the previous one ended, past any blank lines (which `skipEmptyLines: 'greedy'` drops).
 */
function parseSheet(csv: string): { columns: string[], records: SheetRecord[] } {
  const text = csv.replace(/^\uFEFF/, '')
  // The header is the first line (a column name never spans lines); rows start on line 2.
  const firstBreak = text.indexOf('\n')
  let pos = firstBreak < 0 ? text.length : firstBreak + 1
  let line = 2
  let columns: string[] = []
  const records: SheetRecord[] = []
  const advance = (to: number) => {
    line += countNewlines(text, pos, to)
    pos = to
  }
  Papa.parse<Record<string, string>>(text, {
    header: true,
    skipEmptyLines: 'greedy',
    transformHeader: h => h.trim().toLowerCase(),
    transform: v => v.trim(),
    step: (result) => {
      columns = result.meta.fields ?? columns
      const end = result.meta.cursor
      for (;;) {
        const nl = text.indexOf('\n', pos)
        if (nl < 0 || nl + 1 >= end || !BLANK_LINE.test(text.slice(pos, nl))) break
        advance(nl + 1)
      }
      const problem = result.errors.map(e => e.message).join('; ') || undefined
      records.push({ line, row: result.data, problem })
      advance(end)
    },
  })
  return { columns, records }
}
const BLANK_LINE = /^[\s,;|]*$/

function countNewlines(text: string, from: number, to: number): number {
  let n = 0
  for (let i = text.indexOf('\n', from); i >= 0 && i < to; i = text.indexOf('\n', i + 1)) n++
  return n
}

/** Adds messages for columns that have none yet: "this column is missing" beats "enter a value". */
function keepFirst(errors: Record<string, string>, more: Record<string, string>) {
  for (const [column, message] of Object.entries(more)) errors[column] ??= message
}

const finite = (n: number | undefined) => (n !== undefined && Number.isFinite(n) ? n : undefined)

/**
 * Parses a lab sheet with papaparse and checks every row: required columns, values and ranges
 * (the same zod schemas as the product forms), unknown kinds, codes repeated in the sheet, codes
 * already on the list (new products) or missing from it (new measurements), and measurements
 * already on record (same product, date and lab). Writes nothing.
 */
export async function checkLabSheet(csv: string, sheet: LabSheetKind, venue: { id: number, currency: string }, onProgress?: (done: number, total: number) => Promise<void> | void): Promise<CheckedSheet> {
  const spec = LAB_SHEETS[sheet]
  const { columns, records } = parseSheet(csv)
  if (records.length > LAB_SHEET_MAX_ROWS) {
    invalidFields({ csv: `A sheet may hold at most ${LAB_SHEET_MAX_ROWS} rows; split this one.` })
  }
  const missingColumns = spec.required.filter(c => !columns.includes(c))
  const known = new Set<string>([...spec.required, ...spec.optional])
  const unknownColumns = columns.filter(c => !known.has(c))
  const currency = venue.currency

  const db = useDb()
  const existing = new Map((await db.select({ id: tables.products.id, code: tables.products.code, name: tables.products.name, kind: tables.products.kind }).from(tables.products)
    .where(eq(tables.products.venueId, venue.id))).map(r => [r.code.toLowerCase(), r]))
  const measurementKey = (code: string, measuredOn: string, lab: string) => `${code.toLowerCase()}|${measuredOn}|${lab.trim().toLowerCase()}`
  const recorded = new Set<string>()
  if (sheet === 'measurements') {
    const rows = await db.select({ code: tables.products.code, measuredOn: tables.productMeasurements.measuredOn, lab: tables.productMeasurements.lab })
      .from(tables.productMeasurements).innerJoin(tables.products, eq(tables.products.id, tables.productMeasurements.productId))
      .where(eq(tables.products.venueId, venue.id))
    for (const r of rows) recorded.add(measurementKey(r.code, r.measuredOn, r.lab))
  }
  const seen = new Map<string, number>()
  const rows: LabSheetRow[] = []
  const valid: CheckedSheet['valid'] = new Map()

  for (let i = 0; i < records.length; i++) {
    const { line, row: r, problem } = records[i]!
    const code = (r.code ?? '').trim()
    const errors: Record<string, string> = {}
    for (const c of missingColumns) errors[c] = 'This column is missing from the sheet.'
    if (problem) errors._ = `CSV problem: ${problem}.`

    const summary: LabSheetRow['summary'] = {
      abvPctVol: finite(toNumber(r.abv_pct_vol)),
      residualSugarGL: finite(toNumber(r.residual_sugar_g_l)),
      measuredOn: r.measured_on || undefined,
    }
    if (sheet === 'products') {
      summary.name = r.name || undefined
      summary.kind = r.kind ? toKind(r.kind) : undefined
      const result = productCreateSchema.safeParse(productInput(r, currency))
      if (!result.success) keepFirst(errors, messagesByColumn(result.error, r, currency))
      const firstLine = seen.get(code.toLowerCase())
      if (code && firstLine) errors.code = `Duplicate code: line ${firstLine} has it too.`
      else if (code && existing.has(code.toLowerCase())) errors.code ??= 'A product with this code is already on the list. Import its new numbers as a measurement sheet.'
      if (code && !firstLine) seen.set(code.toLowerCase(), line)
      if (result.success && !Object.keys(errors).length) valid.set(line, { code, product: result.data })
    }
    else {
      const product = existing.get(code.toLowerCase())
      summary.name = product?.name
      summary.kind = product?.kind
      const result = measurementSchema.safeParse(measurementInput(r))
      if (!result.success) keepFirst(errors, messagesByColumn(result.error, r, currency))
      if (!code) errors.code = 'Enter the product code.'
      else if (!product) errors.code = 'No product on the list has this code.'
      const key = measurementKey(code, r.measured_on ?? '', r.lab ?? '')
      const firstLine = seen.get(key)
      if (firstLine) errors.code = `Duplicate measurement: line ${firstLine} has the same code, date and lab.`
      else if (product && recorded.has(key)) errors.measured_on ??= 'This product already has a measurement from this lab on this date.'
      if (!firstLine) seen.set(key, line)
      if (result.success && !Object.keys(errors).length) valid.set(line, { code, measurement: result.data })
    }
    rows.push({ line, code, errors, summary })
    if ((i + 1) % BATCH === 0 && onProgress) {
      await onProgress(i + 1, records.length)
      await new Promise(r => setImmediate(r))
    }
  }
  await onProgress?.(records.length, records.length)
  return { check: { sheet, missingColumns, unknownColumns, rows, validCount: valid.size }, valid }
}

/** Writes the chosen valid rows in one transaction; any chosen row with an error refuses them all. */
export async function commitLabSheet(checked: CheckedSheet, lines: number[], venueId: number): Promise<number> {
  const bad = lines.filter(l => !checked.valid.has(l))
  if (bad.length) {
    invalidFields({ lines: `Lines with errors: ${bad.slice(0, 20).join(', ')}` }, `These lines cannot be imported: ${bad.slice(0, 20).join(', ')}${bad.length > 20 ? '…' : ''}. Fix them or leave them out.`)
  }
  const chosen = [...new Set(lines)].map(l => checked.valid.get(l)!)
  if (!chosen.length) invalidFields({ lines: 'Choose at least one row.' }, 'Choose at least one row to import.')
  await useDb().transaction(async (tx) => {
    const ids = new Map<string, number>()
    if (checked.check.sheet === 'products') {
      for (let i = 0; i < chosen.length; i += 500) {
        const part = chosen.slice(i, i + 500)
        await tx.insert(tables.products).values(part.map(({ product }) => {
          const { measurement, ...fields } = product!
          return { ...fields, venueId }
        }))
      }
    }
    const rows = await tx.select({ id: tables.products.id, code: tables.products.code }).from(tables.products)
      .where(eq(tables.products.venueId, venueId))
    for (const r of rows) ids.set(r.code.toLowerCase(), r.id)
    const measurements = chosen.map((c) => {
      const m = c.measurement ?? c.product!.measurement
      return { ...m, notes: m.notes ?? null, productId: ids.get(c.code.toLowerCase())! }
    })
    for (let i = 0; i < measurements.length; i += 500) {
      await tx.insert(tables.productMeasurements).values(measurements.slice(i, i + 500))
    }
  }).catch((err) => {
    if (!isDuplicateKey(err)) throw err
    conflict('Another import added some of these codes a moment ago. Check the sheet again.')
  })
  return chosen.length
}
