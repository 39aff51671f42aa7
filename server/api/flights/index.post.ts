import { eq } from 'drizzle-orm'
import { flightSaveSchema } from '../../../shared/schemas/flights'

/** A new flight starts as a draft, version 1, its own lineage. */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const input = await readBodyAs(event, flightSaveSchema)
  const venue = await getVenue()
  await computePours(venue, input.pours) // 400 on unknown products or glasses, before writing
  const id = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(tables.flights).values({ venueId: venue.id, name: input.name, summary: input.summary }).$returningId()
    await tx.update(tables.flights).set({ lineageId: row!.id }).where(eq(tables.flights.id, row!.id))
    await writePours(tx, row!.id, input.pours)
    return row!.id
  })
  setResponseStatus(event, 201)
  return flightView(venue, await loadFlight(venue, id))
})
