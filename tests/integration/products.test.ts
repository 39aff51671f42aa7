import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { allProducts, Client } from '../support/http'
import { countRows } from '../support/db'
import { removeProducts, runTag } from '../support/labSheets'
import { DEMO_PASSWORD, DEMO_PRODUCTS } from '../../server/demo/data'
import { DEFAULT_TASTING_POUR_ML } from '../../shared/pours'
import { computeFilm } from '../../shared/science'

const as = async (email: string) => {
  const c = new Client()
  expect((await c.signIn(email, DEMO_PASSWORD)).status).toBe(200)
  return c
}

/** The glass model as the server runs it for a catalogue pour: the venue's usual room, a still wine, a 60 mL pour. */
const modelled = async (manager: Client, abvPctVol: number, tempC: number, sugarGL: number) => {
  const v = (await manager.get('/api/venue')).body as { roomHumidityPct: number, roomAirTempC: number }
  return computeFilm({ abvPctVol, tempC, sugarGL, kind: 'still', pourVolumeMl: 60, room: { relativeHumidityPct: v.roomHumidityPct, airTempC: v.roomAirTempC } })
}

const tag = runTag()
const created: string[] = []
const newProduct = (code: string, over: Record<string, unknown> = {}) => {
  created.push(code)
  return {
    code,
    kind: 'still_wine',
    name: `Brinefield White ${code}`,
    producer: 'Larmoir Test Cellar',
    vintageOrBatch: '2024',
    servingTempC: 10,
    allergens: ['sulfites'],
    bottleSizeMl: 750,
    costPerBottleMinor: 1450,
    measurement: { abvPctVol: 12.5, residualSugarGL: 2, lab: 'Test Lab', method: 'Ebulliometry', measuredOn: '2026-10-01' },
    ...over,
  }
}

