import { and, desc, eq } from 'drizzle-orm'
import type { PublishedFlight } from '../../../shared/types/flights'
import { groupedBy } from '../../../shared/utils/grouped'
import { sessionsOnSale } from '../../../shared/flightPage'

const LIST_MAX_AGE_S = 5

/**
 * The public list of flights: what is poured, from what price, and the next sessions with seats left.
 * The same for everyone and read on every public page, so it is built once and kept for at most
 * 5 s (seats left lag a booking by those 5 s at most; a flight published, a note or a setting changed
 * ends it at once: server/utils/pageCache.ts). Browsers may keep it as long. A flight's own sessions,
 * the booking form's availability and the booking itself read seats live, and booking is decided in
 * the database (server/utils/bookings/), never from this list.
 */
export default defineEventHandler(async (event): Promise<PublishedFlight[]> => {
  setResponseHeader(event, 'cache-control', `max-age=${LIST_MAX_AGE_S}`)
  return cachedPublicData('flights-published', LIST_MAX_AGE_S * 1000, publishedFlights)
})

async function publishedFlights(): Promise<PublishedFlight[]> {
  const venue = await getVenue()
  const rows = await useDb().select().from(tables.flights)
    .where(and(eq(tables.flights.venueId, venue.id), eq(tables.flights.status, 'published')))
    .orderBy(desc(tables.flights.publishedAt))
  const [views, sessions] = await Promise.all([flightViews(venue, rows), loadOpenSessions(venue, { flightIds: rows.map(r => r.id) })])
  const byFlight = groupedBy(sessions, s => s.flightId)
  return views.map((f) => {
    const own = byFlight.get(f.id) ?? []
    // The same "from" price, count and lengths the flight's own page states (shared/flightPage.ts).
    const onSale = sessionsOnSale(own, 0)
    return {
      id: f.id,
      name: f.name,
      summary: f.summary,
      pourCount: f.pours.length,
      kinds: [...new Set(f.pours.map(p => p.product.kind))],
      standardDrinks: f.totals.standardDrinks,
      priceFromMinor: onSale.fromPriceMinor,
      currency: venue.currency,
      nextSessions: own.slice(0, 3),
      sessionCount: onSale.count,
      lengthMinutes: onSale.minutes,
      photos: f.pours.flatMap(p => (p.photo ? [p.photo] : [])),
    }
  })
}
