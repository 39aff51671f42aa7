import { describe, expect, it } from 'vitest'
import { Client } from '../support/http'
import { signedIn } from '../support/people'
import { GLASS_PAGE_PRODUCTS_MAX } from '../../shared/products'

const anon = new Client()

describe('GET /api/science/film', () => {
  it('returns every intermediate quantity with its unit in its name', async () => {
    const res = await anon.get('/api/science/film?abv=12&tempC=20&sugarGL=0')
    expect(res.status).toBe(200)
    const f = res.body
    expect(f.solventMassFraction).toBeCloseTo(0.09641, 4) // OIML R 22 formula at 20 °C: 12 % vol ↔ 9.641 % mass (evaluated here; docs/science.md §1)
    expect(f.density_kg_m3).toBeCloseTo(982.35, 1) // OIML R 22 formula at 20 °C (evaluated here; docs/science.md §1)
    expect(f.surfaceTensionBulk_mN_m).toBeGreaterThan(45)
    expect(f.surfaceTensionBulk_mN_m).toBeLessThan(54) // 12 % vol model solution ≈ 49.5 mN/m, a secondary source held to memory grade (docs/science.md §2), ± a few
    expect(f.surfaceTensionFilm_mN_m).toBeGreaterThan(f.surfaceTensionBulk_mN_m)
    expect(f.filmActivityIndex).toBeGreaterThan(0)
    expect(f.filmActivityIndex).toBeLessThanOrEqual(10)
    expect(f.predictions.tearsExpected).toBe(true)
    expect(f.description.at(-1)).toMatch(/nothing about quality/)
    for (const [k, v] of Object.entries(f)) if (typeof v === 'number') expect(Number.isFinite(v), k).toBe(true)
  })

  it('water: pure water surface tension and no film activity', async () => {
    const { body } = await anon.get('/api/science/film?abv=0&tempC=20')
    expect(body.surfaceTensionBulk_mN_m).toBeCloseTo(72.74, 1) // IAPWS R1-76(2014), 20 °C
    expect(body.filmActivityIndex).toBe(0)
    expect(body.predictions.tearsExpected).toBe(false)
  })

  it.each([
    ['abv=-1&tempC=20', 'abv', /ABV \(abv\) must be a number from 0 to 100/],
    ['abv=101&tempC=20', 'abv', /0 to 100/],
    ['abv=abc&tempC=20', 'abv', /ABV \(abv\) must be a plain decimal/],
    ['abv=12&tempC=80', 'tempC', /Temperature \(tempC\) must be a number from 0 to 40/],
    ['abv=12', 'tempC', /Temperature \(tempC\) is required/],
    ['tempC=20', 'abv', /ABV \(abv\) is required/],
    ['abv=12&tempC=20&sugarGL=-5', 'sugarGL', /Residual sugar \(sugarGL\) must be a number from 0 to 400/],
    ['abv=12&tempC=20&wallAngleDeg=5', 'wallAngleDeg', /Wall angle \(wallAngleDeg\)/],
    ['abv=NaN&tempC=20', 'abv', /ABV \(abv\) must be a plain decimal/],
    ['abv=Infinity&tempC=20', 'abv', /ABV \(abv\) must be a plain decimal/],
    // Number() reads every one of these as a number; none is a plain decimal.
    ['abv=0x10&tempC=20', 'abv', /ABV \(abv\) must be a plain decimal/],
    ['abv=1e1&tempC=20', 'abv', /ABV \(abv\) must be a plain decimal/],
    ['abv=&tempC=20', 'abv', /ABV \(abv\) is blank/],
    ['abv=%2012&tempC=20', 'abv', /ABV \(abv\) must be a plain decimal/], // " 12"
    ['abv=1%202&tempC=20', 'abv', /ABV \(abv\) must be a plain decimal/], // "1 2"
    ['abv=12abc&tempC=20', 'abv', /ABV \(abv\) must be a plain decimal/],
    ['abv=12.&tempC=20', 'abv', /ABV \(abv\) must be a plain decimal/],
    ['abv=-Infinity&tempC=20', 'abv', /ABV \(abv\) must be a plain decimal/],
    ['abv=12&tempC=0b101', 'tempC', /Temperature \(tempC\) must be a plain decimal/],
    ['abv=12&tempC=20&sugarGL=', 'sugarGL', /Residual sugar \(sugarGL\) is blank/],
    ['abv=12&abv=13&tempC=20', 'abv', /Give abv once/],
    ['abv=12&tempC=20&rh=101', 'rh', /Relative humidity \(rh\) must be a number from 0 to 100 %/],
    ['abv=12&tempC=20&rh=5e1', 'rh', /Relative humidity \(rh\) must be a plain decimal/],
    ['abv=12&tempC=20&rh=', 'rh', /Relative humidity \(rh\) is blank/],
    ['abv=12&tempC=20&airTempC=41', 'airTempC', /Air temperature \(airTempC\) must be a number from 0 to 40 °C/],
    ['abv=12&tempC=20&airTempC=Infinity', 'airTempC', /Air temperature \(airTempC\) must be a plain decimal/],
    ['abv=12&tempC=20&airTempC=20&airTempC=21', 'airTempC', /Give airTempC once/],
    ['abv=12&tempC=20&kind=wine', 'kind', /Kind \(kind\) must be one of still, sparkling/],
    ['abv=12&tempC=20&kind=', 'kind', /Kind \(kind\) must be one of/],
    ['abv=12&tempC=20&humidity=50', 'humidity', /humidity is not a parameter of this route; it reads abv, tempC, sugarGL, wallAngleDeg, rh, airTempC, kind/],
    ['abv=12&tempC=20&abv[]=3', 'abv[]', /abv\[\] is not a parameter of this route/],
    ['abv=12&tempC=20&points=5', 'points', /points is not a parameter of this route/],
  ])('answers 400 to %s, naming the field', async (query, field, message) => {
    const res = await anon.get(`/api/science/film?${query}`)
    expect(res.status).toBe(400)
    expect(res.body.data.fields[field]).toMatch(message)
  })

  it('names every bad and every unknown key in one answer', async () => {
    const res = await anon.get('/api/science/film?abv=0x10&tempC=20&airTemp=18&rh=200')
    expect(res.status).toBe(400)
    expect(Object.keys(res.body.data.fields).sort()).toEqual(['abv', 'airTemp', 'rh'])
    expect(res.body.message).toMatch(/airTemp is not a parameter/)
  })

  it('takes the room\'s air and the kind of drink: inputs.room and inputs.kind are what was sent', async () => {
    const res = await anon.get('/api/science/film?abv=12&tempC=14&rh=35&airTempC=18.5&kind=sparkling')
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body.inputs.room).toEqual({ relativeHumidityPct: 35, airTempC: 18.5 })
    expect(res.body.inputs.kind).toBe('sparkling')
    const other = await anon.get('/api/science/film?abv=12&tempC=14&rh=80&airTempC=30&kind=low_alcohol')
    expect(other.body.inputs.room).toEqual({ relativeHumidityPct: 80, airTempC: 30 })
    expect(other.body.inputs.kind).toBe('low_alcohol')
  })

  it('without rh and airTempC assumes the model\'s default room (50 % RH at 21 °C)', async () => {
    const { body } = await anon.get('/api/science/film?abv=12&tempC=14')
    expect(body.inputs.room).toEqual({ relativeHumidityPct: 50, airTempC: 21 }) // DEFAULT_ROOM_AIR (shared/science/glassModel.ts)
    expect(body.inputs.kind).toBe('still')
  })
})

