import { z } from './zod'
import { ABV_RANGE_PCT_VOL, SUGAR_RANGE_G_L, TEMP_RANGE_C, WALL_ANGLE_RANGE_DEG } from '../science/ranges'
import { DEFAULT_WALL_ANGLE_DEG } from '../science/glassModel'

/** A query number with a range and a message that names the field, its unit and its range. */
function queryNumber(label: string, unit: string, range: { min: number, max: number }) {
  const message = `${label} must be a number from ${range.min} to ${range.max} ${unit}.`
  return z.string({ error: `${label} is required (${range.min}–${range.max} ${unit}).` })
    .trim()
    .min(1, { error: `${label} is required (${range.min}–${range.max} ${unit}).` })
    .transform(Number)
    .pipe(z.number({ error: message }).refine(Number.isFinite, { error: message }).refine(v => v >= range.min && v <= range.max, { error: message }))
}

const optional = <T extends z.ZodType>(schema: T, fallback: string) => z.preprocess(v => (v === undefined || v === '' ? fallback : v), schema)

export const filmQuerySchema = z.object({
  abv: queryNumber('ABV', '% vol', ABV_RANGE_PCT_VOL),
  tempC: queryNumber('Temperature', '°C', TEMP_RANGE_C),
  sugarGL: optional(queryNumber('Residual sugar', 'g/L', SUGAR_RANGE_G_L), '0'),
  wallAngleDeg: optional(queryNumber('Wall angle', '° from horizontal', WALL_ANGLE_RANGE_DEG), String(DEFAULT_WALL_ANGLE_DEG)),
})

export const curveQuerySchema = z.object({
  tempC: queryNumber('Temperature', '°C', TEMP_RANGE_C),
  sugarGL: optional(queryNumber('Residual sugar', 'g/L', SUGAR_RANGE_G_L), '0'),
})
