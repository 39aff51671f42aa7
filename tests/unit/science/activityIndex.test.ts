import { describe, it, expect } from 'vitest'
import fc from 'fast-check'
import { INDEX_REFERENCE, indexFromClimbFlux } from '../../../shared/science/activityIndex'
import { centralClimb, computeFilm, filmActivityIndex, findIndexReference } from '../../../shared/science/glassModel'

describe('film activity index (the climbing flux on a 0–10 scale)', () => {
  it('is anchored at the largest climbing flux of any water–ethanol mix at 20 °C in the default room', () => {
    const ref = findIndexReference()
    expect(ref.climbFlux_mm2_s / INDEX_REFERENCE.climbFlux_mm2_s).toBeCloseTo(1, 5)
    expect(ref.abvPctVol).toBeCloseTo(INDEX_REFERENCE.abvPctVol, 1)
    expect(filmActivityIndex(ref.abvPctVol, 20)).toBeCloseTo(10, 4)
  })

  it('is the flux q = τ³/(6μ(ρg sinβ)²) of the climbing film, not a product chosen by hand', () => {
    const r = computeFilm({ abvPctVol: 13.5, tempC: 16, sugarGL: 4 })
    const p = r.predictions
    const grav = r.density_kg_m3 * 9.80665 * Math.sin((70 * Math.PI) / 180) // standard gravity (CGPM 1901)
    const q = p.marangoniStress_Pa ** 3 / (6 * r.viscosity_mPa_s * 1e-3 * grav * grav) // lubrication theory (Hosoi & Bush 2001)
    expect(p.climbFlux_mm2_s / (q * 1e6)).toBeCloseTo(1, 9)
    expect(r.filmActivityIndex).toBeCloseTo(Math.min(10, (10 * q * 1e6) / INDEX_REFERENCE.climbFlux_mm2_s), 9)
  })

  it('is exactly 0 at 0 % vol, at any temperature, sugar and room', () => {
    for (const t of [0, 20, 40]) for (const s of [0, 200]) for (const rh of [0, 50, 100]) {
      expect(filmActivityIndex(0, t, s, { relativeHumidityPct: rh, airTempC: 21 })).toBe(0)
    }
  })

  it('stays in [0, 10], never negative, never NaN (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 100, noNaN: true }),
        fc.double({ min: 0, max: 40, noNaN: true }),
        fc.double({ min: 0, max: 400, noNaN: true }),
        fc.double({ min: 0, max: 100, noNaN: true }),
        (abv, t, s, rh) => {
          const i = filmActivityIndex(abv, t, s, { relativeHumidityPct: rh, airTempC: 21 })
          expect(Number.isFinite(i)).toBe(true)
          expect(i).toBeGreaterThanOrEqual(0)
          expect(i).toBeLessThanOrEqual(10)
        },
      ),
      { numRuns: 150 },
    )
  })

  it('rises from 0 to 12 % vol at 20 °C (property over any two strengths)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 12, noNaN: true }), fc.double({ min: 0, max: 12, noNaN: true }), (a, b) => {
        const [lo, hi] = a < b ? [a, b] : [b, a]
        if (hi - lo < 1e-3) return
        expect(filmActivityIndex(hi, 20)).toBeGreaterThan(filmActivityIndex(lo, 20))
      }),
      { numRuns: 100 },
    )
  })

  it('is continuous: 0.01 % vol never moves it by more than 0.3 (scan 0–100 % vol)', () => {
    let prev = filmActivityIndex(0, 20)
    for (let abv = 0.01; abv <= 100; abv += 0.01) {
      const i = filmActivityIndex(abv, 20)
      expect(Math.abs(i - prev), `at ${abv.toFixed(2)} % vol`).toBeLessThan(0.3)
      prev = i
    }
  }, 60_000)

  it('above the table-wine peak falls slowly: a spirit\'s stronger pull is offset by its viscosity', () => {
    const wine = centralClimb({ abvPctVol: 12, tempC: 20, sugarGL: 0 })
    const spirit = centralClimb({ abvPctVol: 40, tempC: 20, sugarGL: 0, kind: 'spirit' })
    expect(spirit.marangoniStress_Pa).toBeGreaterThan(wine.marangoniStress_Pa * 0.9)
    expect(filmActivityIndex(40, 20)).toBeLessThan(filmActivityIndex(12, 20))
    expect(filmActivityIndex(40, 20)).toBeGreaterThan(0.4 * filmActivityIndex(12, 20))
    for (const abv of [60, 80, 95]) expect(filmActivityIndex(abv, 20)).toBeLessThan(filmActivityIndex(40, 20))
  })

  it('rises with the room\'s dryness and with a warmer pour', () => {
    const dry = { relativeHumidityPct: 20, airTempC: 21 }
    const humid = { relativeHumidityPct: 80, airTempC: 21 }
    expect(filmActivityIndex(12, 20, 0, dry)).toBeGreaterThan(filmActivityIndex(12, 20, 0, humid) - 1e-9)
    expect(filmActivityIndex(40, 24)).toBeGreaterThan(filmActivityIndex(40, 8))
  })

  it('maps a flux to the scale and never below 0', () => {
    expect(indexFromClimbFlux(-1).index).toBe(0)
    expect(indexFromClimbFlux(INDEX_REFERENCE.climbFlux_mm2_s).index).toBeCloseTo(10, 12)
    expect(indexFromClimbFlux(2 * INDEX_REFERENCE.climbFlux_mm2_s)).toEqual({ index: 10, relative: 2 })
  })

  it('throws RangeError outside the model\'s ranges', () => {
    expect(() => filmActivityIndex(101, 20)).toThrow(RangeError)
    expect(() => filmActivityIndex(12, -1)).toThrow(RangeError)
    expect(() => filmActivityIndex(12, 20, 401)).toThrow(RangeError)
    expect(() => filmActivityIndex(12, 20, 0, { relativeHumidityPct: 101, airTempC: 20 })).toThrow(RangeError)
  })
})
