import { eq, max } from 'drizzle-orm'
import { idParam } from '../../../../shared/schemas/common'

/** Copies a flight into a new draft version of the same lineage, to change what guests will book next. */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const { id } = await readParamsAs(event, idParam)
  const venue = await getVenue()
  const newId = await useDb().transaction(async (tx) => {
    const flight = await lockFlightForEdit(tx, venue.id, id)
    const lineage = flight.lineageId ?? flight.id
    const [{ v } = { v: 1 }] = await tx.select({ v: max(tables.flights.version) }).from(tables.flights).where(eq(tables.flights.lineageId, lineage))
    const pours = await tx.select().from(tables.flightPours).where(eq(tables.flightPours.flightId, id))
    const [row] = await tx.insert(tables.flights).values({ venueId: venue.id, lineageId: lineage, version: (v ?? 1) + 1, name: flight.name, summary: flight.summary }).$returningId()
    await writePours(tx, row!.id, pours.sort((a, b) => a.position - b.position))
    return row!.id
  })
  setResponseStatus(event, 201)
  return flightView(venue, await loadFlight(venue, newId))
})
