import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { allProducts, Client } from '../support/http'
import { countRows } from '../support/db'
import {
  bigProductsSheet, lastMeasurementId, measurementsErrorSheet, ndjsonLines, PRODUCT_COLUMNS, productRow, productsErrorSheet,
  productsSheetMissingColumn, readSample, removeMeasurementsAfter, removeProducts, runTag, sampleCodes, toCsv,
} from '../support/labSheets'
import { DEMO_PASSWORD, DEMO_PRODUCTS } from '../../server/demo/data'
import type { LabSheetCheck } from '../../shared/labSheet'

const tag = runTag()

describe('lab-sheet import', () => {
  let manager: Client
  let firstNewMeasurement: number
  beforeAll(async () => {
    manager = new Client()
    expect((await manager.signIn('manager@saltmarsh.test', DEMO_PASSWORD)).status).toBe(200)
    firstNewMeasurement = await lastMeasurementId()
  })
  afterAll(async () => {
    await removeProducts(sampleCodes('products'))
    await removeProducts(Array.from({ length: 23 }, (_, i) => `${tag}-E${i}`))
    await removeMeasurementsAfter(firstNewMeasurement)
  })

  async function preview(sheet: 'products' | 'measurements', csv: string) {
    const res = await manager.post('/api/lab-sheets/check', { sheet, csv })
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/application\/x-ndjson/)
    const lines = ndjsonLines(res.body)
    const last = lines.at(-1)!
    expect(last.type).toBe('result')
    return { lines, check: last.result as LabSheetCheck }
  }
  const rowAt = (check: LabSheetCheck, line: number) => check.rows.find(r => r.line === line)!

  it('previews the shipped products sample with no errors, then imports every row together', async () => {
    const csv = readSample('products')
    const { check } = await preview('products', csv)
    expect(check.missingColumns).toEqual([])
    expect(check.unknownColumns).toEqual([])
    expect(check.rows).toHaveLength(20)
    expect(check.rows.filter(r => Object.keys(r.errors).length)).toEqual([])
    expect(check.validCount).toBe(20)
    expect(rowAt(check, 2)).toMatchObject({ code: 'SV-ROS-24', summary: { name: 'Sandbar Rosé', kind: 'still_wine', abvPctVol: 12, residualSugarGL: 3.2, measuredOn: '2026-10-06' } })

    const products = await countRows('products')
    const measurements = await countRows('product_measurements')
    const res = await manager.post('/api/lab-sheets', { sheet: 'products', csv, lines: check.rows.map(r => r.line) })
    expect(res.status).toBe(201)
    expect(res.body.imported).toBe(20)
    expect(await countRows('products')).toBe(products + 20)
    expect(await countRows('product_measurements')).toBe(measurements + 20)

    const list = (await allProducts(manager)) as { code: string, costPerBottleMinor: number, allergens: string[], derived: { filmActivityIndex: number } }[]
    const stout = list.find(p => p.code === 'LB-STO-26')!
    expect(stout.costPerBottleMinor).toBe(500)
    expect(stout.allergens).toEqual(['gluten', 'molluscs'])
    expect(stout.derived.filmActivityIndex).toBeGreaterThanOrEqual(0)

    const again = await preview('products', csv)
    expect(again.check.validCount).toBe(0)
    expect(again.check.rows.every(r => /already on the list/.test(r.errors.code ?? ''))).toBe(true)
  })

  it('reports each kind of error in a products sheet on its line and column', async () => {
    const sheet = productsErrorSheet(tag)
    const { check } = await preview('products', sheet.csv)
    expect(check.validCount).toBe(1)
    expect(rowAt(check, 2).errors).toEqual({})
    for (const e of sheet.expected) {
      const row = rowAt(check, e.line)
      expect(row.errors[e.column], `${e.what} on line ${e.line}`).toMatch(e.message)
      expect(Object.keys(row.errors), `${e.what}: only the column at fault`).toEqual([e.column])
    }
    expect(rowAt(check, 3).summary.abvPctVol).toBe(120)
    expect(rowAt(check, 4).summary.kind).toBe('kombucha')
  })

  it('flags a code repeated in the sheet and a code already on the list', async () => {
    const existing = DEMO_PRODUCTS[2]!.code
    const csv = toCsv([productRow(`${tag}-E15`), productRow(`${tag}-E16`), productRow(`${tag}-E15`, { name: 'Second copy' }), productRow(existing.toLowerCase())], PRODUCT_COLUMNS)
    const { check } = await preview('products', csv)
    expect(rowAt(check, 4).errors.code).toMatch(/Duplicate code: line 2/)
    expect(rowAt(check, 5).errors.code).toMatch(/already on the list/)
    expect(check.rows.filter(r => !Object.keys(r.errors).length).map(r => r.line)).toEqual([2, 3])
  })

  it('reports missing and unknown columns for the sheet and on every row', async () => {
    const { check } = await preview('products', productsSheetMissingColumn(tag))
    expect(check.missingColumns).toEqual(['lab'])
    expect(check.unknownColumns).toEqual(['closure'])
    expect(check.validCount).toBe(0)
    for (const r of check.rows) expect(r.errors.lab).toMatch(/missing from the sheet/)
  })

  it('reads an optional colour column by its trade word or its label, and names an unknown one', async () => {
    const csv = toCsv([productRow(`${tag}-E20`, { colour: 'Pale straw' }), productRow(`${tag}-E21`, { colour: 'purple' }), productRow(`${tag}-E22`, { colour: '' })], PRODUCT_COLUMNS)
    const { check } = await preview('products', csv)
    expect(rowAt(check, 2).errors).toEqual({})
    expect(Object.keys(rowAt(check, 3).errors)).toEqual(['colour'])
    expect(rowAt(check, 3).errors.colour).toMatch(/Choose a colour: water_white/)
    expect(rowAt(check, 4).errors).toEqual({})
    const res = await manager.post('/api/lab-sheets', { sheet: 'products', csv, lines: [2, 4] })
    expect(res.status).toBe(201)
    const list = (await allProducts(manager)) as { code: string, colour: string | null }[]
    expect(list.find(p => p.code === `${tag}-E20`)!.colour).toBe('pale_straw')
    expect(list.find(p => p.code === `${tag}-E22`)!.colour).toBeNull()
  })

  it('keeps line numbers true to the file across blank rows and quoted line breaks', async () => {
    const lines = toCsv([productRow(`${tag}-E17`, { notes: 'two\nlines' }), productRow(`${tag}-E18`, { abv_pct_vol: 101 })], PRODUCT_COLUMNS).split('\r\n')
    const csv = [lines[0], lines[1], '', ',,,', lines[2]].join('\r\n') // row 1 spans lines 2–3, then a blank line and an empty row
    const { check } = await preview('products', csv)
    expect(check.rows.map(r => r.line)).toEqual([2, 6])
    expect(rowAt(check, 6).errors.abv_pct_vol).toMatch(/between 0 and 100/) // ABV cannot exceed 100 % by definition
  })

  it('refuses to commit a line with an error: 400, and nothing written from the sheet', async () => {
    const sheet = productsErrorSheet(tag)
    const products = await countRows('products')
    const measurements = await countRows('product_measurements')
    const res = await manager.post('/api/lab-sheets', { sheet: 'products', csv: sheet.csv, lines: [2, 3] })
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/cannot be imported: 3/)
    expect(await countRows('products')).toBe(products)
    expect(await countRows('product_measurements')).toBe(measurements)
    const none = await manager.post('/api/lab-sheets', { sheet: 'products', csv: sheet.csv, lines: [] })
    expect(none.status).toBe(400)
    expect(none.body.data.fields.lines).toBeTruthy()
    const bad = await manager.post('/api/lab-sheets/check', { sheet: 'wines', csv: '' })
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.data.fields).sort()).toEqual(['csv', 'sheet'])

    const good = await manager.post('/api/lab-sheets', { sheet: 'products', csv: sheet.csv, lines: sheet.validLines })
    expect(good.status).toBe(201)
    expect(await countRows('products')).toBe(products + 1)
  })

  it('streams progress while it checks a 5,000-row sheet, then the result', async () => {
    const csv = bigProductsSheet(5000, `${tag}B`)
    const res = await manager.send('POST', '/api/lab-sheets/check', { sheet: 'products', csv })
    expect(res.status).toBe(200)
    const reader = res.body!.pipeThrough(new TextDecoderStream()).getReader()
    const first = await reader.read()
    expect(first.value).toMatch(/"type":"progress"/)
    expect(first.value).not.toMatch(/"type":"result"/)
    let text = first.value ?? ''
    for (let r = await reader.read(); !r.done; r = await reader.read()) text += r.value
    const lines = ndjsonLines(text)
    const progress = lines.filter(l => l.type === 'progress')
    expect(progress.length).toBeGreaterThanOrEqual(5)
    expect(progress.every(l => l.total === 5000)).toBe(true)
    expect(progress.map(l => l.done)).toEqual([...progress.map(l => l.done)].sort((a, b) => a - b))
    expect(progress.at(-1)!.done).toBe(5000)
    const last = lines.at(-1)!
    expect(last.type).toBe('result')
    expect(last.result.rows).toHaveLength(5000)
    expect(last.result.validCount).toBe(5000)
    expect(last.result.rows.at(-1).line).toBe(5001)
  })

  it('a measurements sheet adds history rows and moves each product to its newest numbers', async () => {
    const csv = readSample('measurements')
    const { check } = await preview('measurements', csv)
    expect(check.rows.filter(r => Object.keys(r.errors).length)).toEqual([])
    expect(rowAt(check, 2).summary).toMatchObject({ name: DEMO_PRODUCTS[0]!.name, kind: DEMO_PRODUCTS[0]!.kind, abvPctVol: 6.3 })
    const products = await countRows('products')
    const measurements = await countRows('product_measurements')
    const list = (await allProducts(manager)) as { id: number, code: string }[]
    const cider = list.find(p => p.code === 'SV-CID-21')!
    const before = (await manager.get(`/api/products/${cider.id}`)).body

    const res = await manager.post('/api/lab-sheets', { sheet: 'measurements', csv, lines: check.rows.map(r => r.line) })
    expect(res.status).toBe(201)
    expect(res.body.imported).toBe(check.rows.length)
    expect(await countRows('product_measurements')).toBe(measurements + check.rows.length)
    expect(await countRows('products')).toBe(products)
    const after = (await manager.get(`/api/products/${cider.id}`)).body
    expect(after.history).toHaveLength(before.history.length + 1)
    expect(after.current).toMatchObject({ abvPctVol: 6.3, residualSugarGL: 3.6, measuredOn: '2026-11-17' })
    expect(after.history.at(-1).id).toBe(before.current.id)

    const twice = await preview('measurements', csv)
    expect(twice.check.validCount).toBe(0)
    expect(rowAt(twice.check, 2).errors.measured_on).toMatch(/already has a measurement/)
  })

  it('reports each kind of error in a measurements sheet on its line and column', async () => {
    const sheet = measurementsErrorSheet(tag)
    const { check } = await preview('measurements', sheet.csv)
    expect(check.rows.filter(r => !Object.keys(r.errors).length).map(r => r.line)).toEqual(sheet.validLines)
    for (const e of sheet.expected) expect(rowAt(check, e.line).errors[e.column], `${e.what} on line ${e.line}`).toMatch(e.message)
    const measurements = await countRows('product_measurements')
    expect((await manager.post('/api/lab-sheets', { sheet: 'measurements', csv: sheet.csv, lines: [2, 3] })).status).toBe(400)
    expect(await countRows('product_measurements')).toBe(measurements)
  })
})
