import { beforeAll, describe, expect, it } from 'vitest'
import { allProducts, Client } from '../support/http'
import { countRows } from '../support/db'
import { signedIn } from '../support/people'

interface Product { id: number, code: string, kind: string, current: { abvPctVol: number } }
interface Glass { id: number, name: string }

let manager: Client
let products: Map<string, Product>
let glasses: Glass[]
const pour = (code: string, volumeMl: number, servingTempC = 12) => ({ productId: products.get(code)!.id, volumeMl, glassId: glasses[0]!.id, servingTempC })

beforeAll(async () => {
  manager = await signedIn('manager')
  products = new Map(((await allProducts(manager)) as Product[]).map(p => [p.code, p]))
  glasses = (await manager.get('/api/glasses')).body
})

function nextSaturday(weeksAhead = 1): string {
  const d = new Date()
  d.setUTCDate(d.getUTCDate() + ((6 - d.getUTCDay() + 7) % 7 || 7) + 7 * (weeksAhead - 1))
  return d.toISOString().slice(0, 10)
}

describe('flights', () => {
  it('creates a draft with computed pours and totals', async () => {
    const res = await manager.post('/api/flights', { name: 'Test flight A', summary: 'Two pours', pours: [pour('SV-ALB-24', 60), pour('SV-GIN-07', 20, 18)] })
    expect(res.status).toBe(201)
    const f = res.body
    expect(f.status).toBe('draft')
    expect(f.version).toBe(1)
    expect(f.pours.map((p: { position: number }) => p.position)).toEqual([1, 2])
    // 60 mL × 12.5 % × 0.78924 g/mL (OIML R 22 ethanol density at 20 °C) = 5.919 g
    expect(f.pours[0].ethanolGrams).toBeCloseTo(60 * 0.125 * 0.78924, 3)
    expect(f.pours[0].standardDrinks).toBeCloseTo(60 * 0.125 * 0.78924 / 14, 3) // NIAAA US standard drink: 14 g
    expect(f.totals.ethanolGrams).toBeCloseTo(f.pours[0].ethanolGrams + f.pours[1].ethanolGrams, 6)
    expect(f.pours[0].filmActivityIndex).toBeGreaterThan(f.pours[1].filmActivityIndex)
    expect(f.locked).toBe(false)
  })

  it.each([
    ['one pour', { pours: 1 }, 'pours', /2 to 8 pours/],
    ['nine pours', { pours: 9 }, 'pours', /2 to 8 pours/],
    ['a pour of 0 mL', { volume: 0 }, 'pours.0.volumeMl', /between 5 and 250 mL/],
    ['no name', { name: '' }, 'name', /Name the flight/],
  ])('refuses %s with a field message and writes nothing', async (_l, v: { pours?: number, volume?: number, name?: string }, field, message) => {
    const before = await countRows('flights')
    const n = v.pours ?? 2
    const res = await manager.post('/api/flights', { name: v.name ?? 'Bad', pours: Array.from({ length: n }, () => pour('SV-ALB-24', v.volume ?? 60)) })
    expect(res.status).toBe(400)
    expect(res.body.data.fields[field]).toMatch(message)
    expect(await countRows('flights')).toBe(before)
  })

  it('refuses an unknown product or glass on the pour that names it', async () => {
    const before = await countRows('flight_pours')
    const res = await manager.post('/api/flights', { name: 'Ghost', pours: [pour('SV-ALB-24', 60), { ...pour('SV-GIN-07', 20), productId: 999999, glassId: 888888 }] })
    expect(res.status).toBe(400)
    expect(res.body.data.fields['pours.1.productId']).toMatch(/No such product/)
    expect(res.body.data.fields['pours.1.glassId']).toMatch(/No such glass/)
    expect(await countRows('flight_pours')).toBe(before)
  })

  it('previews unsaved pours and flags a flight over the per-guest limit', async () => {
    const venue = (await manager.get('/api/venue')).body
    const res = await manager.post('/api/flights/preview', { pours: [pour('SV-GIN-07', 120, 18), pour('SV-FOR-19', 100)] })
    expect(res.status).toBe(200)
    expect(res.body.totals.ethanolGrams).toBeGreaterThan(venue.guestEthanolLimitGrams)
    expect(res.body.totals.overLimit).toBe(true)
    const small = await manager.post('/api/flights/preview', { pours: [pour('SV-ALB-24', 30)] })
    expect(small.body.totals.overLimit).toBe(false)
  })

  it('publishes, schedules, then locks the pours; a new version replaces it for new sessions', async () => {
    const created = (await manager.post('/api/flights', { name: 'Lifecycle flight', pours: [pour('SV-CID-21', 90), pour('SV-CF-23', 60)] })).body
    // Reorder and edit freely while a draft.
    const edited = await manager.patch(`/api/flights/${created.id}`, { pours: [pour('SV-CF-23', 60), pour('SV-CID-21', 90)] })
    expect(edited.body.pours[0].product.code).toBe('SV-CF-23')
    const published = await manager.post(`/api/flights/${created.id}/publish`)
    expect(published.status).toBe(200)
    expect(published.body.status).toBe('published')
    const scheduled = await manager.post('/api/sessions', { flightId: created.id, startDate: nextSaturday(2), startTime: '15:00', durationMinutes: 60, seats: 6, priceMinor: 2500 })
    expect(scheduled.status).toBe(201)

    const blocked = await manager.patch(`/api/flights/${created.id}`, { pours: [pour('SV-CID-21', 90), pour('SV-GIN-07', 20)] })
    expect(blocked.status).toBe(409)
    expect(blocked.body.message).toMatch(/new version/)
    expect((await manager.get(`/api/flights/${created.id}`)).body.pours.map((p: { product: { code: string } }) => p.product.code)).toEqual(['SV-CF-23', 'SV-CID-21'])
    expect((await manager.patch(`/api/flights/${created.id}`, { name: 'Lifecycle flight (renamed)' })).status).toBe(200)
    expect((await manager.post(`/api/flights/${created.id}/unpublish`)).status).toBe(409)

    const v2 = await manager.post(`/api/flights/${created.id}/revise`)
    expect(v2.status).toBe(201)
    expect(v2.body).toMatchObject({ version: 2, status: 'draft', lineageId: created.id })
    expect((await manager.patch(`/api/flights/${v2.body.id}`, { pours: [pour('SV-CID-21', 90), pour('SV-GIN-07', 20)] })).status).toBe(200)
    expect((await manager.post(`/api/flights/${v2.body.id}/publish`)).body.status).toBe('published')
    const old = (await manager.get(`/api/flights/${created.id}`)).body
    expect(old.status).toBe('retired')
    expect(old.sessionCount).toBe(1)
    const again = await manager.post('/api/sessions', { flightId: created.id, startDate: nextSaturday(3), startTime: '15:00', durationMinutes: 60, seats: 6, priceMinor: 2500 })
    expect(again.status).toBe(400)
    expect(again.body.data.fields.flightId).toMatch(/published flight/)
  })

  it('guests and visitors see published flights only; hosts read but cannot write', async () => {
    const draft = (await manager.post('/api/flights', { name: 'Secret draft', pours: [pour('SV-CID-21', 90), pour('SV-CF-23', 60)] })).body
    const visitor = new Client()
    const guest = await signedIn('guest')
    const host = await signedIn('host')
    for (const c of [visitor, guest]) {
      expect((await c.get(`/api/flights/${draft.id}`)).status).toBe(404)
      const list = (await c.get('/api/flights')).body as { status: string, name: string }[]
      expect(list.every(f => f.status === 'published')).toBe(true)
      expect(list.some(f => f.name === 'Shoreline Flight')).toBe(true)
    }
    expect((await host.get(`/api/flights/${draft.id}`)).status).toBe(200)
    expect((await host.patch(`/api/flights/${draft.id}`, { name: 'x' })).status).toBe(403)
    expect((await guest.post('/api/flights', { name: 'x', pours: [] })).status).toBe(403)
    expect((await visitor.post('/api/flights/preview', { pours: [] })).status).toBe(401)
    expect((await new Client().get('/api/flights/abc')).status).toBe(400)
  })
})

describe('glasses', () => {
  it('adds, renames and validates glass shapes', async () => {
    const name = `Test glass ${Date.now()}`
    const created = await manager.post('/api/glasses', { name, bowlDiameterMm: 70, wallAngleDeg: 80, fillHeightMm: 30 })
    expect(created.status).toBe(201)
    expect((await manager.post('/api/glasses', { name, bowlDiameterMm: 70, wallAngleDeg: 80, fillHeightMm: 30 })).status).toBe(409)
    const bad = await manager.patch(`/api/glasses/${created.body.id}`, { name, bowlDiameterMm: 70, wallAngleDeg: 5, fillHeightMm: 30 })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields.wallAngleDeg).toMatch(/between 15° and 90°/)
    const ok = await manager.patch(`/api/glasses/${created.body.id}`, { name: `${name} (wide)`, bowlDiameterMm: 95, wallAngleDeg: 75, fillHeightMm: 30 })
    expect(ok.body.bowlDiameterMm).toBe(95)
    expect((await (await signedIn('host')).post('/api/glasses', { name: 'h', bowlDiameterMm: 70, wallAngleDeg: 80, fillHeightMm: 30 })).status).toBe(403)
  })
})
