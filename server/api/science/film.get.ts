import { computeFilm, describePour } from '../../../shared/science'
import { filmQuerySchema } from '../../../shared/schemas/science'
import type { FilmView } from '../../../shared/types/science'

/**
 * Every intermediate quantity of the glass model for one pour, each with its unit in its name, in
 * the room's air given by `rh` and `airTempC` (the model's default room when left out).
 */
export default defineEventHandler(async (event): Promise<FilmView> => {
  const q = await readQueryAs(event, filmQuerySchema)
  const film = computeFilm({
    abvPctVol: q.abv, tempC: q.tempC, sugarGL: q.sugarGL, wallAngleDeg: q.wallAngleDeg,
    room: { relativeHumidityPct: q.rh, airTempC: q.airTempC }, kind: q.kind,
  })
  setResponseHeader(event, 'cache-control', 'public, max-age=3600')
  return { ...film, description: describePour(film) }
})
