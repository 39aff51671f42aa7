import { and, eq, ne } from 'drizzle-orm'
import { idParam } from '../../../../shared/schemas/common'

/**
 * Publishes a draft. Products must be active. Another published version of the same flight is
 * retired: its scheduled sessions keep it, new sessions take this one.
 */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const { id } = await readParamsAs(event, idParam)
  const venue = await getVenue()
  const view = await flightView(venue, await loadFlight(venue, id))
  const retiredProducts = view.pours.filter(p => p.product.status !== 'active').map(p => p.product.name)
  if (retiredProducts.length) throw createError({ statusCode: 409, statusMessage: 'Retired product', message: `Replace the retired products first: ${retiredProducts.join(', ')}.` })
  await useDb().transaction(async (tx) => {
    const flight = await lockFlightForEdit(tx, venue.id, id)
    if (flight.status !== 'draft') throw createError({ statusCode: 409, statusMessage: 'Not a draft', message: `Only a draft can be published; this flight is ${flight.status}.` })
    const lineage = flight.lineageId ?? flight.id
    await tx.update(tables.flights).set({ status: 'retired' })
      .where(and(eq(tables.flights.lineageId, lineage), eq(tables.flights.status, 'published'), ne(tables.flights.id, id)))
    await tx.update(tables.flights).set({ status: 'published', publishedAt: new Date() }).where(eq(tables.flights.id, id))
  })
  return flightView(venue, await loadFlight(venue, id))
})