describe('GET /api/science/curve', () => {
  it('gives 201 points over 0–100 % vol, 0 at water, peaking at table-wine strengths', async () => {
    const res = await anon.get('/api/science/curve?tempC=20&sugarGL=0')
    expect(res.status).toBe(200)
    expect(res.body).toHaveLength(201)
    expect(res.body[0].abvPctVol).toBe(0)
    expect(res.body[0].filmActivityIndex).toBe(0)
    expect(res.body[200].abvPctVol).toBe(100)
    // Near the 1 atm azeotrope (≈ 95.6 % mass ≈ 97 % vol, Perry's Chemical Engineers' Handbook — from memory)
    // evaporation barely changes the film: the index is well below its table-wine peak (docs/science.md §7)
    const nearAzeotrope = res.body.find((p: { abvPctVol: number }) => p.abvPctVol >= 96.5)
    expect(nearAzeotrope.filmActivityIndex).toBeLessThan(0.5 * Math.max(...res.body.map((p: { filmActivityIndex: number }) => p.filmActivityIndex)))
    // The trade's observation: stronger table wines show tears more readily (common practice, no source).
    const at = (abv: number) => res.body.find((p: { abvPctVol: number }) => p.abvPctVol === abv).filmActivityIndex
    expect(at(3)).toBeLessThan(at(6))
    expect(at(6)).toBeLessThan(at(9))
    expect(at(9)).toBeLessThan(at(12))
  })

  it('answers 400 without a temperature', async () => {
    const res = await anon.get('/api/science/curve')
    expect(res.status).toBe(400)
    expect(res.body.data.fields.tempC).toMatch(/required/)
  })

  it('follows the room: a humid room lifts a strong spirit\'s film, barely a wine\'s', async () => {
    const dry = (await anon.get('/api/science/curve?tempC=20&points=21&rh=20&airTempC=20')).body
    const humid = (await anon.get('/api/science/curve?tempC=20&points=21&rh=90&airTempC=20')).body
    const at = (c: { abvPctVol: number, filmActivityIndex: number }[], abv: number) => c.find(p => p.abvPctVol === abv)!.filmActivityIndex
    expect(at(humid, 95)).toBeGreaterThan(1.4 * at(dry, 95)) // the film takes water up from humid air (docs/science.md §4)
    expect(Math.abs(at(humid, 10) - at(dry, 10))).toBeLessThan(0.25 * at(dry, 10))
  })

  it.each([2, 3, 57, 401])('honours points=%i: that many points, from ABV 0 to 100', async (points) => {
    const res = await anon.get(`/api/science/curve?tempC=20&points=${points}`)
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body).toHaveLength(points)
    expect(res.body[0].abvPctVol).toBe(0)
    expect(res.body.at(-1).abvPctVol).toBe(100)
  })

  it.each([
    ['points=1', 'points', /Points \(points\) must be a whole number from 2 to 401/],
    ['points=402', 'points', /Points \(points\) must be a whole number from 2 to 401/],
    ['points=2001', 'points', /from 2 to 401/],
    ['points=2.5', 'points', /Points \(points\) must be a whole number/],
    ['points=', 'points', /Points \(points\) is blank/],
    ['points=1e2', 'points', /Points \(points\) must be a plain decimal/],
    ['points=50&points=60', 'points', /Give points once/],
    ['tempC=0x14', 'tempC', /Temperature \(tempC\) must be a plain decimal/],
    ['humidity=50', 'humidity', /humidity is not a parameter of this route; it reads tempC, sugarGL, rh, airTempC, points/],
    ['rh=101', 'rh', /Relative humidity \(rh\) must be a number from 0 to 100 %/],
    ['kind=beer', 'kind', /kind is not a parameter of this route/],
  ])('answers 400 to %s, naming the field', async (query, field, message) => {
    const res = await anon.get(`/api/science/curve?${query.startsWith('tempC') ? query : `tempC=20&${query}`}`)
    expect(res.status).toBe(400)
    expect(res.body.data.fields[field]).toMatch(message)
  })
})

