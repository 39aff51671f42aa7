import { describe, it, expect } from 'vitest'
import fc from 'fast-check'
import {
  activityCoefficientsGlass,
  activityCoefficientsNrtl,
  activityCoefficientsWilson,
  bubblePointTemperature_K,
  ethanolDiluteGammaFromHenry,
  findAzeotrope,
  isothermalAzeotropeMoleFraction,
  saturationPressureEthanol_Pa,
  saturationPressureWater_Pa,
  vapourState,
} from '../../../shared/science/vle'

const K = 273.15

describe('Antoine vapour pressures (Poling et al.)', () => {
  it('boil at the handbook normal boiling points', () => {
    expect(Math.abs(bubblePointTemperature_K(1) - K - 78.29)).toBeLessThan(0.1) // ethanol n.b.p. 78.29 °C, CRC Handbook, from memory
    expect(Math.abs(bubblePointTemperature_K(0) - K - 100)).toBeLessThan(0.1) // water n.b.p. 99.97 °C (ITS-90), IAPWS
  })

  it('give room-temperature vapour pressures', () => {
    expect(saturationPressureWater_Pa(20 + K) / 2339.2).toBeCloseTo(1, 2) // IAPWS-95: 2.3392 kPa at 20 °C, from memory
    expect(saturationPressureWater_Pa(25 + K) / 3169.9).toBeCloseTo(1, 2) // IAPWS-95: 3.1699 kPa at 25 °C, from memory
    expect(saturationPressureEthanol_Pa(25 + K) / 7870).toBeCloseTo(1, 1) // ethanol 7.87 kPa at 25 °C, handbook, from memory
  })

  it('reject temperatures outside the accepted range', () => {
    expect(() => saturationPressureEthanol_Pa(380)).toThrow(RangeError)
    expect(() => saturationPressureWater_Pa(260)).toThrow(RangeError)
  })
})

describe('activity coefficients', () => {
  it('are 1 for a pure component (NRTL and Wilson)', () => {
    for (const f of [activityCoefficientsNrtl, activityCoefficientsWilson]) {
      expect(f(1, 300).gamma1).toBeCloseTo(1, 12)
      expect(f(0, 300).gamma2).toBeCloseTo(1, 12)
    }
  })

  it('satisfy the Gibbs–Duhem equation x1 dlnγ1 + x2 dlnγ2 = 0 (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 0.99, noNaN: true }), fc.double({ min: 273.15, max: 370, noNaN: true }), (x, T) => {
        for (const f of [activityCoefficientsNrtl, activityCoefficientsWilson]) {
          const h = 1e-6
          const a = f(x + h, T)
          const b = f(x - h, T)
          const d1 = (Math.log(a.gamma1) - Math.log(b.gamma1)) / (2 * h)
          const d2 = (Math.log(a.gamma2) - Math.log(b.gamma2)) / (2 * h)
          expect(Math.abs(x * d1 + (1 - x) * d2)).toBeLessThan(1e-5)
        }
      }),
      { numRuns: 200 },
    )
  })

  it('overstate dilute ethanol at glass temperature: the reason the glass model uses its own set', () => {
    // Henry's law, Sander, Atmos. Chem. Phys. 15, 4399 (2015), ethanol: Hcp = 1.9 mol/(m³·Pa) at 25 °C,
    // d ln Hcp/d(1/T) = 6400 K; with water 55.35 mol/L and Antoine P1sat = 7.88 kPa ⇒ γ1∞ = 3.70.
    const g = activityCoefficientsNrtl(0, 25 + K).gamma1
    expect(g / 3.7).toBeGreaterThan(1.8) // DECHEMA at 25 °C: 7.35
    // …and its temperature trend goes the wrong way: the Henry data make γ1∞ rise with temperature.
    expect(activityCoefficientsNrtl(0, 40 + K).gamma1).toBeLessThan(activityCoefficientsNrtl(0, 0 + K).gamma1)
  })
})

