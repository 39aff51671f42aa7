import { computeCurve, type CurvePoint } from '../../../shared/science'
import { curveQuerySchema } from '../../../shared/schemas/science'

/** σ of the wine and of its film, the climbing flux and the index, at `points` ABV points (default 201) from 0 to 100 % vol, in the room given (rh, airTempC). */
export default defineEventHandler(async (event): Promise<CurvePoint[]> => {
  const q = await readQueryAs(event, curveQuerySchema)
  setResponseHeader(event, 'cache-control', 'public, max-age=3600')
  return computeCurve({ tempC: q.tempC, sugarGL: q.sugarGL, points: q.points, room: { relativeHumidityPct: q.rh, airTempC: q.airTempC } })
})
