/**
 * Input ranges of the glass model and the guard every public function uses.
 *
 * The limits come from the narrowest published correlation the model chains together:
 * - ABV 0–100 % vol (definition of the quantity).
 * - Temperature 0–40 °C: the OIML R 22 density formula holds −20…+40 °C; the Poling et al. Antoine
 *   constants for ethanol hold 276.5–369.5 K (3.35–96.35 °C), so 0–3.35 °C is a short,
 *   documented extrapolation (at 0 °C it gives 1.58 kPa; a handbook value is ~1.6 kPa, from memory).
 * - Residual sugar 0–400 g/L: the sucrose viscosity fit covers 0–50 % mass sugar, and 400 g/L is
 *   about 35 % mass, past the sweetest liqueurs (common practice, no source).
 * - Wall angle 15–90° from horizontal: the lubrication results divide by sin(angle); below ~15° the
 *   "film on a wall" picture no longer describes a glass.
 */

/** Range of ABV (% vol at 20 °C) accepted by the model. */
export const ABV_RANGE_PCT_VOL = { min: 0, max: 100 } as const

/** Range of liquid temperature (°C) accepted by the model. */
export const TEMP_RANGE_C = { min: 0, max: 40 } as const

/** Range of residual sugar (g/L) accepted by the model. */
export const SUGAR_RANGE_G_L = { min: 0, max: 400 } as const

/** Range of the room's relative humidity, %, accepted by the model. */
export const HUMIDITY_RANGE_PCT = { min: 0, max: 100 } as const

/** Range of the room's air temperature, °C, accepted by the model (the liquid's own range). */
export const AIR_TEMP_RANGE_C = { min: 0, max: 40 } as const

/** Range of the glass wall angle, degrees from horizontal (90 = vertical wall). */
export const WALL_ANGLE_RANGE_DEG = { min: 15, max: 90 } as const

/**
 * Throws a RangeError with a readable message unless `value` is a finite number in [min, max].
 * @param name  the input's name as the caller knows it, e.g. "abvPctVol"
 * @param unit  unit shown in the message, e.g. "% vol"
 */
export function assertInRange(name: string, value: number, min: number, max: number, unit: string): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new RangeError(`${name} must be a finite number (got ${String(value)})`)
  }
  if (value < min || value > max) {
    throw new RangeError(`${name} must be between ${min} and ${max} ${unit} (got ${value})`)
  }
}
