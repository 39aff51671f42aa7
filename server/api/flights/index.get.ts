import { and, desc, eq } from 'drizzle-orm'
import type { FlightListItem } from '../../../shared/types/flights'

/** Staff see every flight; guests and visitors see published flights only. */
export default defineEventHandler(async (event): Promise<FlightListItem[]> => {
  const isStaff = isStaffRole((await optionalUser(event))?.role)
  const venue = await getVenue()
  const rows = await useDb().select().from(tables.flights)
    .where(isStaff ? eq(tables.flights.venueId, venue.id) : and(eq(tables.flights.venueId, venue.id), eq(tables.flights.status, 'published')))
    .orderBy(desc(tables.flights.updatedAt))
  const views = await flightViews(venue, rows)
  return views.map(({ pours, ...f }) => ({
    ...f,
    pourCount: pours.length,
    pours: pours.map(p => ({ position: p.position, name: p.product.name, kind: p.product.kind, abvPctVol: p.abvPctVol, filmActivityIndex: p.filmActivityIndex })),
  }))
})