describe('activity coefficients at glass temperature (the glass set)', () => {
  // Independent of the code: γ1∞ = c_water / (Hcp(T) · P1sat(T)), Sander (2015) values above; water
  // density 999.84 / 997.05 / 992.22 kg/m³ at 0 / 25 / 40 °C (IAPWS-95 — from memory); Antoine as in vle.ts.
  const henryGamma = (tC: number, rhoWater: number) => {
    const T = tC + K
    const hcp = 1.9 * Math.exp(6400 * (1 / T - 1 / 298.15))
    const p1s = 10 ** (10.33675 - 1648.22 / (T - 42.232))
    return ((rhoWater / 18.015) * 1000) / hcp / p1s
  }

  it('reproduce dilute ethanol from Henry\'s law at 0, 25 and 40 °C', () => {
    for (const [t, rho] of [[0, 999.84], [25, 997.05], [40, 992.22]] as const) {
      expect(activityCoefficientsGlass(0, t + K).gamma1 / henryGamma(t, rho)).toBeCloseTo(1, 3)
      expect(ethanolDiluteGammaFromHenry(t + K) / henryGamma(t, rho)).toBeCloseTo(1, 3)
    }
    expect(activityCoefficientsGlass(0, 25 + K).gamma1).toBeCloseTo(3.70, 1) // Sander (2015) ⇒ 3.70
  })

  it('stay inside the spread of the values the compilation lists (Hcp 1.7–2.0 at 25 °C)', () => {
    const g = activityCoefficientsGlass(0, 25 + K).gamma1
    expect(g).toBeGreaterThan((henryGamma(25, 997.05) * 1.9) / 2.0) // Sander (2015): highest Hcp 2.0
    expect(g).toBeLessThan((henryGamma(25, 997.05) * 1.9) / 1.7) // lowest 1.7
  })

  it('rise with temperature as the exothermic mixing of dilute ethanol requires', () => {
    let prev = 0
    for (let t = 0; t <= 40; t += 5) {
      const g = activityCoefficientsGlass(0, t + K).gamma1
      expect(g).toBeGreaterThan(prev)
      prev = g
    }
  })

  it('keep the DECHEMA value for dilute water in ethanol, and reach γ = 1 at each pure end', () => {
    for (const t of [0, 20, 40]) {
      expect(activityCoefficientsGlass(1, t + K).gamma2).toBeCloseTo(activityCoefficientsNrtl(1, t + K).gamma2, 8)
      expect(activityCoefficientsGlass(1, t + K).gamma1).toBeCloseTo(1, 12)
      expect(activityCoefficientsGlass(0, t + K).gamma2).toBeCloseTo(1, 12)
    }
  })

  it('satisfy Gibbs–Duhem (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 0.99, noNaN: true }), fc.double({ min: 0, max: 40, noNaN: true }), (x, t) => {
        const h = 1e-6
        const a = activityCoefficientsGlass(x + h, t + K)
        const b = activityCoefficientsGlass(x - h, t + K)
        const d1 = (Math.log(a.gamma1) - Math.log(b.gamma1)) / (2 * h)
        const d2 = (Math.log(a.gamma2) - Math.log(b.gamma2)) / (2 * h)
        expect(Math.abs(x * d1 + (1 - x) * d2)).toBeLessThan(1e-5)
      }),
      { numRuns: 100 },
    )
  })

  it('give the dilute relative volatility the Henry data imply at 20 °C', () => {
    // α∞ = γ1∞ P1sat / P2sat = 3.45 × 5.861 kPa / 2.339 kPa = 8.6 at 20 °C (Sander 2015 with Antoine, evaluated here)
    const alpha = vapourState(0, 293.15, 'glass').relativeVolatility
    expect(alpha).toBeGreaterThan(8.6 / 1.08) // the compilation's spread, ±8 %
    expect(alpha).toBeLessThan(8.6 * 1.08)
  })
})

describe('azeotrope at 1 atm', () => {
  it('comes out of the NRTL model near the handbook point', () => {
    const a = findAzeotrope()
    expect(a).not.toBeNull()
    if (!a) return
    expect(Math.abs(a.x1 - 0.894)).toBeLessThan(0.015) // Perry's Chemical Engineers' Handbook ethanol–water VLE table at 1 atm (from memory): x = 0.894
    expect(Math.abs(a.tempC - 78.15)).toBeLessThan(0.3) // Perry's Chemical Engineers' Handbook ethanol–water VLE table at 1 atm (from memory): 78.15 °C
  })

  it('comes out of the Wilson model near the handbook point', () => {
    const a = findAzeotrope(101325, 'wilson')
    expect(a).not.toBeNull()
    if (!a) return
    expect(Math.abs(a.x1 - 0.894)).toBeLessThan(0.025) // Perry's Handbook: x = 0.894
    expect(Math.abs(a.tempC - 78.15)).toBeLessThan(0.3) // Perry's Handbook: 78.15 °C
  })

  it('boils below both pure liquids (minimum-boiling azeotrope)', () => {
    const a = findAzeotrope()
    expect(a).not.toBeNull()
    if (!a) return
    expect(a.T_K).toBeLessThan(bubblePointTemperature_K(1))
    const y = vapourState(a.x1, a.T_K).y1
    expect(y).toBeCloseTo(a.x1, 6)
  })

  it('has α = 1 near x ≈ 0.89 at glass temperatures in this model', () => {
    for (const t of [0, 20, 40]) {
      const x = isothermalAzeotropeMoleFraction(t + K)
      expect(x).not.toBeNull()
      expect(x ?? 0).toBeGreaterThan(0.87)
      expect(x ?? 1).toBeLessThan(0.91)
    }
  })
})

describe('modified Raoult law', () => {
  it('makes ethanol the more volatile component below the azeotrope at 20 °C', () => {
    expect(vapourState(0.04, 293.15).relativeVolatility).toBeGreaterThan(1) // the definition of the more volatile component
    expect(vapourState(0.04, 293.15).y1).toBeGreaterThan(0.04)
    expect(vapourState(0.95, 293.15).relativeVolatility).toBeLessThan(1)
  })
})
