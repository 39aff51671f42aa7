import { z } from 'zod'
import { describePour } from '../../../../../shared/science'
import { buildFlightCard } from '../../../../../shared/cards'
import { calibrationSentence } from '../../../../../shared/calibrationText'
import type { PourPage } from '../../../../../shared/types/cards'

const params = z.object({
  id: z.coerce.number({ error: 'The flight id must be a number.' }).int().positive({ error: 'The flight id must be positive.' }),
  position: z.coerce.number({ error: 'The pour number must be a number.' }).int().min(1, { error: 'Pours are numbered from 1.' }).max(8, { error: 'A flight has at most 8 pours.' }),
})

/** One pour of a published flight, as its card's QR code opens it: no sign-in needed. */
export default defineEventHandler(async (event): Promise<PourPage> => {
  const { id, position } = await readParamsAs(event, params)
  const venue = await getVenue()
  const view = await flightView(venue, await loadFlight(venue, id, { publishedOnly: true }))
  const pour = view.pours.find(p => p.position === position)
  if (!pour) notFound('This flight has no such pour.')
  // The whole flight's card, so the pour carries what sets it apart within its flight.
  const card = buildFlightCard({ venue, flight: view, publicUrl: appLink(`/pour/${id}`), room: venueRoom(venue) })
  return {
    venue: { name: venue.name, temperatureUnit: venue.temperatureUnit },
    flight: { id: view.id, name: view.name, pourCount: view.pours.length },
    intro: view.intro,
    pour: card.pours.find(p => p.position === position)!,
    photo: pour.photo,
    description: describePour(pour.film, { temperatureUnit: venue.temperatureUnit === 'f' ? 'F' : 'C' }),
    calibration: calibrationSentence(pour.film.calibration),
    room: pour.film.inputs.room,
    servingTempC: pour.servingTempC,
    residualSugarGL: pour.residualSugarGL,
    abvPctVol: pour.abvPctVol,
    viscosity_mPa_s: pour.film.viscosity_mPa_s,
    surfaceTensionBulk_mN_m: pour.film.surfaceTensionBulk_mN_m,
    surfaceTensionFilm_mN_m: pour.film.surfaceTensionFilm_mN_m,
  }
})
