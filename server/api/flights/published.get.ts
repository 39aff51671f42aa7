import { and, desc, eq } from 'drizzle-orm'
import type { PublishedFlight } from '../../../shared/types/flights'

/** The public list of flights: what is poured, from what price, and the next sessions with seats left. */
export default defineEventHandler(async (): Promise<PublishedFlight[]> => {
  const venue = await getVenue()
  const rows = await useDb().select().from(tables.flights)
    .where(and(eq(tables.flights.venueId, venue.id), eq(tables.flights.status, 'published')))
    .orderBy(desc(tables.flights.publishedAt))
  const [views, sessions] = await Promise.all([flightViews(venue, rows), loadOpenSessions(venue, { flightIds: rows.map(r => r.id) })])
  return views.map((f) => {
    const own = sessions.filter(s => s.flightId === f.id)
    const bookable = own.filter(s => s.bookable)
    return {
      id: f.id,
      name: f.name,
      summary: f.summary,
      pourCount: f.pours.length,
      kinds: [...new Set(f.pours.map(p => p.product.kind))],
      standardDrinks: f.totals.standardDrinks,
      priceFromMinor: bookable.length ? Math.min(...bookable.map(s => s.priceMinor)) : null,
      currency: venue.currency,
      nextSessions: own.slice(0, 3),
      sessionCount: own.length,
      lengthMinutes: own.length ? { min: Math.min(...own.map(s => s.durationMinutes)), max: Math.max(...own.map(s => s.durationMinutes)) } : null,
      photos: f.pours.flatMap(p => (p.photo ? [p.photo] : [])),
    }
  })
})
