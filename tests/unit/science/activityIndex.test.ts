import { describe, it, expect } from 'vitest'
import fc from 'fast-check'
import { INDEX_REFERENCE, filmActivityIndex, findIndexReference } from '../../../shared/science/activityIndex'
import { modelAzeotropeAt1atm } from '../../../shared/science/glassModel'

describe('film activity index', () => {
  it('is anchored at the 20 °C maximum', () => {
    const ref = findIndexReference()
    expect(ref.drive / INDEX_REFERENCE.drive).toBeCloseTo(1, 6)
    expect(ref.abvPctVol).toBeCloseTo(INDEX_REFERENCE.abvPctVol, 1)
    expect(filmActivityIndex(ref.abvPctVol, 20)).toBeCloseTo(10, 5)
  })

  it('is exactly 0 at 0 % vol, at any temperature and sugar', () => {
    for (const t of [0, 20, 40]) for (const s of [0, 200]) expect(filmActivityIndex(0, t, s)).toBe(0)
  })

  it('stays in [0, 10] and is never NaN (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 100, noNaN: true }),
        fc.double({ min: 0, max: 40, noNaN: true }),
        fc.double({ min: 0, max: 400, noNaN: true }),
        (abv, t, s) => {
          const i = filmActivityIndex(abv, t, s)
          expect(Number.isFinite(i)).toBe(true)
          expect(i).toBeGreaterThanOrEqual(0)
          expect(i).toBeLessThanOrEqual(10)
        },
      ),
      { numRuns: 300 },
    )
  })

  it('is positive between 0 % and the azeotrope', () => {
    for (const abv of [0.1, 1, 5, 12, 40, 80, 90]) expect(filmActivityIndex(abv, 20)).toBeGreaterThan(0)
  })

  it('is below 0.3 at and above the azeotrope, at any temperature (property)', () => {
    const azeoAbv = modelAzeotropeAt1atm().abvPctVol
    fc.assert(
      fc.property(fc.double({ min: azeoAbv, max: 100, noNaN: true }), fc.double({ min: 0, max: 40, noNaN: true }), (abv, t) => {
        expect(filmActivityIndex(abv, t)).toBeLessThan(0.3)
      }),
      { numRuns: 200 },
    )
    // and the handbook azeotrope, x = 0.894 ≈ 95.6 % mass ≈ 97.2 % vol (Perry's Handbook)
    expect(filmActivityIndex(97.2, 20)).toBeLessThan(0.3)
  })

  it('rises monotonically from 0 to 12 % vol at any temperature (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 40, noNaN: true }), (t) => {
        let prev = -1
        for (let abv = 0; abv <= 12; abv += 0.25) {
          const i = filmActivityIndex(abv, t)
          // strictly rising where the 20 °C cap at 10 does not bite
          if (prev < 10) expect(i).toBeGreaterThan(prev)
          else expect(i).toBe(10)
          prev = i
        }
      }),
      { numRuns: 40 },
    )
  })

  it('is continuous: small ABV steps give small changes', () => {
    let prev = filmActivityIndex(0, 20)
    for (let abv = 0.05; abv <= 100; abv += 0.05) {
      const i = filmActivityIndex(abv, 20)
      expect(Math.abs(i - prev)).toBeLessThan(0.3)
      prev = i
    }
  })

  it('falls from its peak toward strong spirits (physics, see docs/science.md)', () => {
    expect(filmActivityIndex(40, 20)).toBeLessThan(filmActivityIndex(14, 20))
    expect(filmActivityIndex(60, 20)).toBeLessThan(filmActivityIndex(40, 20))
  })

  it('rises with temperature for a table wine (faster evaporation)', () => {
    expect(filmActivityIndex(12, 8)).toBeLessThan(filmActivityIndex(12, 18))
  })

  it('throws RangeError outside the model range', () => {
    expect(() => filmActivityIndex(101, 20)).toThrow(RangeError)
    expect(() => filmActivityIndex(12, -1)).toThrow(RangeError)
    expect(() => filmActivityIndex(12, 20, 401)).toThrow(RangeError)
  })
})
