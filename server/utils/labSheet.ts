import Papa from 'papaparse'
import { eq } from 'drizzle-orm'
import { z } from 'zod'
import { LAB_SHEETS, LAB_SHEET_MAX_ROWS, type LabSheetCheck, type LabSheetKind, type LabSheetRow } from '../../shared/labSheet'
import { PRODUCT_KINDS, PRODUCT_KIND_LABELS, ALLERGENS, type ProductKind } from '../../shared/products'
import { measurementSchema, productCreateSchema } from '../../shared/schemas/products'
import { fieldErrorsFromZod } from '../../shared/utils/fieldErrors'

/** Which CSV column each schema field comes from, so errors point at the column the manager sees. */
const COLUMN_OF: Record<string, string> = {
  'code': 'code', 'kind': 'kind', 'name': 'name', 'producer': 'producer', 'vintageOrBatch': 'vintage',
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

/** "14.50" in the venue's currency → minor units (1450 for USD; 14 for JPY's 0 digits). */
function toMinor(s: string | undefined, digits: number): number | undefined {
  if (s === undefined || s.trim() === '') return undefined
  const t = s.trim()
  if (!new RegExp(`^\\d+(\\.\\d{1,${Math.max(digits, 0)}})?$`).test(t)) return Number.NaN
  return Math.round(Number(t) * 10 ** digits)
}

function productInput(r: Record<string, string>, digits: number) {
  return {
    code: r.code,
    kind: toKind(r.kind),
    name: r.name,
    producer: r.producer,
    vintageOrBatch: r.vintage || null,
    servingTempC: toNumber(r.serving_temp_c),
    allergens: (r.allergens ?? '').split(/[;|]/).map(a => a.trim().toLowerCase()).filter(Boolean),
    bottleSizeMl: toNumber(r.bottle_ml),
    costPerBottleMinor: toMinor(r.cost_per_bottle, digits),
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

function messagesByColumn(error: z.ZodError): Record<string, string> {
  const out: Record<string, string> = {}
  for (const [path, message] of Object.entries(fieldErrorsFromZod(error))) {
    const column = COLUMN_OF[path] ?? COLUMN_OF[path.replace(/\.\d+$/, '')] ?? path
    if (column === 'kind') out[column] = `Unknown kind. Use one of: ${PRODUCT_KINDS.join(', ')}.`
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

/**
 * Parses a lab sheet with papaparse and checks every row: required columns, values and ranges
 * (the same zod schemas as the product forms), unknown kinds, codes repeated in the sheet, codes
 * already on the list (new products) or missing from it (new measurements). Writes nothing.
 */
export async function checkLabSheet(csv: string, sheet: LabSheetKind, venue: { id: number, currency: string }, onProgress?: (done: number, total: number) => Promise<void> | void): Promise<CheckedSheet> {
  const spec = LAB_SHEETS[sheet]
  const parsed = Papa.parse<Record<string, string>>(csv.replace(/^\uFEFF/, ''), {
    header: true,
    skipEmptyLines: 'greedy',
    transformHeader: h => h.trim().toLowerCase(),
    transform: v => v.trim(),
  })
  const columns = parsed.meta.fields ?? []
  const missingColumns = spec.required.filter(c => !columns.includes(c))
  const known = new Set<string>([...spec.required, ...spec.optional])
  const unknownColumns = columns.filter(c => !known.has(c))
  const data = parsed.data.slice(0, LAB_SHEET_MAX_ROWS)
  const digits = new Intl.NumberFormat('en', { style: 'currency', currency: venue.currency }).resolvedOptions().maximumFractionDigits ?? 2

  const existing = new Map((await useDb().select({ id: tables.products.id, code: tables.products.code }).from(tables.products)
    .where(eq(tables.products.venueId, venue.id))).map(r => [r.code.toLowerCase(), r.id]))
  const seen = new Map<string, number>()
  const rows: LabSheetRow[] = []
  const valid: CheckedSheet['valid'] = new Map()
  const rowErrorsByLine = new Map<number, string>()
  for (const e of parsed.errors) if (e.row !== undefined) rowErrorsByLine.set(e.row + 2, e.message)

  for (let i = 0; i < data.length; i++) {
    const r = data[i]!
    const line = i + 2
    const code = (r.code ?? '').trim()
    const errors: Record<string, string> = {}
    for (const c of missingColumns) errors[c] = 'This column is missing from the sheet.'
    const parseError = rowErrorsByLine.get(line)
    if (parseError) errors._ = `CSV problem: ${parseError}.`

    const summary: LabSheetRow['summary'] = {}
    if (sheet === 'products') {
      const result = productCreateSchema.safeParse(productInput(r, digits))
      if (!result.success) Object.assign(errors, messagesByColumn(result.error), errors)
      else {
        summary.name = result.data.name
        summary.kind = result.data.kind
        summary.abvPctVol = result.data.measurement.abvPctVol
        summary.residualSugarGL = result.data.measurement.residualSugarGL
        summary.measuredOn = result.data.measurement.measuredOn
        if (existing.has(code.toLowerCase())) errors.code ??= 'A product with this code is already on the list. Import its new numbers as a measurement sheet.'
        if (!Object.keys(errors).length) valid.set(line, { code, product: result.data })
      }
      const firstLine = seen.get(code.toLowerCase())
      if (code && firstLine) errors.code = `Duplicate code: line ${firstLine} has it too.`
    }
    else {
      const result = measurementSchema.safeParse(measurementInput(r))
      if (!result.success) Object.assign(errors, messagesByColumn(result.error), errors)
      if (!code) errors.code = 'Enter the product code.'
      else if (!existing.has(code.toLowerCase())) errors.code = 'No product on the list has this code.'
      const key = `${code.toLowerCase()}|${r.measured_on ?? ''}|${r.lab ?? ''}`
      const firstLine = seen.get(key)
      if (firstLine) errors.code = `Duplicate measurement: line ${firstLine} has the same code, date and lab.`
      else seen.set(key, line)
      if (result.success) {
        summary.abvPctVol = result.data.abvPctVol
        summary.residualSugarGL = result.data.residualSugarGL
        summary.measuredOn = result.data.measuredOn
        if (!Object.keys(errors).length) valid.set(line, { code, measurement: result.data })
      }
    }
    if (sheet === 'products' && code && !seen.has(code.toLowerCase())) seen.set(code.toLowerCase(), line)
    if (Object.keys(errors).length) valid.delete(line)
    rows.push({ line, code, errors, summary })
    if ((i + 1) % BATCH === 0 && onProgress) {
      await onProgress(i + 1, data.length)
      await new Promise(r => setImmediate(r))
    }
  }
  await onProgress?.(data.length, data.length)
  if (parsed.data.length > LAB_SHEET_MAX_ROWS) {
    throw createError({ statusCode: 400, statusMessage: 'Sheet too long', message: `A sheet may hold at most ${LAB_SHEET_MAX_ROWS} rows; split this one.` })
  }
  return { check: { sheet, missingColumns, unknownColumns, rows, validCount: valid.size }, valid }
}

/** Writes the chosen valid rows in one transaction; any chosen row with an error refuses them all. */
export async function commitLabSheet(checked: CheckedSheet, lines: number[], venueId: number): Promise<number> {
  const bad = lines.filter(l => !checked.valid.has(l))
  if (bad.length) {
    throw createError({ statusCode: 400, statusMessage: 'Rows with errors', message: `These lines cannot be imported: ${bad.slice(0, 20).join(', ')}${bad.length > 20 ? '…' : ''}. Fix them or leave them out.`, data: { fields: { lines: `Lines with errors: ${bad.slice(0, 20).join(', ')}` } } })
  }
  const chosen = [...new Set(lines)].map(l => checked.valid.get(l)!)
  if (!chosen.length) throw createError({ statusCode: 400, statusMessage: 'Nothing chosen', message: 'Choose at least one row to import.', data: { fields: { lines: 'Choose at least one row.' } } })
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
    const measurements = chosen.map(c => {
      const m = c.measurement ?? c.product!.measurement
      return { ...m, notes: m.notes ?? null, productId: ids.get(c.code.toLowerCase())! }
    })
    for (let i = 0; i < measurements.length; i += 500) {
      await tx.insert(tables.productMeasurements).values(measurements.slice(i, i + 500))
    }
  })
  return chosen.length
}
