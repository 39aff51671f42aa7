import { idParam } from '../../../../shared/schemas/common'

/**
 * A published flight's sessions still taking bookings, with seats left (one query). Public. The
 * same set, and the same bound, as the flights list's (GET /api/flights/published), so the flight
 * page's "from" price and count agree with the home page's card however many sessions are on sale;
 * the page itself sends only the next few (shared/flightPage.ts).
 */
export default defineEventHandler(async (event) => {
  const { id } = await readParamsAs(event, idParam)
  const venue = await getVenue()
  const flight = await loadFlight(venue, id, { publishedOnly: true })
  return loadOpenSessions(venue, { flightIds: [flight.id] })
})