describe('GET /api/science/products', () => {
  it('lists the venue\'s active products with their index and a description, to anyone', async () => {
    const res = await anon.get('/api/science/products')
    expect(res.status).toBe(200)
    expect(res.body.length).toBeGreaterThanOrEqual(6)
    const gin = res.body.find((p: { name: string }) => p.name === 'Marsh Samphire Gin')
    expect(gin.abvPctVol).toBe(43)
    expect(gin.costPerBottleMinor).toBeUndefined()
    expect(gin.description.join(' ')).toMatch(/quality/)
  })

  it('explains the bottles poured in published flights, not the rest of the catalogue', async () => {
    const manager = await signedIn('manager')
    const code = `GLASS-${Date.now().toString(36)}`
    const made = await manager.post('/api/products', {
      code, kind: 'spirit', name: `Cellar-only Rum ${code}`, producer: 'Test Cellar', servingTempC: 18, allergens: [], bottleSizeMl: 700, costPerBottleMinor: 2000,
      measurement: { abvPctVol: 40, residualSugarGL: 0, lab: 'Test Lab', method: 'Densitometry', measuredOn: '2026-10-01' },
    })
    expect(made.status, JSON.stringify(made.body)).toBe(201)
    const listed = (await anon.get('/api/science/products')).body as { id: number, name: string }[]
    expect(listed.map(p => p.name)).not.toContain(`Cellar-only Rum ${code}`)
    expect(listed.length).toBeLessThanOrEqual(GLASS_PAGE_PRODUCTS_MAX)
    // Every one listed is poured in a published flight.
    const published = (await anon.get('/api/flights/published')).body as { id: number }[]
    const poured = new Set<string>()
    for (const f of published) for (const p of (await anon.get(`/api/flights/${f.id}`)).body.pours as { product: { name: string } }[]) poured.add(p.product.name)
    for (const p of listed) expect(poured.has(p.name), p.name).toBe(true)
  })

  it.each([
    ['rh=50', 'rh'],
    ['abv=12', 'abv'],
  ])('reads no query: %s is refused, naming the key', async (query, key) => {
    const res = await anon.get(`/api/science/products?${query}`)
    expect(res.status).toBe(400)
    expect(res.body.data.fields[key]).toMatch(new RegExp(`${key} is not a parameter of this route; it reads none`))
  })
})
