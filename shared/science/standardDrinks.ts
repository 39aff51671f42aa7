/**
 * Grams of ethanol and standard drinks in a pour or a flight, with display conversions.
 */
import { ABV_RANGE_PCT_VOL, assertInRange } from './ranges'

/**
 * Ethanol density at 20 °C, g/mL: the OIML R 22 table value ρ(1, 20) = 789.24 kg/m³ (the formula in
 * composition.ts gives 789.239 kg/m³; the tabulated value is used so grams match published figures).
 */
export const ETHANOL_DENSITY_20C_G_ML = 0.78924

/**
 * Grams of ethanol in one standard drink (or unit), by definition:
 * US — NIAAA, 14 g; UK — NHS unit, 10 mL of ethanol = 8 g (the NHS rounds 10 mL × 0.789 g/mL to 8);
 * Australia — Department of Health, 10 g; WHO — AUDIT manual, 10 g.
 */
export const STANDARD_DRINK_GRAMS = { US: 14, UK: 8, AU: 10, WHO: 10 } as const

export type StandardDrinkDefinition = keyof typeof STANDARD_DRINK_GRAMS

/** 1 US fluid ounce in mL (exact: 1/128 US gallon of 231 in³ = 29.5735295625 mL). */
export const ML_PER_US_FL_OZ = 29.5735295625

/** Largest pour accepted, mL (a bottle and a half; catches unit mistakes such as L entered as mL). */
const POUR_VOLUME_RANGE_ML = { min: 0, max: 1500 } as const

/**
 * Grams of ethanol in a pour: volume (mL) × ABV/100 × 0.78924 g/mL (ethanol at 20 °C, OIML R 22).
 * ABV is defined at 20 °C, so the pour's volume is the 20 °C volume; a cold pour measured at serving
 * temperature differs by under 0.5 % between 5 and 20 °C.
 * Valid volume 0–1500 mL, ABV 0–100 % vol.
 */
export function ethanolGrams(volumeMl: number, abvPctVol: number): number {
  assertInRange('volumeMl', volumeMl, POUR_VOLUME_RANGE_ML.min, POUR_VOLUME_RANGE_ML.max, 'mL')
  assertInRange('abvPctVol', abvPctVol, ABV_RANGE_PCT_VOL.min, ABV_RANGE_PCT_VOL.max, '% vol')
  return volumeMl * (abvPctVol / 100) * ETHANOL_DENSITY_20C_G_ML
}

function gramsPerDrink(definition: StandardDrinkDefinition | number): number {
  if (typeof definition === 'number') {
    assertInRange('gramsPerStandardDrink', definition, 1, 100, 'g')
    return definition
  }
  const g = STANDARD_DRINK_GRAMS[definition]
  if (g === undefined) throw new RangeError(`unknown standard drink definition: ${String(definition)}`)
  return g
}

/**
 * Standard drinks in a pour = ethanol grams / grams per standard drink.
 * @param definition 'US' (14 g), 'UK' (8 g), 'AU' (10 g), 'WHO' (10 g) or a custom number of grams (1–100)
 */
export function standardDrinks(volumeMl: number, abvPctVol: number, definition: StandardDrinkDefinition | number = 'US'): number {
  return ethanolGrams(volumeMl, abvPctVol) / gramsPerDrink(definition)
}

/**
 * UK units by the NHS formula ABV (%) × volume (mL) / 1000 (one unit = 10 mL of pure ethanol).
 * Equals standardDrinks(..., 'UK') up to the NHS's rounding of 7.89 g to 8 g (1.4 %).
 */
export function ukUnits(volumeMl: number, abvPctVol: number): number {
  assertInRange('volumeMl', volumeMl, POUR_VOLUME_RANGE_ML.min, POUR_VOLUME_RANGE_ML.max, 'mL')
  assertInRange('abvPctVol', abvPctVol, ABV_RANGE_PCT_VOL.min, ABV_RANGE_PCT_VOL.max, '% vol')
  return (abvPctVol * volumeMl) / 1000
}

/** One pour of a flight. */
export interface Pour {
  volumeMl: number
  abvPctVol: number
}

/** Totals for a flight. */
export interface FlightTotals {
  /** Total liquid, mL. */
  volumeMl: number
  /** Total ethanol, g. */
  ethanolGrams: number
  /** Standard drinks under the chosen definition. */
  standardDrinks: number
  /** Per pour: ethanol grams and standard drinks, in input order. */
  pours: { ethanolGrams: number, standardDrinks: number }[]
}

/** Totals for a flight of pours. Same sources and ranges as ethanolGrams and standardDrinks. */
export function flightTotals(pours: readonly Pour[], definition: StandardDrinkDefinition | number = 'US'): FlightTotals {
  const perDrink = gramsPerDrink(definition)
  const rows = pours.map((p) => {
    const g = ethanolGrams(p.volumeMl, p.abvPctVol)
    return { ethanolGrams: g, standardDrinks: g / perDrink }
  })
  const grams = rows.reduce((s, r) => s + r.ethanolGrams, 0)
  return {
    volumeMl: pours.reduce((s, p) => s + p.volumeMl, 0),
    ethanolGrams: grams,
    standardDrinks: grams / perDrink,
    pours: rows,
  }
}

/** mL → US fl oz (exact definition above). */
export function mlToUsFlOz(ml: number): number {
  if (!Number.isFinite(ml)) throw new RangeError(`ml must be a finite number (got ${ml})`)
  return ml / ML_PER_US_FL_OZ
}

/** US fl oz → mL (exact definition above). */
export function usFlOzToMl(flOz: number): number {
  if (!Number.isFinite(flOz)) throw new RangeError(`flOz must be a finite number (got ${flOz})`)
  return flOz * ML_PER_US_FL_OZ
}

/** °C → °F (exact: °F = °C × 9/5 + 32). */
export function celsiusToFahrenheit(tempC: number): number {
  if (!Number.isFinite(tempC)) throw new RangeError(`tempC must be a finite number (got ${tempC})`)
  return (tempC * 9) / 5 + 32
}

/** °F → °C (exact). */
export function fahrenheitToCelsius(tempF: number): number {
  if (!Number.isFinite(tempF)) throw new RangeError(`tempF must be a finite number (got ${tempF})`)
  return ((tempF - 32) * 5) / 9
}
