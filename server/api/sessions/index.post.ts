import { randomUUID } from 'node:crypto'
import { inArray } from 'drizzle-orm'
import { sessionCreateSchema } from '../../../shared/schemas/sessions'

/** One session, or a weekly series in one step, of a published flight. */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const input = await readBodyAs(event, sessionCreateSchema)
  const venue = await getVenue()
  const db = useDb()
  const flight = await loadFlight(venue, input.flightId).catch(() => null)
  if (!flight || flight.status !== 'published') {
    invalidFields({ flightId: 'Choose a published flight.' })
  }
  await assertHost(venue.id, input.hostId ?? null)
  const starts = weeklyStartsUtc({ startDate: input.startDate, startTime: input.startTime, weeks: input.repeatWeeks, timeZone: venue.timeZone })
  if (starts[0]!.getTime() < Date.now()) {
    invalidFields({ startDate: 'The first session must start in the future.' })
  }
  const seriesId = starts.length > 1 ? randomUUID() : null
  const ids = await db.transaction(async (tx) => {
    const out: number[] = []
    for (const startsAt of starts) {
      const [row] = await tx.insert(tables.tastingSessions).values({
        venueId: venue.id, flightId: flight.id, startsAt, durationMinutes: input.durationMinutes, seats: input.seats,
        priceMinor: input.priceMinor, currency: venue.currency, hostId: input.hostId ?? null,
        bookingCutoffMinutes: input.bookingCutoffMinutes, seriesId,
      }).$returningId()
      out.push(row!.id)
    }
    return out
  })
  setResponseStatus(event, 201)
  return loadSessionViews(inArray(tables.tastingSessions.id, ids), venue.timeZone)
})
