import { describe, it, expect } from 'vitest'
import { GRAVITY_M_S2 } from '../../../shared/science/constants'
import { computeFilm } from '../../../shared/science/glassModel'
import { QUALITY_DISCLAIMER, describePour, predictTears } from '../../../shared/science/predictions'

const wine = { abvPctVol: 12.5, tempC: 18, sugarGL: 3 }

describe('scaling-law predictions', () => {
  it('are self-consistent: zero lubrication flux at h*, and climb time = evaporation time', () => {
    const r = computeFilm(wine)
    const p = r.predictions
    const sinB = Math.sin((70 * Math.PI) / 180)
    const tau = p.marangoniStress_Pa
    const mu = r.viscosity_mPa_s * 1e-3
    const h = p.filmThickness_um * 1e-6
    const q = (tau * h * h) / (2 * mu) - (r.density_kg_m3 * GRAVITY_M_S2 * sinB * h ** 3) / (3 * mu)
    expect(Math.abs(q)).toBeLessThan(1e-15) // thin-film lubrication balance (Fournier & Cazabat 1992; Hosoi & Bush 2001)
    const climbTime = p.clearBandHeight_mm / p.climbSpeed_mm_s
    const evapTime = (0.05 * r.density_kg_m3 * p.climbingFilmThickness_um * 1e-6) / r.totalFlux_kg_m2_s
    expect(climbTime / evapTime).toBeCloseTo(1, 9)
  })

  it('give a table wine plausible magnitudes', () => {
    const p = computeFilm(wine).predictions
    expect(p.tearsExpected).toBe(true)
    // orders of magnitude reported for tears of wine (films of tens of µm, bands of ~1 cm, tears of ~mm
    // sliding at mm/s, forming within tens of seconds): common practice, no single source
    expect(p.filmThickness_um).toBeGreaterThan(10)
    expect(p.filmThickness_um).toBeLessThan(200)
    expect(p.clearBandHeight_mm).toBeGreaterThan(3)
    expect(p.clearBandHeight_mm).toBeLessThan(30)
    expect(p.tearFallSpeed_mm_s ?? 0).toBeGreaterThan(0.5)
    expect(p.tearFallSpeed_mm_s ?? 0).toBeLessThan(50)
    expect(p.tearOnset_s ?? 0).toBeGreaterThan(1)
    expect(p.tearOnset_s ?? 0).toBeLessThan(120)
    expect(p.capillaryLength_mm).toBeCloseTo(Math.sqrt((computeFilm(wine).surfaceTensionBulk_mN_m * 1e-3) / (computeFilm(wine).density_kg_m3 * GRAVITY_M_S2)) * 1e3, 10)
  })

  it('expect no climbing film at 0 % vol and no tears at or beyond the azeotrope', () => {
    const water = computeFilm({ abvPctVol: 0, tempC: 20, sugarGL: 0 }).predictions
    expect(water.tearsExpected).toBe(false)
    expect(water.clearBandHeight_mm).toBe(0)
    expect(water.tearFallSpeed_mm_s).toBeNull()
    for (const abv of [97, 99, 100]) {
      const p = computeFilm({ abvPctVol: abv, tempC: 20, sugarGL: 0 }).predictions
      expect(p.tearsExpected).toBe(false)
      expect(p.tearOnset_s).toBeNull()
    }
  })

  it('slow the tears with sugar at the same ABV (sugar slows tears, it does not make them)', () => {
    const dry = computeFilm({ abvPctVol: 19, tempC: 20, sugarGL: 0 })
    const sweet = computeFilm({ abvPctVol: 19, tempC: 20, sugarGL: 100 })
    expect(sweet.predictions.tearFallSpeed_mm_s ?? Infinity).toBeLessThan(dry.predictions.tearFallSpeed_mm_s ?? 0)
    expect(sweet.predictions.tearFallSpeed_mm_s ?? Infinity).toBeLessThan(sweet.tearFallSpeedUnsweetened_mm_s ?? 0)
    // sugar does not create the effect: at 0 % vol a syrup shows no climbing film
    expect(computeFilm({ abvPctVol: 0, tempC: 20, sugarGL: 300 }).predictions.tearsExpected).toBe(false)
  })

  it('sweet fortified wine vs dry spirit: the order follows viscosity and Marangoni stress, not sugar alone', () => {
    const port = computeFilm({ abvPctVol: 19, tempC: 20, sugarGL: 100 })
    const spirit = computeFilm({ abvPctVol: 40, tempC: 20, sugarGL: 0 })
    // Bingham & Jackson 1917 (33 % mass ethanol ≈ 2.8 mPa·s) with the sucrose table (×1.3 at 100 g/L, from
    // memory): the 40 % spirit is the more viscous liquid, and its film has the weaker Marangoni pull,
    // so in this model its tears are the slower ones (see docs/science.md, "Where physics and practice differ").
    expect(spirit.viscosity_mPa_s).toBeGreaterThan(port.viscosity_mPa_s)
    expect(spirit.deltaSigma_mN_m).toBeLessThan(port.deltaSigma_mN_m)
    expect(spirit.predictions.tearFallSpeed_mm_s ?? Infinity).toBeLessThan(port.predictions.tearFallSpeed_mm_s ?? 0)
    // a liqueur-sweet fortified wine (19 %, 300 g/L) is viscous enough to fall slower than the dry spirit
    const sweeter = computeFilm({ abvPctVol: 19, tempC: 20, sugarGL: 300 })
    expect(sweeter.predictions.tearFallSpeed_mm_s ?? Infinity).toBeLessThan(spirit.predictions.tearFallSpeed_mm_s ?? 0)
  })

  it('thin the film on a vertical wall relative to a leaning one (gravity component sin β)', () => {
    const vertical = computeFilm({ ...wine, wallAngleDeg: 90 }).predictions
    const leaning = computeFilm({ ...wine, wallAngleDeg: 60 }).predictions
    expect(vertical.filmThickness_um).toBeLessThan(leaning.filmThickness_um)
  })

  it('reject impossible inputs with RangeError', () => {
    const base = { deltaSigma_mN_m: 3, surfaceTension_mN_m: 48, density_kg_m3: 980, viscosity_mPa_s: 1.5, evaporationFlux_kg_m2_s: 2e-4 }
    expect(() => predictTears({ ...base, wallAngleDeg: 5 })).toThrow(RangeError)
    expect(() => predictTears({ ...base, viscosity_mPa_s: Number.NaN })).toThrow(RangeError)
    expect(() => predictTears({ ...base, deltaSigma_mN_m: Number.POSITIVE_INFINITY })).toThrow(RangeError)
  })
})

