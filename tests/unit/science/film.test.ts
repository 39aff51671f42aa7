import { describe, it, expect } from 'vitest'
import fc from 'fast-check'
import { massFractionFromAbv, meanMolarMass_g_mol, moleFractionFromMassFraction } from '../../../shared/science/composition'
import { filmComposition, rayleighLnMoleRatio } from '../../../shared/science/film'

const LOSS = 0.05 // a 5 % mass loss, an example size for the checks

const xOfAbv = (abv: number): number => moleFractionFromMassFraction(massFractionFromAbv(abv))

describe('Rayleigh film depletion', () => {
  it('agrees with the textbook integral ln(n/n0) = ∫ dx/(y − x)', () => {
    for (const abv of [1, 5, 12, 20, 40, 70]) {
      const x0 = xOfAbv(abv)
      const film = filmComposition(x0, 20, 0.1)
      const lnFromMasses = Math.log(1 - film.moleLossFraction)
      const lnFromIntegral = rayleighLnMoleRatio(x0, film.x1Film, 20, 4000)
      expect(Math.abs(lnFromMasses - lnFromIntegral)).toBeLessThan(1e-6)
    }
  })

  it('is converged in its step count', () => {
    // compare with a 10× finer RK4 done by chaining ten 1/10 losses of the remaining mass
    const x0 = xOfAbv(12)
    const coarse = filmComposition(x0, 20, 0.05).x1Film
    let x = x0
    const stepLoss = 1 - (1 - 0.05) ** (1 / 10)
    for (let i = 0; i < 10; i++) x = filmComposition(x, 20, stepLoss).x1Film
    expect(Math.abs(coarse - x)).toBeLessThan(1e-9)
  })

  it('leaves the film poorer in ethanol below the azeotrope and richer beyond it', () => {
    expect(filmComposition(xOfAbv(12), 20, LOSS).x1Film).toBeLessThan(xOfAbv(12))
    expect(filmComposition(0.95, 20, LOSS).x1Film).toBeGreaterThan(0.95)
  })

  it('keeps pure liquids and zero loss unchanged', () => {
    expect(filmComposition(0, 20, LOSS).x1Film).toBe(0)
    expect(filmComposition(1, 20, LOSS).x1Film).toBe(1)
    expect(filmComposition(0.3, 20, 0).x1Film).toBe(0.3)
  })

  it('converts the mass loss into a mole loss consistently (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 40, noNaN: true }), (x0, t) => {
        const f = filmComposition(x0, t, LOSS)
        expect(f.x1Film).toBeGreaterThanOrEqual(0)
        expect(f.x1Film).toBeLessThanOrEqual(1)
        const massRatio = ((1 - f.moleLossFraction) * meanMolarMass_g_mol(f.x1Film)) / meanMolarMass_g_mol(x0)
        expect(massRatio).toBeCloseTo(1 - LOSS, 10)
      }),
      { numRuns: 200 },
    )
  })
})
