import { eq } from 'drizzle-orm'
import { idParam } from '../../../../shared/schemas/common'

/** Takes a published flight back to draft, only while it has no sessions. */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const { id } = await readParamsAs(event, idParam)
  const venue = await getVenue()
  await useDb().transaction(async (tx) => {
    const flight = await lockFlightForEdit(tx, venue.id, id)
    if (flight.status !== 'published') throw createError({ statusCode: 409, statusMessage: 'Not published', message: 'Only a published flight can go back to draft.' })
    if (await flightSessionCount(tx, id) > 0) throw createError({ statusCode: 409, statusMessage: 'Flight in use', message: 'This flight has sessions. Retire it instead, or make a new version.' })
    await tx.update(tables.flights).set({ status: 'draft', publishedAt: null }).where(eq(tables.flights.id, id))
  })
  return flightView(venue, await loadFlight(venue, id))
})