describe('describePour', () => {
  it('states the pour’s own numbers and the reason', () => {
    const r = computeFilm(wine)
    const text = describePour(r).join(' ')
    const p = r.predictions
    expect(text).toContain(`${Math.round(p.clearBandHeight_mm)} mm`)
    expect(text).toContain('µm')
    expect(text).toContain('mm/s')
    expect(text).toContain('Marangoni')
    expect(text).toContain('evaporates')
    expect(text).toContain(r.surfaceTensionBulk_mN_m.toFixed(1))
    expect(text).not.toMatch(/NaN|undefined|Infinity/)
  })

  it('always ends with the quality statement', () => {
    for (const abv of [0, 5, 12, 19, 40, 60, 97, 100]) {
      for (const sugarGL of [0, 120]) {
        const lines = describePour(computeFilm({ abvPctVol: abv, tempC: 18, sugarGL }))
        expect(lines[lines.length - 1]).toBe(QUALITY_DISCLAIMER)
        expect(QUALITY_DISCLAIMER).toMatch(/quality/)
        expect(QUALITY_DISCLAIMER).toMatch(/sugar only slows them/)
        expect(lines.join(' ')).not.toMatch(/NaN|undefined|Infinity/)
      }
    }
  })

  it('says there is no climbing film at 0 % vol', () => {
    expect(describePour(computeFilm({ abvPctVol: 0, tempC: 20, sugarGL: 0 })).join(' ')).toMatch(/no climbing film/)
  })

  it('says there are no tears from this effect at the azeotrope and beyond', () => {
    for (const abv of [97, 100]) {
      expect(describePour(computeFilm({ abvPctVol: abv, tempC: 20, sugarGL: 0 })).join(' ')).toMatch(/no tears from this effect/)
    }
  })

  it('explains the slower tears of a sweet wine by viscosity', () => {
    const text = describePour(computeFilm({ abvPctVol: 19, tempC: 18, sugarGL: 100 })).join(' ')
    expect(text).toMatch(/100 g\/L of sugar/)
    expect(text).toMatch(/viscous/)
    expect(text).toMatch(/slower/)
  })

  it('can speak Fahrenheit', () => {
    expect(describePour(computeFilm(wine), { temperatureUnit: 'F' }).join(' ')).toContain('64 °F')
  })
})
