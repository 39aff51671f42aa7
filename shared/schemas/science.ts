import { z } from './zod'
import { ABV_RANGE_PCT_VOL, AIR_TEMP_RANGE_C, HUMIDITY_RANGE_PCT, SUGAR_RANGE_G_L, TEMP_RANGE_C, WALL_ANGLE_RANGE_DEG } from '../science/ranges'
import { DEFAULT_ROOM_AIR, DEFAULT_WALL_ANGLE_DEG, DRINK_KINDS } from '../science/glassModel'

/**
 * A number in a query is a plain decimal: an optional sign, digits, and an optional fraction after
 * a point. `Number()` would also take "0x10", "1e1", " 12 ", "Infinity" and "" (as 0); none of them
 * is what a person means by a number in a link, so each is refused with the field's own message.
 */
const PLAIN_DECIMAL = /^[+-]?\d+(?:\.\d+)?$/

interface NumberSpec { key: string, label: string, unit: string, range: { min: number, max: number }, integer?: boolean }

/** A query number with a range, and messages that name the label, the query key, the unit and the range. */
function queryNumber({ key, label, unit, range, integer }: NumberSpec) {
  const span = `${integer ? 'a whole number' : 'a number'} from ${range.min} to ${range.max}${unit ? ` ${unit}` : ''}`
  const name = `${label} (${key})`
  return z.string({ error: `${name} is required: ${span}.` })
    .refine(s => s !== '', { error: `${name} is blank: give ${span}, or leave ${key} out.`, abort: true })
    .refine(s => PLAIN_DECIMAL.test(s), { error: `${name} must be a plain decimal like 12.5 (digits, an optional sign and point; no spaces, exponent or hex): ${span}.`, abort: true })
    .transform(Number)
    .refine(v => Number.isFinite(v) && v >= range.min && v <= range.max && (!integer || Number.isInteger(v)), { error: `${name} must be ${span}.` })
}

/**
 * A query object that names each key it does not read (the field is the key), alongside the
 * messages of the keys it does read: a misspelt `rh` or `airTemp` is never silently ignored. The two
 * checks run side by side, so one answer names every bad and every unknown key.
 */
function strictQuery<S extends z.core.$ZodShape>(shape: S) {
  const known = Object.keys(shape)
  const reads = known.length ? `it reads ${known.join(', ')}` : 'it reads none'
  const fields = z.object(shape)
  return z.unknown().transform((q, ctx): z.output<typeof fields> => {
    for (const key of Object.keys(q && typeof q === 'object' ? q : {})) {
      if (!known.includes(key)) ctx.addIssue({ code: 'custom', path: [key], message: `${key} is not a parameter of this route; ${reads}.` })
    }
    const parsed = fields.safeParse(q)
    if (!parsed.success) for (const issue of parsed.error.issues) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message })
    return parsed.success ? parsed.data : z.NEVER
  })
}

const abv = queryNumber({ key: 'abv', label: 'ABV', unit: '% vol', range: ABV_RANGE_PCT_VOL })
const tempC = queryNumber({ key: 'tempC', label: 'Temperature', unit: '°C', range: TEMP_RANGE_C })
const sugarGL = queryNumber({ key: 'sugarGL', label: 'Residual sugar', unit: 'g/L', range: SUGAR_RANGE_G_L }).default(0)

const rh = queryNumber({ key: 'rh', label: 'Relative humidity', unit: '%', range: HUMIDITY_RANGE_PCT }).default(DEFAULT_ROOM_AIR.relativeHumidityPct)
const airTempC = queryNumber({ key: 'airTempC', label: 'Air temperature', unit: '°C', range: AIR_TEMP_RANGE_C }).default(DEFAULT_ROOM_AIR.airTempC)

/** Number of curve points over 0–100 % vol (the model takes more; a chart needs no more than this). */
const CURVE_POINTS_RANGE = { min: 2, max: 401 } as const
const CURVE_POINTS_DEFAULT = 201

/**
 * GET /api/science/film: abv, tempC (required); sugarGL, wallAngleDeg, rh (room relative
 * humidity, %), airTempC (room air, °C), kind (one of DRINK_KINDS) optional.
 */
export const filmQuerySchema = strictQuery({
  abv,
  tempC,
  sugarGL,
  wallAngleDeg: queryNumber({ key: 'wallAngleDeg', label: 'Wall angle', unit: '° from horizontal', range: WALL_ANGLE_RANGE_DEG }).default(DEFAULT_WALL_ANGLE_DEG),
  rh,
  airTempC,
  kind: z.enum(DRINK_KINDS, { error: `Kind (kind) must be one of ${DRINK_KINDS.join(', ')}.` }).optional(),
})

/**
 * GET /api/science/curve: tempC (required); sugarGL, rh, airTempC (the room, as for the film) and
 * points (whole, 2–401, default 201) optional.
 */
export const curveQuerySchema = strictQuery({
  tempC,
  sugarGL,
  rh,
  airTempC,
  points: queryNumber({ key: 'points', label: 'Points', unit: '', range: CURVE_POINTS_RANGE, integer: true }).default(CURVE_POINTS_DEFAULT),
})

/** GET /api/science/products reads no query at all. */
export const productsQuerySchema = strictQuery({})
