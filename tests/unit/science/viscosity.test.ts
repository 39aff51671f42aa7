import { describe, it, expect } from 'vitest'
import fc from 'fast-check'
import {
  BINGHAM_JACKSON_0C_MEMORY,
  BINGHAM_JACKSON_20C,
  BINGHAM_JACKSON_40C_MEMORY,
  VISCOSITY_FIT_MAX_RELATIVE_RESIDUAL,
  sugarViscosityFactor,
  viscosityHydroalcoholic_mPa_s,
  viscosity_mPa_s,
} from '../../../shared/science/viscosity'

describe('ethanol–water viscosity', () => {
  it('fits Bingham & Jackson at 20 °C within 0.39 %', () => {
    for (const [w, eta] of BINGHAM_JACKSON_20C) {
      expect(Math.abs(viscosityHydroalcoholic_mPa_s(w, 20) / eta - 1)).toBeLessThanOrEqual(VISCOSITY_FIT_MAX_RELATIVE_RESIDUAL.at20C + 1e-6) // Bingham & Jackson 1917, 20 °C table
    }
  })

  it('fits the recalled 0 °C and 40 °C columns within their stated residuals', () => {
    for (const [w, eta] of BINGHAM_JACKSON_0C_MEMORY) {
      expect(Math.abs(viscosityHydroalcoholic_mPa_s(w, 0) / eta - 1)).toBeLessThanOrEqual(VISCOSITY_FIT_MAX_RELATIVE_RESIDUAL.at0C + 1e-3) // Bingham & Jackson 0 °C, from memory
    }
    for (const [w, eta] of BINGHAM_JACKSON_40C_MEMORY) {
      expect(Math.abs(viscosityHydroalcoholic_mPa_s(w, 40) / eta - 1)).toBeLessThanOrEqual(VISCOSITY_FIT_MAX_RELATIVE_RESIDUAL.at40C + 1e-3) // Bingham & Jackson 40 °C, from memory
    }
  })

  it('gives water and ethanol at 25 °C', () => {
    expect(viscosityHydroalcoholic_mPa_s(0, 25)).toBeCloseTo(0.89, 2) // water 0.890 mPa·s at 25 °C, IAPWS 2008, from memory
    expect(Math.abs(viscosityHydroalcoholic_mPa_s(1, 25) / 1.074 - 1)).toBeLessThan(0.03) // ethanol 1.074 mPa·s at 25 °C, CRC Handbook, from memory
  })

  it('peaks near 40–50 % mass at 20 °C', () => {
    let best = 0
    for (let i = 0; i <= 100; i++) if (viscosityHydroalcoholic_mPa_s(i / 100, 20) > viscosityHydroalcoholic_mPa_s(best / 100, 20)) best = i
    expect(best).toBeGreaterThanOrEqual(40) // Bingham & Jackson 1917: maximum 2.91 at 40 % mass
    expect(best).toBeLessThanOrEqual(50)
  })

  it('is positive, finite and falls with temperature (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 39, noNaN: true }), (w, t) => {
        const a = viscosityHydroalcoholic_mPa_s(w, t)
        expect(Number.isFinite(a)).toBe(true)
        expect(a).toBeGreaterThan(0)
        expect(viscosityHydroalcoholic_mPa_s(w, t + 1)).toBeLessThan(a)
      }),
      { numRuns: 300 },
    )
  })
})

describe('sugar viscosity factor', () => {
  it.each([
    [0.1, 1.336], // sucrose 10 % mass, 20 °C: 1.336 mPa·s (handbook sucrose table, from memory)
    [0.2, 1.945], // sucrose 20 %: 1.945 mPa·s (from memory)
    [0.4, 6.162], // sucrose 40 %: 6.162 mPa·s (from memory)
  ])('at sugar mass fraction %s matches the sucrose table within 1 %%', (s, eta) => {
    expect(Math.abs((sugarViscosityFactor(s) * 1.002) / eta - 1)).toBeLessThan(0.01) // from memory, water 1.002 mPa·s
  })

  it('is 1 without sugar and rises with sugar', () => {
    expect(sugarViscosityFactor(0)).toBe(1)
    fc.assert(
      fc.property(fc.double({ min: 0, max: 0.49, noNaN: true }), (s) => {
        expect(sugarViscosityFactor(s + 0.01)).toBeGreaterThan(sugarViscosityFactor(s))
      }),
    )
  })

  it('makes a sweet drink more viscous than the same drink dry', () => {
    expect(viscosity_mPa_s(0.16, 20, 0.1)).toBeGreaterThan(viscosity_mPa_s(0.16, 20, 0))
  })
})
