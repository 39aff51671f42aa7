import { idParam } from '../../../../shared/schemas/common'

/** A published flight's sessions still taking bookings, with seats left (one query). Public. */
export default defineEventHandler(async (event) => {
  const { id } = await readParamsAs(event, idParam)
  const venue = await getVenue()
  const flight = await loadFlight(venue, id, { publishedOnly: true })
  return loadOpenSessions(venue, { flightIds: [flight.id], limit: 60 })
})
