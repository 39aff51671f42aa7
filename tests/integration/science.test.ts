import { describe, expect, it } from 'vitest'
import { Client } from '../support/http'

const anon = new Client()

describe('GET /api/science/film', () => {
  it('returns every intermediate quantity with its unit in its name', async () => {
    const res = await anon.get('/api/science/film?abv=12&tempC=20&sugarGL=0')
    expect(res.status).toBe(200)
    const f = res.body
    expect(f.solventMassFraction).toBeCloseTo(0.09641, 4) // OIML R 22 formula at 20 °C: 12 % vol ↔ 9.641 % mass (evaluated here; docs/science.md §1)
    expect(f.density_kg_m3).toBeCloseTo(982.35, 1) // OIML R 22 formula at 20 °C (OIML R 22 (1975) formula evaluated here; docs/science.md §1)
    expect(f.surfaceTensionBulk_mN_m).toBeGreaterThan(45)
    expect(f.surfaceTensionBulk_mN_m).toBeLessThan(54) // model hydroalcoholic solution, 12 % vol ≈ 49.5 mN/m (secondary source in science-sources §2), ± a few
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
    ['abv=-1&tempC=20', 'abv', /ABV must be a number from 0 to 100/],
    ['abv=101&tempC=20', 'abv', /0 to 100/],
    ['abv=abc&tempC=20', 'abv', /ABV must be a number/],
    ['abv=12&tempC=80', 'tempC', /Temperature must be a number from 0 to 40/],
    ['abv=12', 'tempC', /Temperature is required/],
    ['tempC=20', 'abv', /ABV is required/],
    ['abv=12&tempC=20&sugarGL=-5', 'sugarGL', /Residual sugar must be a number from 0 to 400/],
    ['abv=12&tempC=20&wallAngleDeg=5', 'wallAngleDeg', /Wall angle/],
    ['abv=NaN&tempC=20', 'abv', /ABV must be a number/],
    ['abv=Infinity&tempC=20', 'abv', /ABV must be a number/],
  ])('answers 400 to %s', async (query, field, message) => {
    const res = await anon.get(`/api/science/film?${query}`)
    expect(res.status).toBe(400)
    expect(res.body.data.fields[field]).toMatch(message)
  })
})

describe('GET /api/science/curve', () => {
  it('gives 201 points over 0–100 % vol, 0 at water, about 0 at the azeotrope', async () => {
    const res = await anon.get('/api/science/curve?tempC=20&sugarGL=0')
    expect(res.status).toBe(200)
    expect(res.body).toHaveLength(201)
    expect(res.body[0].abvPctVol).toBe(0)
    expect(res.body[0].filmActivityIndex).toBe(0)
    expect(res.body[200].abvPctVol).toBe(100)
    const nearAzeotrope = res.body.find((p: { abvPctVol: number }) => p.abvPctVol >= 96.5) // azeotrope ≈ 95.6 % mass ≈ 97 % vol, Perry's Handbook (science-sources §3)
    expect(nearAzeotrope.filmActivityIndex).toBeLessThan(0.3)
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
})
