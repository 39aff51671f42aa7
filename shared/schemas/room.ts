import { z } from './zod'
import { AIR_TEMP_RANGE_C, HUMIDITY_RANGE_PCT } from '../science/ranges'
import { temperatureFigure } from '../pours'

type TemperatureUnit = 'c' | 'f'

/**
 * The room's air as a hygrometer reads it: relative humidity in whole percent (what a room
 * hygrometer shows; their accuracy is a few percent, common practice, no source) and the air
 * temperature in °C to a tenth. On the wire and in the database the temperature is always °C; the
 * messages speak the venue's unit, so a °F venue reads "between 32 and 104 °F".
 */
const HUMIDITY_MESSAGE = `Relative humidity must be a whole number from ${HUMIDITY_RANGE_PCT.min} to ${HUMIDITY_RANGE_PCT.max} %.`

export const humidityField = z.number({ error: `Enter the relative humidity, % (${HUMIDITY_RANGE_PCT.min}–${HUMIDITY_RANGE_PCT.max}).` })
  // A refinement, not .int(): .int() stops the checks after it, and the venue's form checks the air temperature after this.
  .refine(Number.isInteger, { error: HUMIDITY_MESSAGE })
  .min(HUMIDITY_RANGE_PCT.min, { error: HUMIDITY_MESSAGE })
  .max(HUMIDITY_RANGE_PCT.max, { error: HUMIDITY_MESSAGE })

const unitSign = (unit: TemperatureUnit) => (unit === 'f' ? '°F' : '°C')

/** "The air temperature must be between 32 and 104 °F." */
export function airTempMessage(unit: TemperatureUnit): string {
  const f = (c: number) => temperatureFigure(c, unit)
  return `The air temperature must be between ${f(AIR_TEMP_RANGE_C.min)} and ${f(AIR_TEMP_RANGE_C.max)} ${unitSign(unit)}.`
}

/** A temperature in °C as the database keeps it: to a tenth. */
export const toTenth = (c: number) => Math.round(c * 10) / 10

/** True when `c` is an air temperature the glass model accepts. */
export const airTempInRange = (c: number) => c >= AIR_TEMP_RANGE_C.min && c <= AIR_TEMP_RANGE_C.max

/** The air temperature in °C; out of range is told in `unit`. */
const airTempField = (unit: TemperatureUnit) => z.number({ error: `Enter the air temperature in ${unitSign(unit)}.` })
  .refine(airTempInRange, { error: airTempMessage(unit) })
  .transform(toTenth)

/**
 * A host's reading of the room for one session (PUT /api/sessions/[id]/room-reading): the form
 * and the route parse it with the venue's temperature unit, so both say the range the same way.
 */
export const roomReadingSchema = (unit: TemperatureUnit) => z.object({
  relativeHumidityPct: humidityField,
  airTempC: airTempField(unit),
})
