import { describe, it, expect } from 'vitest'
import {
  ETHANOL_DENSITY_20C_G_ML,
  STANDARD_DRINK_GRAMS,
  celsiusToFahrenheit,
  ethanolGrams,
  fahrenheitToCelsius,
  flightTotals,
  mlToUsFlOz,
  standardDrinks,
  ukUnits,
  usFlOzToMl,
} from '../../../shared/science/standardDrinks'
import { ETHANOL_DENSITY_20C_KG_M3 } from '../../../shared/science/composition'

describe('standard drinks', () => {
  it('uses the published definitions', () => {
    expect(STANDARD_DRINK_GRAMS.US).toBe(14) // NIAAA: 14 g of pure alcohol
    expect(STANDARD_DRINK_GRAMS.UK).toBe(8) // NHS: one unit = 10 mL = 8 g
    expect(STANDARD_DRINK_GRAMS.AU).toBe(10) // Australian Department of Health: 10 g
    expect(STANDARD_DRINK_GRAMS.WHO).toBe(10) // WHO AUDIT manual: ~10 g
  })

  it('computes grams from volume, ABV and ethanol density at 20 °C', () => {
    expect(ETHANOL_DENSITY_20C_G_ML * 1000).toBeCloseTo(ETHANOL_DENSITY_20C_KG_M3, 2) // OIML R 22 table vs formula
    expect(ethanolGrams(100, 100)).toBeCloseTo(78.924, 3) // OIML R 22 ρ(1,20) = 789.24 kg/m³
    expect(ethanolGrams(150, 12)).toBeCloseTo(150 * 0.12 * 0.78924, 4)
  })

  it.each([
    [5, 12], // NIAAA: 5 fl oz of ~12 % wine
    [12, 5], // NIAAA: 12 fl oz of ~5 % beer
    [1.5, 40], // NIAAA: 1.5 fl oz of 40 % spirits
  ])('%s US fl oz at %s %% is one US standard drink within 5 %%', (flOz, abv) => {
    expect(Math.abs(standardDrinks(usFlOzToMl(flOz), abv, 'US') - 1)).toBeLessThan(0.05) // NIAAA standard drink examples
  })

  it('follows the NHS unit formula ABV × mL / 1000', () => {
    expect(ukUnits(175, 12)).toBeCloseTo(2.1, 10) // NHS: 175 mL glass of 12 % wine = 2.1 units
    expect(ukUnits(25, 40)).toBeCloseTo(1, 10) // NHS: single 25 mL measure of 40 % spirit = 1 unit
    expect(standardDrinks(175, 12, 'UK') / ukUnits(175, 12)).toBeCloseTo(0.78924 / 0.8, 6) // 8 g is the NHS rounding of 7.89 g
  })

  it('accepts a custom definition in grams', () => {
    expect(standardDrinks(100, 10, 12)).toBeCloseTo(7.8924 / 12, 6)
    expect(() => standardDrinks(100, 10, 0)).toThrow(RangeError)
  })

  it('totals a flight', () => {
    const t = flightTotals([
      { volumeMl: 60, abvPctVol: 12.5 },
      { volumeMl: 60, abvPctVol: 14 },
      { volumeMl: 30, abvPctVol: 20 },
    ], 'US')
    expect(t.volumeMl).toBe(150)
    expect(t.pours).toHaveLength(3)
    expect(t.ethanolGrams).toBeCloseTo(ethanolGrams(60, 12.5) + ethanolGrams(60, 14) + ethanolGrams(30, 20), 10)
    expect(t.standardDrinks).toBeCloseTo(t.ethanolGrams / 14, 10)
    expect(flightTotals([]).standardDrinks).toBe(0)
  })

  it('rejects impossible pours', () => {
    expect(() => ethanolGrams(-1, 12)).toThrow(RangeError)
    expect(() => ethanolGrams(150, 120)).toThrow(RangeError)
    expect(() => ethanolGrams(Number.NaN, 12)).toThrow(RangeError)
  })
})

describe('display conversions', () => {
  it('converts US fluid ounces', () => {
    expect(usFlOzToMl(1)).toBeCloseTo(29.5735, 4) // US customary definition: 1 fl oz = 29.5735 mL
    expect(mlToUsFlOz(usFlOzToMl(5))).toBeCloseTo(5, 12)
  })

  it('converts temperatures', () => {
    expect(celsiusToFahrenheit(0)).toBe(32) // definition of the Fahrenheit scale
    expect(celsiusToFahrenheit(100)).toBeCloseTo(212, 12) // definition
    expect(fahrenheitToCelsius(celsiusToFahrenheit(18))).toBeCloseTo(18, 12)
  })
})