describe('products', () => {
  let manager: Client, host: Client, marketing: Client, guest: Client
  let standardDrinkGrams: number
  beforeAll(async () => {
    manager = await as('manager@saltmarsh.test')
    host = await as('host@saltmarsh.test')
    marketing = await as('marketing@saltmarsh.test')
    guest = await as('guest@saltmarsh.test')
    standardDrinkGrams = (await manager.get('/api/venue')).body.standardDrinkGrams
  })
  afterAll(async () => removeProducts(created.filter(c => c.startsWith(tag))))

  it('creates a product with its first measurement and derives the pour figures from the glass model', async () => {
    const res = await manager.post('/api/products', newProduct(`${tag}-A`))
    expect(res.status).toBe(201)
    const p = res.body
    expect(p).toMatchObject({ code: `${tag}-A`, kind: 'still_wine', status: 'active', costPerBottleMinor: 1450, allergens: ['sulfites'] })
    expect(p.history).toHaveLength(1)
    expect(p.current).toMatchObject({ abvPctVol: 12.5, residualSugarGL: 2, measuredOn: '2026-10-01' })
    expect(p.derived.tastingPourMl).toBe(DEFAULT_TASTING_POUR_ML.still_wine)
    const grams = 60 * (12.5 / 100) * 0.78924 // mL × ABV/100 × ethanol density at 20 °C, 0.78924 g/mL (OIML R 22)
    expect(p.derived.ethanolGramsPerPour).toBeCloseTo(grams, 6)
    expect(p.derived.ethanolGramsPerPour).toBeCloseTo(5.92, 2) // 60 mL of 12.5 % vol: 7.5 mL of ethanol ≈ 5.9 g (OIML R 22 density)
    expect(standardDrinkGrams).toBe(14) // US standard drink: 14 g of ethanol (NIAAA)
    expect(p.derived.standardDrinksPerPour).toBeCloseTo(grams / 14, 6) // 14 g of ethanol per US standard drink (NIAAA)
    const film = await modelled(manager, 12.5, 10, 2)
    expect(p.derived.filmActivityIndex).toBeCloseTo(film.filmActivityIndex, 9)
    expect(p.derived.filmActivityIndex).toBeGreaterThan(0)
    expect(p.derived.filmActivityIndex).toBeLessThanOrEqual(10)
    expect(p.derived.tearsExpected).toBe(film.predictions.tearsExpected)
  })

  it('refuses a code already on the list with 409 and writes nothing', async () => {
    const before = await countRows('products')
    const res = await manager.post('/api/products', newProduct(DEMO_PRODUCTS[0]!.code))
    expect(res.status).toBe(409)
    expect(res.body.data.fields.code).toMatch(/already uses this code/)
    expect(await countRows('products')).toBe(before)
  })

  it('answers bad input with 400, a message per field, and no rows written', async () => {
    const products = await countRows('products')
    const measurements = await countRows('product_measurements')
    const res = await manager.post('/api/products', {
      code: 'has spaces', kind: 'kombucha', name: '', producer: 'P', servingTempC: 80, allergens: ['pollen'], bottleSizeMl: 12.5, costPerBottleMinor: 14.5,
      measurement: { abvPctVol: 140, residualSugarGL: -1, lab: '', method: 'M', measuredOn: '2026-02-30' }, // ABV above 100 % and sugar below 0 are impossible by definition
    })
    expect(res.status).toBe(400)
    const fields = res.body.data.fields
    expect(Object.keys(fields).sort()).toEqual([
      'allergens.0', 'bottleSizeMl', 'code', 'costPerBottleMinor', 'kind', 'measurement.abvPctVol', 'measurement.lab',
      'measurement.measuredOn', 'measurement.residualSugarGL', 'name', 'servingTempC',
    ])
    expect(fields['measurement.abvPctVol']).toMatch(/between 0 and 100/)
    expect(fields.costPerBottleMinor).toMatch(/minor units/)
    expect(await countRows('products')).toBe(products)
    expect(await countRows('product_measurements')).toBe(measurements)
    const notJson = await manager.request('POST', '/api/products', '{"code":', { 'content-type': 'application/json' })
    expect(notJson.status).toBe(400)
    expect(await countRows('products')).toBe(products)
  })

  it('keeps a product\'s colour: a trade word, or null for the kind\'s usual one; an unknown word is a 400 on its field', async () => {
    const made = await manager.post('/api/products', newProduct(`${tag}-K`, { colour: 'ruby' }))
    expect(made.status).toBe(201)
    expect(made.body.colour).toBe('ruby')
    const bad = await manager.patch(`/api/products/${made.body.id}`, { colour: 'purple' })
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.data.fields)).toEqual(['colour'])
    expect(bad.body.data.fields.colour).toMatch(/Choose a colour: water_white, .*ruby/)
    expect((await manager.get(`/api/products/${made.body.id}`)).body.colour).toBe('ruby')
    const cleared = await manager.patch(`/api/products/${made.body.id}`, { colour: null })
    expect(cleared.body.colour).toBeNull()
    const unset = await manager.post('/api/products', newProduct(`${tag}-L`))
    expect(unset.body.colour).toBeNull()
  })

  it('patches fields; a retired product stays retired when another field changes', async () => {
    const { body: p } = await manager.post('/api/products', newProduct(`${tag}-B`))
    const renamed = await manager.patch(`/api/products/${p.id}`, { name: 'Brinefield White, Late Bottling', servingTempC: 12, costPerBottleMinor: 1600 })
    expect(renamed.status).toBe(200)
    expect(renamed.body).toMatchObject({ name: 'Brinefield White, Late Bottling', servingTempC: 12, costPerBottleMinor: 1600, code: `${tag}-B` })
    expect(renamed.body.derived.filmActivityIndex).toBeCloseTo((await modelled(manager, 12.5, 12, 2)).filmActivityIndex, 9)
    expect((await manager.patch(`/api/products/${p.id}`, { status: 'retired' })).body.status).toBe('retired')
    const again = await manager.patch(`/api/products/${p.id}`, { producer: 'Another Test Cellar' })
    expect(again.body.status).toBe('retired')
    expect(again.body.producer).toBe('Another Test Cellar')
    const empty = await manager.patch(`/api/products/${p.id}`, {})
    expect(empty.status).toBe(400)
    expect(empty.body.message).toMatch(/at least one field/)
    const taken = await manager.patch(`/api/products/${p.id}`, { code: `${tag}-A` })
    expect(taken.status).toBe(409)
    const bad = await manager.patch(`/api/products/${p.id}`, { servingTempC: -5, kind: 'tea' })
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.data.fields).sort()).toEqual(['kind', 'servingTempC'])
    expect((await manager.get(`/api/products/${p.id}`)).body.servingTempC).toBe(12)
  })

  it('a new measurement adds a history row and becomes current; the old one stays', async () => {
    const { body: p } = await manager.post('/api/products', newProduct(`${tag}-C`))
    const first = p.current
    const before = await countRows('product_measurements', 'product_id = ?', [p.id])
    const res = await manager.post(`/api/products/${p.id}/measurements`, { abvPctVol: 13.1, residualSugarGL: 1.2, lab: 'Second Lab', method: 'Densitometry', measuredOn: '2026-11-20', notes: 'Re-test' })
    expect(res.status).toBe(201)
    expect(await countRows('product_measurements', 'product_id = ?', [p.id])).toBe(before + 1)
    expect(res.body.current).toMatchObject({ abvPctVol: 13.1, residualSugarGL: 1.2, lab: 'Second Lab', measuredOn: '2026-11-20', notes: 'Re-test' })
    expect(res.body.history.map((m: { id: number }) => m.id)).toEqual([res.body.current.id, first.id])
    expect(res.body.history[1]).toMatchObject({ abvPctVol: 12.5, residualSugarGL: 2, measuredOn: '2026-10-01' })
    expect(res.body.derived.ethanolGramsPerPour).toBeCloseTo(60 * 0.131 * 0.78924, 6) // 60 mL × 13.1 % × 0.78924 g/mL (OIML R 22)
    expect(res.body.derived.filmActivityIndex).toBeCloseTo((await modelled(manager, 13.1, 10, 1.2)).filmActivityIndex, 9)

    const older = await manager.post(`/api/products/${p.id}/measurements`, { abvPctVol: 12.0, residualSugarGL: 2.5, lab: 'Old Lab', method: 'M', measuredOn: '2026-06-01' })
    expect(older.body.current.id).toBe(res.body.current.id)
    expect(older.body.history.map((m: { measuredOn: string }) => m.measuredOn)).toEqual(['2026-11-20', '2026-10-01', '2026-06-01'])

    const rows = await countRows('product_measurements', 'product_id = ?', [p.id])
    const bad = await manager.post(`/api/products/${p.id}/measurements`, { abvPctVol: 'strong', residualSugarGL: 500, lab: 'L', method: 'M', measuredOn: '2999-01-01' })
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.data.fields).sort()).toEqual(['abvPctVol', 'measuredOn', 'residualSugarGL'])
    expect(bad.body.data.fields.measuredOn).toMatch(/future/)
    expect(await countRows('product_measurements', 'product_id = ?', [p.id])).toBe(rows)
  })

  it('staff read the list; only the manager sees costs; the list carries the derived figures', async () => {
    const list = await allProducts(manager)
    const demo = list.find((p: { code: string }) => p.code === DEMO_PRODUCTS[5]!.code)
    expect(demo.costPerBottleMinor).toBe(DEMO_PRODUCTS[5]!.costPerBottleMinor)
    expect(demo.derived.standardDrinksPerPour).toBeCloseTo(22 * 0.43 * 0.78924 / 14, 6) // 22 mL of 43 % spirit, 0.78924 g/mL (OIML R 22), 14 g per US drink (NIAAA)
    // A list row carries the figures the table shows, not the model's whole prediction (its curves are the product page's).
    expect(demo.history).toBeUndefined()
    expect(demo.derived.predictions).toBeUndefined()
    const one = (await manager.get(`/api/products/${demo.id}`)).body
    expect(demo.derived.filmActivityIndex).toBe(one.derived.filmActivityIndex)
    expect(demo.derived.tearsExpected).toBe(one.derived.predictions.tearsExpected)
    for (const reader of [host, marketing]) {
      const all = await allProducts(reader)
      expect(all.length).toBe(list.length)
      expect(all.every((p: { costPerBottleMinor: number | null }) => p.costPerBottleMinor === null)).toBe(true)
      const one = await reader.get(`/api/products/${demo.id}`)
      expect(one.status).toBe(200)
      expect(one.body.costPerBottleMinor).toBeNull()
      expect(one.body.history.length).toBeGreaterThan(0)
    }
  })

  it('the list is a page the server searches, filters and sorts: a catalogue of thousands costs what a page costs', async () => {
    const made: Record<string, number> = {}
    for (const [suffix, abvPctVol, status] of [['PA', 11.0, 'active'], ['PB', 13.5, 'active'], ['PC', 12.2, 'retired']] as const) {
      const res = await manager.post('/api/products', newProduct(`${tag}-PG${suffix}`, { status, measurement: { abvPctVol, residualSugarGL: 2, lab: 'Test Lab', method: 'Ebulliometry', measuredOn: '2026-10-01' } }))
      expect(res.status).toBe(201)
      made[suffix] = res.body.id
    }
    const page = async (query: string) => {
      const res = await manager.get(`/api/products?q=${encodeURIComponent(`${tag}-PG`)}&${query}`)
      expect(res.status).toBe(200)
      return res.body as { items: { id: number, code: string }[], total: number, page: number, pageSize: number, counts: { active: number, retired: number } }
    }
    const codes = (p: { items: { code: string }[] }) => p.items.map(i => i.code.slice(`${tag}-PG`.length))

    const byAbv = await page('sort=abv&dir=desc')
    expect(codes(byAbv)).toEqual(['PB', 'PC', 'PA'])
    expect(byAbv.total).toBe(3)
    const active = await page('status=active&sort=abv')
    expect(codes(active)).toEqual(['PA', 'PB'])
    expect(active.counts.retired).toBeGreaterThanOrEqual(1)
    expect(active.counts.active + active.counts.retired).toBe((await allProducts(manager)).length)

    const second = await page('sort=code&pageSize=2&page=2')
    expect(second).toMatchObject({ page: 2, pageSize: 2, total: 3 })
    expect(codes(second)).toEqual(['PC'])

    // Every word must match, in any field; LIKE's own wildcards are taken literally (as wildcards,
    // "PG_A" and "PG%A" would match the code "PGPA").
    expect((await page('status=all')).total).toBe(3)
    expect((await manager.get(`/api/products?q=${encodeURIComponent(`Brinefield ${tag}-PGPB`)}`)).body.items.map((i: { id: number }) => i.id)).toEqual([made.PB])
    expect((await manager.get(`/api/products?q=${encodeURIComponent(`${tag}-PGPA`)}`)).body.total).toBe(1)
    expect((await manager.get(`/api/products?q=${encodeURIComponent(`${tag}-PG_A`)}`)).body.total).toBe(0)
    expect((await manager.get(`/api/products?q=${encodeURIComponent(`${tag}-PG%A`)}`)).body.total).toBe(0)

    const named = (await manager.get(`/api/products?ids=${made.PA},${made.PC}`)).body
    expect(named.items.map((i: { id: number }) => i.id).sort()).toEqual([made.PA, made.PC].sort())

    // The ABV sort reads the current measurement: a newer one moves the product.
    expect((await manager.post(`/api/products/${made.PA}/measurements`, { abvPctVol: 14.2, residualSugarGL: 2, lab: 'Test Lab', method: 'Ebulliometry', measuredOn: '2026-11-02' })).status).toBe(201)
    expect(codes(await page('sort=abv&dir=desc'))).toEqual(['PA', 'PB', 'PC'])
  })

  it('a bad list query is a 400 naming each field', async () => {
    const res = await manager.get('/api/products?pageSize=0&sort=colour&ids=1,x&page=0&status=gone&dir=up&kind=mead')
    expect(res.status).toBe(400)
    for (const field of ['pageSize', 'sort', 'ids', 'page', 'status', 'dir', 'kind']) expect(res.body.data.fields[field], field).toBeTruthy()
    expect((await manager.get('/api/products?pageSize=101')).body.data.fields.pageSize).toMatch(/at most 100/)
    expect((await manager.get(`/api/products?q=${'w'.repeat(81)}`)).body.data.fields.q).toMatch(/80/)
  })

  it('anonymous visitors get 401, guests 403, host and marketing 403 on every write', async () => {
    const id = (await allProducts(manager))[0].id
    const reads: [string, string][] = [['GET', '/api/products'], ['GET', `/api/products/${id}`]]
    const writes: [string, string, unknown][] = [
      ['POST', '/api/products', newProduct(`${tag}-X`)],
      ['PATCH', `/api/products/${id}`, { name: 'Not allowed' }],
      ['POST', `/api/products/${id}/measurements`, { abvPctVol: 12, residualSugarGL: 1, lab: 'L', method: 'M', measuredOn: '2026-11-01' }],
    ]
    const anonymous = new Client()
    for (const [method, path] of [...reads, ...writes]) {
      expect((await anonymous.request(method, path, method === 'GET' ? undefined : {})).status, `${method} ${path}`).toBe(401)
      expect((await guest.request(method, path, method === 'GET' ? undefined : {})).status, `${method} ${path}`).toBe(403)
    }
    const products = await countRows('products')
    const measurements = await countRows('product_measurements')
    for (const [method, path, body] of writes) {
      for (const reader of [host, marketing]) {
        const res = await reader.request(method, path, body)
        expect(res.status, `${method} ${path}`).toBe(403)
        expect(res.body.message).toMatch(/role does not allow/)
      }
    }
    expect(await countRows('products')).toBe(products)
    expect(await countRows('product_measurements')).toBe(measurements)
  })

  it('an unknown id answers 404 and a non-numeric id 400', async () => {
    expect((await manager.get('/api/products/999999')).status).toBe(404)
    expect((await manager.patch('/api/products/999999', { name: 'Nobody' })).status).toBe(404)
    expect((await manager.post('/api/products/999999/measurements', { abvPctVol: 12, residualSugarGL: 1, lab: 'L', method: 'M', measuredOn: '2026-11-01' })).status).toBe(404)
    const abc = await manager.get('/api/products/abc')
    expect(abc.status).toBe(400)
    expect(abc.body.data.fields.id).toMatch(/number/)
    expect((await manager.patch('/api/products/1.5', { name: 'X' })).status).toBe(400)
    expect((await manager.post('/api/products/-3/measurements', {})).status).toBe(400)
  })
})
