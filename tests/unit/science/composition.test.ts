import { describe, it, expect } from 'vitest'
import fc from 'fast-check'
import {
  ETHANOL_DENSITY_20C_KG_M3,
  abvFromMassFraction,
  composition,
  densityHydroalcoholic_kg_m3,
  densityWithSugar_kg_m3,
  massFractionFromAbv,
  massFractionFromMoleFraction,
  moleFractionFromMassFraction,
  solventAbv,
} from '../../../shared/science/composition'

describe('OIML R 22 density', () => {
  it('reproduces the end points at 20 °C', () => {
    expect(densityHydroalcoholic_kg_m3(0, 20)).toBeCloseTo(998.2, 2) // OIML R 22 ρ(0,20) = 998.20
    expect(ETHANOL_DENSITY_20C_KG_M3).toBeCloseTo(789.24, 2) // OIML R 22 ρ(1,20) = 789.24
  })

  it.each([
    [0.05, 989.38], // Perry's Chemical Engineers' Handbook, 20 °C table: 0.98938 kg/L
    [0.1, 981.87], // Perry's, 20 °C: 0.98187 kg/L
    [0.12, 979.1], // Perry's, 20 °C: 0.97910 kg/L
  ])('matches the Perry 20 °C table at %s mass fraction', (p, rho) => {
    expect(Math.abs(densityHydroalcoholic_kg_m3(p, 20) - rho)).toBeLessThan(0.05) // Perry's Handbook (table resolution 0.01 kg/m³)
  })

  it('gives pure water densities at other temperatures', () => {
    expect(densityHydroalcoholic_kg_m3(0, 0)).toBeCloseTo(999.84, 1) // water at 0 °C, steam/handbook tables, from memory
    expect(densityHydroalcoholic_kg_m3(0, 4)).toBeCloseTo(999.97, 1) // water maximum near 4 °C, handbook, from memory
    expect(densityHydroalcoholic_kg_m3(0, 40)).toBeCloseTo(992.22, 1) // water at 40 °C, handbook, from memory
  })

  it('is strictly decreasing in mass fraction at 20 °C (checked on a 0.001 grid)', () => {
    let prev = Infinity
    for (let i = 0; i <= 1000; i++) {
      const rho = densityHydroalcoholic_kg_m3(i / 1000, 20)
      expect(rho).toBeLessThan(prev)
      prev = rho
    }
  })

  it('is decreasing in mass fraction at any temperature in the model range (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 0.999, noNaN: true }), fc.double({ min: 0, max: 40, noNaN: true }), (p, t) => {
        expect(densityHydroalcoholic_kg_m3(p + 0.001, t)).toBeLessThan(densityHydroalcoholic_kg_m3(p, t))
      }),
      { numRuns: 300 },
    )
  })

  it('throws RangeError outside its range', () => {
    expect(() => densityHydroalcoholic_kg_m3(1.01, 20)).toThrow(RangeError)
    expect(() => densityHydroalcoholic_kg_m3(0.5, 41)).toThrow(RangeError)
    expect(() => densityHydroalcoholic_kg_m3(Number.NaN, 20)).toThrow(RangeError)
  })
})

describe('ABV ↔ mass fraction ↔ mole fraction', () => {
  it.each([
    [12, 0.09641, 982.35], // OIML R 22 (1975) density formula evaluated at 20 °C (docs/science.md §1)
    [13.5, 0.10865, null], // OIML R 22 (1975) density formula evaluated at 20 °C (docs/science.md §1)
    [40, 0.333, 948.05], // OIML R 22 (1975) density formula evaluated at 20 °C (docs/science.md §1)
  ])('%s %% vol ↔ mass fraction and density', (abv, p, rho) => {
    const w = massFractionFromAbv(abv)
    expect(w).toBeCloseTo(p, 5) // OIML R 22 cross-check values (recomputed here)
    if (rho !== null) expect(densityHydroalcoholic_kg_m3(w, 20)).toBeCloseTo(rho, 2) // OIML R 22 cross-check
  })

  it('round-trips ABV → mass fraction → ABV to 1e-9 % vol (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 100, noNaN: true }), (abv) => {
        expect(Math.abs(abvFromMassFraction(massFractionFromAbv(abv)) - abv)).toBeLessThan(1e-8)
      }),
      { numRuns: 500 },
    )
  })

  it('round-trips mass ↔ mole fraction (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1, noNaN: true }), (w) => {
        expect(massFractionFromMoleFraction(moleFractionFromMassFraction(w))).toBeCloseTo(w, 12)
      }),
    )
  })

  it('converts mole fraction with the molar masses', () => {
    // 95.6 % mass ↔ x = 0.894 (azeotrope at 1 atm, Perry's Chemical Engineers' Handbook VLE table — from memory)
    expect(moleFractionFromMassFraction(0.956)).toBeCloseTo(0.8946, 3)
  })

  it('rejects out-of-range ABV', () => {
    expect(() => massFractionFromAbv(-0.1)).toThrow(RangeError)
    expect(() => massFractionFromAbv(100.1)).toThrow(RangeError)
    expect(() => massFractionFromAbv(Number.POSITIVE_INFINITY)).toThrow(RangeError)
  })
})

describe('sugar', () => {
  it.each([
    [10, 1038.16], // ICUMSA sucrose table, 10 °Brix: SG(20/20) 1.04003 — from memory
    [20, 1080.93], // ICUMSA, 20 °Brix: SG 1.08287 — from memory
    [30, 1126.95], // ICUMSA, 30 °Brix: SG 1.12898 — from memory
  ])('sucrose solution of %s °Brix has the tabulated density within 2 kg/m³', (brix, rhoTable) => {
    const sugarGL = (brix / 100) * rhoTable
    expect(Math.abs(densityWithSugar_kg_m3(0, 20, sugarGL) - rhoTable)).toBeLessThan(2) // from memory, see above
  })

  it('adds about 0.38 kg/m³ per g/L to water', () => {
    const slope = densityWithSugar_kg_m3(0, 20, 1) - densityWithSugar_kg_m3(0, 20, 0)
    expect(slope).toBeGreaterThan(0.37) // winemaking rule of thumb 0.38–0.39 kg/m³ per g/L, common practice
    expect(slope).toBeLessThan(0.39)
  })

  it('moves the ethanol into a smaller solvent volume', () => {
    const { solventAbvPctVol } = solventAbv(19, 100)
    expect(solventAbvPctVol).toBeCloseTo(19 / (1 - 0.0617), 6)
    expect(solventAbv(90, 400)).toEqual({ solventAbvPctVol: 100, capped: true })
  })

  it('keeps the drink-level ethanol concentration equal to ABV × 7.8924 g/L', () => {
    const c = composition(19, 20, 100)
    expect(c.ethanol_g_L).toBeCloseTo(19 * 7.8924, 3) // OIML R 22 ethanol density
    // mass balance: ethanol mass fraction × drink density = ethanol g/L
    expect(c.ethanolMassFraction * c.density_kg_m3).toBeCloseTo(c.ethanol_g_L, 6)
  })
})
