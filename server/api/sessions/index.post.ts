import { randomUUID } from 'node:crypto'
import { and, eq, inArray } from 'drizzle-orm'
import { sessionCreateSchema } from '../../../shared/schemas/sessions'
import { formatDayTime } from '../../../shared/dates'
import type { SessionRow } from '../../../shared/types/sessions'
import type { Venue } from '../../db/schema/venues'

/**
 * One session, or a weekly series in one step, of a published flight. A flight has at most one
 * session per start (a unique index): a start that is taken answers 409 and, for a series, nothing
 * of it is written.
 */
export default defineEventHandler(async (event): Promise<SessionRow[]> => {
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
  let clash = null as Date | null
  const ids = await db.transaction(async (tx) => {
    const out: number[] = []
    for (const startsAt of starts) {
      try {
        const [row] = await tx.insert(tables.tastingSessions).values({
          venueId: venue.id, flightId: flight.id, startsAt, durationMinutes: input.durationMinutes, seats: input.seats,
          priceMinor: input.priceMinor, currency: venue.currency, hostId: input.hostId ?? null,
          bookingCutoffMinutes: input.bookingCutoffMinutes, seriesId,
        }).$returningId()
        out.push(row!.id)
      }
      catch (err) {
        // The unique index on (flight, start) settles a second click or a second manager at once;
        // throwing out of the transaction rolls back the rest of the series with it.
        if (isDuplicateKey(err)) clash = startsAt
        throw err
      }
    }
    return out
  }).catch(async (err) => {
    if (clash) throw await sessionTaken(flight.id, flight.name, clash, starts.length, venue)
    throw err
  })
  setResponseStatus(event, 201)
  return loadSessionViews(inArray(tables.tastingSessions.id, ids), venue.timeZone)
})

/** The 409 for a start the flight already has a session at, naming the date and what is there. */
async function sessionTaken(flightId: number, flightName: string, startsAt: Date, count: number, venue: Venue) {
  const [existing] = await useDb().select({ status: tables.tastingSessions.status }).from(tables.tastingSessions)
    .where(and(eq(tables.tastingSessions.flightId, flightId), eq(tables.tastingSessions.startsAt, startsAt)))
  const when = formatDayTime(startsAt, venue)
  const what = existing?.status === 'cancelled' ? `a cancelled session of ${flightName}` : `a session of ${flightName}`
  const field = `There is already ${what} on ${when}.`
  const message = count > 1
    ? `${field} None of the ${count} sessions were scheduled: choose another time or first date.`
    : `${field} Nothing new was scheduled.`
  return createError({ statusCode: 409, statusMessage: 'Session exists', message, data: { fields: { startTime: field } } })
}
