import { idParam } from '../../../../shared/schemas/common'
import type { SessionAvailability } from '../../../../shared/types/sessions'
import { cancelDeadline } from '../../../../shared/bookings'

/**
 * What a guest needs before booking one session: when, price, seats left, whether it can still be
 * booked, and the flight's standard drinks per guest under the venue's definition. Public.
 */
export default defineEventHandler(async (event): Promise<SessionAvailability> => {
  const { id } = await readParamsAs(event, idParam)
  const venue = await getVenue()
  const session = await loadPublicSession(venue, id)
  const flight = await flightView(venue, await loadFlight(venue, session.flightId))
  return {
    session,
    holdMinutes: Number(useRuntimeConfig().booking.holdMinutes),
    cancelClosesAt: cancelDeadline(session.startsAt, venue.cancellationCutoffHours).toISOString(),
    flight: {
      id: flight.id,
      name: flight.name,
      summary: flight.summary,
      pourCount: flight.pours.length,
      volumeMl: flight.totals.volumeMl,
      ethanolGrams: flight.totals.ethanolGrams,
      standardDrinks: flight.totals.standardDrinks,
    },
  }
})
