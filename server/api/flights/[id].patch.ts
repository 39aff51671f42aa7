import { eq } from 'drizzle-orm'
import { idParam } from '../../../shared/schemas/common'
import { flightPatchSchema } from '../../../shared/schemas/flights'

/**
 * Renames a flight or replaces its pours. Pours of a published flight that has sessions are fixed
 * (guests booked those pours): the answer is 409 with the way forward, a new version.
 */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const { id } = await readParamsAs(event, idParam)
  const input = await readBodyAs(event, flightPatchSchema)
  const venue = await getVenue()
  if (input.pours) await computePours(venue, input.pours)
  await useDb().transaction(async (tx) => {
    const flight = await lockFlightForEdit(tx, venue.id, id)
    if (input.pours) {
      if (flight.status === 'retired') conflict('This flight is retired; its pours can no longer change.')
      if (flight.status === 'published' && await flightSessionCount(tx, id) > 0) {
        conflict('This flight is published and has sessions, so guests have booked these pours. Make a new version to change them; the sessions already scheduled keep this one.')
      }
      await writePours(tx, id, input.pours)
    }
    const { pours, ...fields } = input
    if (Object.keys(fields).length) await tx.update(tables.flights).set(fields).where(eq(tables.flights.id, id))
    else await tx.update(tables.flights).set({ updatedAt: new Date() }).where(eq(tables.flights.id, id))
  })
  return flightView(venue, await loadFlight(venue, id))
})
