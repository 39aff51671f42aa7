import { eq } from 'drizzle-orm'
import { idParam } from '../../../../shared/schemas/common'

/** Retires a flight: no new sessions; those already scheduled keep it. */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const { id } = await readParamsAs(event, idParam)
  const venue = await getVenue()
  await useDb().transaction(async (tx) => {
    const flight = await lockFlightForEdit(tx, venue.id, id)
    if (flight.status === 'retired') throw createError({ statusCode: 409, statusMessage: 'Already retired', message: 'This flight is already retired.' })
    await tx.update(tables.flights).set({ status: 'retired' }).where(eq(tables.flights.id, id))
  })
  return flightView(venue, await loadFlight(venue, id))
})
